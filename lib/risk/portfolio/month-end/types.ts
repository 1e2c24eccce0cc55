/** The month-end run's contract: its input, method, result and the prepared state its stages share. */
import type { EngineWarning } from "../../types";
import type { BacktestResult } from "../../backtest/backtest";
import type { CapitalProfile, CapitalResult } from "../../capital/capital";
import type { HorizonScaling } from "../../var/scaling";
import type { Garch11Params } from "../../estimators/garch11-variance";
import type { PositionLoadings } from "../decomposition";
import type { SymmetricMatrix } from "../matrix";
import type { PsdCheck, PsdRepair } from "../psd";
import type { Position } from "../exposures";
import type { BacktestRefit, CandidateEvidence, CandidateMethod, CorrelationSpec, ProcessFit, ResolvedCorrelation, ResolvedModel, StoredBacktestSeries, StoredCorrelation, VolatilityChoice } from "../../process/types";
import type { FactorSpec } from "../per-factor";

export type VarMethod = "parametric" | "historical" | "filtered";
export type CovarianceChoice = "equal" | "ewma" | "garch-ccc";

/** Aligned daily returns by factor (decimals, oldest first); NaN marks a day without a return. */
export interface FactorReturns {
  /** the date of each return (the day it ends), ISO yyyy-mm-dd */
  dates: readonly string[];
  factors: Readonly<Record<string, ArrayLike<number>>>;
}

/** How the run computes its figures. Every choice is echoed back in the result. */
export interface MonthEndMethod {
  /** VaR methods to compute; default ["parametric", "historical"] */
  methods?: VarMethod[];
  /** the method behind the VaR history, backtest and capital; default the first of `methods` */
  primaryMethod?: VarMethod;
  /** covariance for parametric VaR (and the volatility model for filtering); default "ewma" */
  covariance?: CovarianceChoice;
  /** EWMA decay; default 0.94 (J.P. Morgan/Reuters 1996) */
  lambda?: number;
  /** equal-weight covariance window in days; default 250 */
  covarianceWindow?: number;
  /** historical-simulation window in days; default 500 */
  historicalWindow?: number;
  /** confidence levels; default [0.99, 0.975] */
  confidences?: number[];
  /** the longer horizon in days; default 10 */
  horizonDays?: number;
  /** "sqrt" (default), "term" (GARCH term structure, parametric with garch-ccc) or "overlap" (historical/filtered) */
  scaling?: HorizonScaling;
  /** parametric distribution; default normal */
  distribution?: "normal" | "t";
  nu?: number;
  /** the stress window: chosen by the analyst (dates inclusive) or "search" (default) */
  stressWindow?: { start: string; end: string } | "search";
  /** length of a searched stress window; default 250 */
  stressWindowDays?: number;
  /** days of VaR history; default 60 */
  historyDays?: number;
  /** backtest days; default 250 */
  backtestDays?: number;
  /** EWMA/covariance start-up days; default 30 */
  startupDays?: number;
  /**
   * Per-factor volatility processes (issue 13). When given, covariance = D·R·D with D from each factor's own process
   * and R from `correlation`; `covariance` and `lambda` then apply only where stated. Absent: today's behaviour.
   */
  volatility?: VolatilityChoice;
  /** the correlation estimator of D·R·D; default { kind: "ewma", lambda: `lambda` (0.94) }; only with `volatility` */
  correlation?: CorrelationSpec;
  /**
   * How the VaR history and backtest re-estimate parameters; default rolling every 21 business days with
   * `volatility`, full-sample on the legacy garch-ccc path (today's behaviour, its limitation stated)
   */
  backtestRefit?: BacktestRefit;
  /** compute the candidate-method evidence on the book (CANDIDATE_METHODS plus these); default none */
  candidates?: { include: "standard" | "none"; archOrder?: number; extra?: CandidateMethod[] };
}

export interface MonthEndInput {
  positions: readonly Position[];
  returns: FactorReturns;
  reportingCurrency: string;
  /** id of a currency's exchange-rate factor; default `${currency}${reportingCurrency}` */
  fxFactorId?: (currency: string, reportingCurrency: string) => string;
  method?: MonthEndMethod;
  capitalProfile?: CapitalProfile;
}

export type ProgressCallback = (stage: string, fraction: number) => void;

export interface VarFigure {
  var: number;
  es: number;
}

export interface PositionContribution {
  instrument: string;
  assetClass: string;
  currency: string;
  marketValue: number;
  /** exposure to its own price factor (delta-equivalent where given) */
  exposure: number;
  componentVar: number;
  componentEs: number;
  componentVarHorizon: number;
  componentEsHorizon: number;
  /** component VaR per unit of market value (the VaR change per unit when the position is scaled up) */
  marginalVar: number;
}

export interface GroupFigure {
  componentVar: number;
  componentEs: number;
  componentVarHorizon: number;
  componentEsHorizon: number;
}

export interface ConfidenceFigures {
  confidence: number;
  oneDay: VarFigure;
  horizon: VarFigure;
  contributions: PositionContribution[];
  byFactor: { factor: string; exposure: number; marginalVar: number; componentVar: number }[];
  byAssetClass: Record<string, GroupFigure & { standAloneVar: number; standAloneEs: number; standAloneVarHorizon: number; standAloneEsHorizon: number }>;
  byCurrency: Record<string, GroupFigure>;
  /** Σ stand-alone VaR by asset class − total VaR (one day) */
  diversificationBenefit: number;
  diversificationBenefitHorizon: number;
}

export interface MethodFigures {
  method: VarMethod;
  /** one-day standard deviation of the book's P&L under the method's inputs */
  portfolioVolatility: number;
  scaling: HorizonScaling;
  scalingStatement: string;
  scenarios: number | null;
  byConfidence: ConfidenceFigures[];
}

export interface StressedFigures {
  method: VarMethod;
  window: { start: string; end: string; days: number; chosenBy: "search" | "analyst" };
  searchRule: string | null;
  windowsSearched: number | null;
  byConfidence: { confidence: number; oneDay: VarFigure; horizon: VarFigure }[];
  statement: string;
}

export interface VarHistoryPoint {
  /** the last date whose data the figure uses; the figure is the VaR for the next business day */
  asOf: string;
  /** by confidence, in the order of `confidences` */
  var1d: number[];
  varHorizon: number[];
  es1d: number[];
  esHorizon: number[];
}

export interface MonthEndResult {
  engineVersion: string;
  asOf: string;
  reportingCurrency: string;
  confidences: number[];
  horizonDays: number;
  primaryMethod: VarMethod;
  methods: MethodFigures[];
  stressed: StressedFigures;
  varHistory: { method: VarMethod; points: VarHistoryPoint[]; statement: string };
  backtest: BacktestResult & { method: VarMethod; statement: string };
  capital: CapitalResult & { stressedVarStatement: string };
  covarianceCheck: { matrix: "covariance" | "correlation"; check: PsdCheck; repair: Omit<PsdRepair, "matrix"> | null };
  volatilityModels: { factor: string; model: string; params: Record<string, number>; currentVolatility: number }[] | null;
  factors: { used: string[]; excluded: { factor: string; reason: string }[] };
  excludedPositions: { instrument: string; marketValue: number; reason: string }[];
  sample: { days: number; firstDate: string; lastDate: string };
  choices: Record<string, string | number | number[] | string[]>;
  warnings: EngineWarning[];
  limitations: string[];
  /** the resolved model configuration: per factor process, parameters, start-up, fallback, one-day variance; correlation; horizon; backtest refit */
  model?: ResolvedModel;
  /** the correlation matrix behind the parametric figures (so the app never re-runs prepareRun) */
  correlation?: StoredCorrelation;
  /** the backtest day by day */
  backtestSeries?: StoredBacktestSeries;
  /** the candidate-method evidence, when asked for */
  candidates?: CandidateEvidence;
}

/** Per-factor volatility model: variance of each working day, the next-day forecast, term-structure parameters. */
export interface VolatilityModel {
  variance: Float64Array[];
  current: Float64Array;
  params: Garch11Params[];
  labels: string[];
  paramsOut: Record<string, number>[];
}

/** The per-factor (D·R·D) state of a run whose method gives `volatility`. */
export interface PerFactorState {
  specs: FactorSpec[];
  /** today's fits, one per factor */
  fits: ProcessFit[];
  correlationSpec: CorrelationSpec;
  correlationInfo: ResolvedCorrelation;
  /** first day every factor's variance path is defined */
  firstDefined: number;
  /** horizon rule: each factor's own term structure (true) or square-root-of-time */
  term: boolean;
  /** today's variance over the horizon, per factor */
  horizonVariance: Float64Array;
}

/** Everything a run derives from its inputs before computing figures (shared by runMonthEnd and explain). */

/** The working sample of a run: its dates, the usable factors and their returns, the book's exposures and positions. */
export interface RunSample {
  dates: string[];
  factorIds: string[];
  returns: Float64Array[];
  exposures: Float64Array;
  loadings: PositionLoadings[];
  positions: Position[];
}

/** Everything a run derives from its inputs before computing figures (shared by runMonthEnd and explain). */
export interface PreparedRun extends RunSample {
  /** one-day covariance for parametric VaR */
  covariance: SymmetricMatrix;
  /** correlation behind the covariance where the choice is garch-ccc */
  correlation: SymmetricMatrix | null;
  volatility: VolatilityModel | null;
  /** set when the method gives per-factor volatility processes */
  perFactor: PerFactorState | null;
  psd: MonthEndResult["covarianceCheck"];
  method: Required<Omit<MonthEndMethod, "nu" | "stressWindow" | "volatility" | "correlation" | "backtestRefit" | "candidates">> & {
    nu?: number;
    stressWindow: MonthEndMethod["stressWindow"];
    volatility?: VolatilityChoice;
    correlation?: CorrelationSpec;
    backtestRefit: BacktestRefit;
    candidates?: MonthEndMethod["candidates"];
  };
  excludedFactors: { factor: string; reason: string }[];
  excludedPositions: { instrument: string; marketValue: number; reason: string }[];
  warnings: EngineWarning[];
}

/** How a VaR method scales to the horizon. */
export type Scaler = (m: VarMethod) => HorizonScaling;
