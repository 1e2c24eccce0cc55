/**
 * The contract of the volatility-process layer (issue 13): what a method statement chooses per factor
 * (VolatilitySpec), how correlations are estimated (CorrelationSpec), how the backtest re-estimates parameters
 * (BacktestRefit), and the resolved model configuration a month-end run returns with its figures (ResolvedModel),
 * so that every sentence about the method is generated from what the engine actually used. Types only.
 */
import type { InitRule } from "../estimators/initial-variance";
import type { EngineWarning, EstimatorKind } from "../types";
import type { HorizonScaling } from "../var/scaling";

export type { InitRule };

/**
 * One volatility process with every setting the analyst chose. Absent optional settings take the engine's stated
 * defaults (the same `engine fit` uses): start-up "sample" (ARCH, EWMA, GARCH), divisor "m", zero mean, normal
 * errors, no variance targeting, no fallback.
 * - ma: equal weights over the last `window` returns (no start-up: the first value needs a full window)
 * - ewma: λ fixed, or fitted by maximum likelihood when `fit` (λ is then the optimiser's first starting value)
 * - arch: ARCH(order), Gaussian maximum likelihood, zero mean
 * - garch: GARCH(1,1) by maximum likelihood; `fallback: "ewma"` uses EWMA (λ = `fallbackLambda`, default 0.94)
 *   when the fit fails or is near-integrated (α+β ≥ 0.999)
 */
export type VolatilitySpec =
  | { kind: "ma"; window: number; divisor?: "m" | "m-1"; mean?: "zero" | "sample" }
  | { kind: "ewma"; lambda: number; fit?: boolean; init?: Exclude<InitRule, "unconditional"> }
  | { kind: "arch"; order: number; init?: "sample" | "backcast" | { firstReturns: number } }
  | {
      kind: "garch";
      distribution?: "normal" | "t";
      mean?: "zero" | "fit";
      targeting?: boolean;
      fallback?: "ewma" | "none";
      fallbackLambda?: number;
      init?: InitRule;
    };

export type VolatilityKind = VolatilitySpec["kind"];

/**
 * Which process each factor follows. Precedence: `byFactor[factor]`, then `byAssetClass[class]` (a price factor's
 * class is its positions' asset class; an exchange-rate factor's class is "fx"), then `default`.
 */
export interface VolatilityChoice {
  default: VolatilitySpec;
  byAssetClass?: Record<string, VolatilitySpec>;
  byFactor?: Record<string, VolatilitySpec>;
}

/**
 * The correlation R of covariance = D·R·D.
 * - equal: zero-mean correlation of the raw returns over the last `window` days
 * - ewma: the EWMA covariance of the raw returns (its own λ, started from the zero-mean covariance of the first
 *   `startupDays` days, default 30) scaled to a unit diagonal
 * - ccc: the constant correlation of the standardised residuals rₜ/σₜ of each factor's own process
 */
export type CorrelationSpec = { kind: "equal"; window: number } | { kind: "ewma"; lambda: number; startupDays?: number } | { kind: "ccc" };

/**
 * How the VaR history and backtest re-estimate model parameters.
 * - rolling (the default, every 21 business days): parameters are re-estimated on the data before each refit day,
 *   counting back from the as-of date (so today's figure uses the fit on the whole sample), each fit warm-started
 *   from the next later one; every day's forecast uses only data up to the day before
 * - full-sample: parameters fitted once on the whole sample and reused for every past day (in-sample; stated as a
 *   limitation)
 */
export type BacktestRefit = { mode: "rolling"; everyDays: number } | { mode: "full-sample" };

/** The horizon rule: each factor's own term structure summed over the horizon, or square-root-of-time. */
export type HorizonRule = "term" | "sqrt";

/** One factor's resolved process, as fitted for today's figures. */
export interface ResolvedFactorModel {
  factor: string;
  /** the class its process was chosen by ("fx" for an exchange-rate factor), null when no position names one */
  assetClass: string | null;
  /** where the process came from */
  source: "factor" | "asset-class" | "default" | "legacy";
  /** the process as chosen, with every default filled in */
  spec: VolatilitySpec;
  /** the family that produced the figures (differs from spec.kind only when the fallback was used) */
  process: EstimatorKind;
  /** plain English, e.g. "GARCH(1,1), Student-t errors, zero mean" */
  label: string;
  /** fitted or set parameters by name (omega, alpha, beta, nu, mu, lambda, window, alpha1..alpham) */
  params: Record<string, number>;
  parameterNames: string[];
  /** the start-up rule, stated, e.g. "sample: pre-sample squared residual and variance = mean of all squared residuals" */
  startUp: string;
  /** set when the chosen process failed or was near-integrated and its fallback was used */
  fallback: { from: EstimatorKind; reason: string; label: string } | null;
  /** one-day variance forecast for the day after the as-of date */
  variance: number;
  /** variance over the horizon (sum of the daily forecasts, or horizon × one-day under square-root-of-time) */
  horizonVariance: number;
  /** long-run variance where the process has one */
  longRunVariance: number | null;
  logLikelihood: number | null;
  warnings: EngineWarning[];
  /** limitations of this process and of this fit */
  limitations: string[];
}

/** The correlation the run used, with its estimator and any repair. */
export interface ResolvedCorrelation {
  /** null on the legacy single-covariance paths (equal / ewma covariance): the correlation is the covariance's own */
  spec: CorrelationSpec | null;
  label: string;
  statement: string;
  /** positive semi-definiteness of R before any repair */
  check: "positive-definite" | "positive-semidefinite" | "indefinite";
  /** the nearest-correlation repair (Higham 2002) when R was indefinite */
  repair: {
    method: string;
    /** ‖R_repaired − R‖_F */
    frobeniusDistance: number;
    iterations: number;
    negativeEigenvaluesBefore: number;
    minEigenvalueBefore: number;
  } | null;
}

/** The model configuration a run resolved and used: the one source for every sentence about the method. */
export interface ResolvedModel {
  /** "per-factor": covariance = D·R·D from per-factor processes; otherwise the legacy single-covariance choice */
  covariance: "per-factor" | "equal" | "ewma" | "garch-ccc";
  factors: ResolvedFactorModel[];
  correlation: ResolvedCorrelation;
  horizon: { days: number; rule: HorizonRule; scaling: HorizonScaling[]; statement: string };
  backtest: { refit: BacktestRefit; statement: string; limitation: string | null };
  /** plain-English sentences generated from the above, in order: volatility, correlation, horizon, backtest */
  statements: string[];
}

/** The stored correlation matrix (rows in the order of `factors`). */
export interface StoredCorrelation {
  factors: string[];
  matrix: number[][];
  basis: string;
}

/** The backtest day by day, as the run computed it (exceptions by the engine's rule: loss > VaR). */
export interface StoredBacktestSeries {
  confidence: number;
  method: "parametric" | "historical" | "filtered";
  dates: string[];
  pnl: number[];
  var: number[];
  exception: boolean[];
}

/** A candidate configuration for the book-level evidence. */
export interface CandidateMethod {
  id: string;
  label: string;
  /**
   * book: the process fitted to the book's own daily P&L (today's positions on past days), VaR = q·σ;
   * method: the full run method (per-factor processes and the correlation), VaR by the method's primary VaR method
   */
  basis: "book" | "method";
  /** for basis "book" */
  spec?: VolatilitySpec;
  /** for basis "method": the pieces of the method that differ from the run's own */
  method?: { volatility?: VolatilityChoice; correlation?: CorrelationSpec; covariance?: "equal" | "ewma" | "garch-ccc"; lambda?: number; backtestRefit?: BacktestRefit };
}

/** One row of the side-by-side evidence. */
export interface CandidateRow {
  id: string;
  label: string;
  basis: "book" | "method";
  /** null when the candidate could not be computed (then `error` says why) */
  days: number | null;
  exceptions: number | null;
  zone: "green" | "yellow" | "red" | null;
  kupiecPValue: number | null;
  christoffersenIndependencePValue: number | null;
  christoffersenPValue: number | null;
  meanVar: number | null;
  /** VaR term of the capital at the profile's horizon: max(last VaR, (m_c + plus factor) × mean VaR over the averaging days) */
  capitalVarTerm: number | null;
  /** capital with the run's stressed VaR term added (the stressed term is the same for every candidate) */
  capital: number | null;
  plusFactor: number | null;
  /** the one-day VaR each backtest day (same dates as the evidence) */
  var: number[] | null;
  error: string | null;
}

/** The candidate-method evidence on the firm's own book. */
export interface CandidateEvidence {
  days: number;
  confidence: number;
  dates: string[];
  pnl: number[];
  refit: BacktestRefit;
  rows: CandidateRow[];
  statement: string;
}

/** A fitted process: the engine's VolatilityFit plus the spec it answers and what the run needs to go on filtering. */
export interface ProcessFit {
  /** the spec as asked, defaults filled in */
  spec: VolatilitySpec;
  /** the family that produced the numbers (ewma when a GARCH fallback was used) */
  process: EstimatorKind;
  /** the spec that produced the numbers: `spec`, or the EWMA fallback's spec */
  used: VolatilitySpec;
  label: string;
  params: Record<string, number>;
  parameterNames: string[];
  /** the start-up rule actually used (null for the moving average) */
  init: InitRule | null;
  startUp: string;
  /** conditional variance path: variance[t] is the variance of returns[t] given returns before t */
  variance: Float64Array;
  /** one-day forecast for the day after the last return */
  nextVariance: number;
  fallback: { from: EstimatorKind; reason: string; label: string } | null;
  /** the full fit (standard errors, diagnostics, warnings, limitations) */
  fit: import("../types").VolatilityFit;
}

/** Options of a fit: warm start from an earlier fit (its parameters and, where kept, optimiser state), lean refits. */
export interface FitOptions {
  warmStart?: Record<string, number>;
  /** the earlier fit's optimiser inverse Hessian (fit.optimizerInverseHessian) */
  warmInverseHessian?: Float64Array;
  /** skip standard errors and moment diagnostics (refits inside a backtest) */
  lean?: boolean;
}

/**
 * The one contract every estimator family implements (lib/risk/process/registry.ts holds one per kind; nothing
 * else switches on the kind).
 */
export interface VolatilityProcess<S extends VolatilitySpec = VolatilitySpec> {
  kind: S["kind"];
  /** the spec with every default filled in */
  resolve(spec: S): S;
  /** plain-English label, e.g. "EWMA, λ fitted = 0.9412" (with the fit) or "EWMA, λ fitted" (without) */
  label(spec: S, params?: Record<string, number>): string;
  parameterNames(spec: S): string[];
  /** fewest returns a fit accepts */
  minimumReturns(spec: S): number;
  /** fit on returns (oldest first) with the spec's start-up rule; `warmStart` parameters start the optimiser */
  fit(returns: ArrayLike<number>, spec: S, options?: FitOptions): ProcessFit;
  /**
   * The variance path with parameters held fixed, the start-up computed from returns[0..initEnd) only
   * (default: all of them): out[t] for t = 0..n, out[n] being the forecast for the day after the last return
   * (written into `out` when given, of length n + 1).
   */
  filter(returns: ArrayLike<number>, spec: S, params: Record<string, number>, initEnd?: number, out?: Float64Array): Float64Array;
  /** daily variance forecasts for days 1..h after the fit (term structure; flat for ma and ewma) */
  forecast(fit: ProcessFit, horizonDays: number): Float64Array;
  /** the forecast from a state: next-day variance and the recent squared returns (newest first) */
  forecastFrom(spec: S, params: Record<string, number>, nextVariance: number, recentSquared: ArrayLike<number>, horizonDays: number): Float64Array;
  /** limitations of the family and of this fit */
  limitations(fit: ProcessFit): string[];
}
