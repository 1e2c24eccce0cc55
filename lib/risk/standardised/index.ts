/** The standardised market-risk building blocks (1996): types, the default profile, validation and the entry point. */
export * from "./types";
export { STANDARDISED_1996_PROFILE, POSITION_COLUMNS } from "./profile";
export { validateStandardisedPositions, StandardisedInputError, describeIssue } from "./validate";
export { computeStandardised } from "./compute";
export { yearsBetween, parseIsoDate } from "./dates";
export { bandIndex, ladderCharge, offsetZones, interestRateGeneral, EDGE_EPSILON, type LadderEntry } from "./interest-rate-general";
export { interestRateSpecific, specificRiskWeight, type DebtHolding } from "./interest-rate-specific";
export { equityRisk, equitySpecificRate, type EquityHolding } from "./equity";
export { fxRisk, type FxExposure } from "./fx";
export { commodityRisk, commodityLadder, type CommodityHolding } from "./commodities";
export { inTheMoneyAmount, hedgedOptionCharge, boughtOptionCharge, isCarveOutHedge } from "./options";
export { derivativeUnderlying, cashKind, residualYears, resetYears, type UnderlyingKind } from "./classify";
export { describeStandardisedMethod, pct, STANDARDISED_LIMITATIONS, type StatementFacts } from "./describe";
