/** Market-risk capital under a rule profile. */
export * from "./capital";
