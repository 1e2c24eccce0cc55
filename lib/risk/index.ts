/** Ballast's risk engine, part 1: returns, volatility estimators, forecasts, comparison. Pure TypeScript. */
export { ENGINE_VERSION } from "./version";
export type { EstimatorKind, EngineWarning, VolatilityFit } from "./types";
export { logReturns, simpleReturns, alignSeries, alignOnAxis, alignedLogReturns, type ReturnOptions, type DatedSeries, type SeriesOnAxis, type MissingRule, type AlignOptions, type AlignReport, type AlignedSeries, type AlignedReturns, type CarriedPoint, type DroppedDate } from "./returns";
export { garch11Variance, fitGarch11, GARCH_MIN_RETURNS, NEAR_INTEGRATED, type Garch11Params, type VariancePath, type FitGarch11Options } from "./estimators/garch11";
export { ewmaVariance, fitEwma, ewmaLogLikelihood, type FitEwmaOptions } from "./estimators/ewma";
export { movingAverageVariance, type MovingAverageOptions } from "./estimators/moving-average";
export { weightedVariance, type WeightedFormParams } from "./estimators/weighted-variance";
export { archVariance, type ArchParams } from "./estimators/arch-variance";
export { describeInit, type InitRule } from "./estimators/initial-variance";
export { garchTermStructure, garchLongRunVariance, flatForecast, archForecast, forecastVariance, averageVariance, annualisedVolatilityTermStructure, type Garch11State } from "./forecast";
export { LIMITATIONS } from "./limitations";
export { minimizeBfgs } from "./optimize/minimize-bfgs";
export { minimizeMultiStart } from "./optimize/multi-start";
export { mulberry32, normalSampler, studentTSampler, simulateGarch11 } from "./random";
export { fitMovingAverage } from "./estimators/moving-average";
export { fitArch, archLogLikelihood, ARCH_MAX_ORDER, type FitArchOptions } from "./estimators/arch";
export { compareEstimators, type CompareOptions, type CompareResult, type EstimatorScore } from "./compare";
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
