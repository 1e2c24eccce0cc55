/** Backtesting: traffic-light zones, coverage tests, χ² p-values. */
export * from "./backtest";
export * from "./chi-squared";
export * from "./christoffersen";
export * from "./kupiec";
export * from "./traffic-light";
