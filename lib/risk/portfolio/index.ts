/** Portfolio figures: exposures, covariance, PSD check and repair, Euler allocation, explain, the month-end run. */
export * from "./covariance";
export * from "./decomposition";
export * from "./explain";
export * from "./exposures";
export * from "./matrix";
export * from "./psd";
export * from "./run-month-end";
