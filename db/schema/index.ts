export * from "./firms";
export * from "./periods";
export * from "./data";
export * from "./method";
export * from "./runs";
export * from "./filings";
export * from "./calendar";
export * from "./audit";
