/** Volatility processes: the one contract (types), the registry, and the spec parser of the command line. */
export * from "./types";
export * from "./registry";
