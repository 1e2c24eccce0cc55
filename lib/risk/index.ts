/** Ballast's risk engine, part 1: returns, volatility estimators, forecasts, comparison. Pure TypeScript. */
export { ENGINE_VERSION } from "./version";
export type { EstimatorKind, EngineWarning, VolatilityFit } from "./types";
export { logReturns, simpleReturns, alignSeries, alignOnAxis, alignedLogReturns } from "./returns";
export type { ReturnOptions, DatedSeries, SeriesOnAxis, MissingRule, AlignOptions, AlignReport, AlignedSeries, AlignedReturns, CarriedPoint, DroppedDate } from "./returns";
export { garch11Variance, fitGarch11, GARCH_MIN_RETURNS, NEAR_INTEGRATED } from "./estimators/garch11";
export type { Garch11Params, VariancePath, FitGarch11Options } from "./estimators/garch11";
export { ewmaVariance, fitEwma, ewmaLogLikelihood } from "./estimators/ewma";
export type { FitEwmaOptions } from "./estimators/ewma";
export { movingAverageVariance } from "./estimators/moving-average";
export type { MovingAverageOptions } from "./estimators/moving-average";
export { weightedVariance } from "./estimators/weighted-variance";
export type { WeightedFormParams } from "./estimators/weighted-variance";
export { archVariance } from "./estimators/arch-variance";
export type { ArchParams } from "./estimators/arch-variance";
export { describeInit } from "./estimators/initial-variance";
export type { InitRule } from "./estimators/initial-variance";
export { garchTermStructure, garchLongRunVariance, flatForecast, archForecast, forecastVariance, averageVariance, annualisedVolatilityTermStructure } from "./forecast";
export type { Garch11State } from "./forecast";
export { LIMITATIONS } from "./limitations";
export { minimizeBfgs } from "./optimize/minimize-bfgs";
export { minimizeMultiStart } from "./optimize/multi-start";
export { mulberry32, normalSampler, studentTSampler, simulateGarch11 } from "./random";
export { fitMovingAverage } from "./estimators/moving-average";
export { fitArch, archLogLikelihood, ARCH_MAX_ORDER } from "./estimators/arch";
export type { FitArchOptions } from "./estimators/arch";
export { compareEstimators } from "./compare";
export type { CompareOptions, CompareResult, EstimatorScore } from "./compare";
// part 2: portfolio VaR and ES, stressed VaR, backtesting, capital
export * from "./portfolio";
export * from "./var";
export * from "./backtest";
export * from "./capital";
// issue 13: volatility processes, D·R·D, candidate evidence
export * from "./process";
export { standardCandidates } from "./portfolio/candidates";
export { candidateEvidence } from "./portfolio/candidate-evidence";
// standardised building blocks (1996): debt, equity, FX, commodities, options
export * from "./standardised";
