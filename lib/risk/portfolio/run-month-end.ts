/**
 * A month-end run: positions and aligned factor returns in, every figure a filing reports out, in one plain
 * object — VaR and ES at one day and the method's horizon per confidence and method, component VaR by position, asset class
 * and currency, stand-alone VaR by asset class and the diversification benefit, stressed VaR with its window,
 * the VaR history of the last 60 days, the 250-day backtest, capital with every term, and the warnings,
 * limitations and choices that apply. Pure: no I/O, no clock, no randomness.
 */
import { fitGarch11 } from "../estimators/garch11";
import { ewmaVariance } from "../estimators/ewma-variance";
import type { Garch11Params } from "../estimators/garch11-variance";
import type { EngineWarning } from "../types";
import { ENGINE_VERSION } from "../version";
import { runBacktest, type BacktestResult } from "../backtest/backtest";
import { trafficLight } from "../backtest/traffic-light";
import { BASEL_CAPITAL_PROFILE, capitalCharge, type CapitalProfile, type CapitalResult } from "../capital/capital";
import { esMultiplier, varMultiplier, type ParametricOptions } from "../var/parametric";
import { HISTORICAL_QUANTILE_CONVENTION, historicalTail, tailOfSortedLosses } from "../var/historical";
import { describeScaling, garchHorizonVariance, overlappingSums, type HorizonScaling } from "../var/scaling";
import { searchStressWindow } from "../var/stressed";
import { equalWeightCovariance, ewmaCovariance, standardisedCorrelation } from "./covariance";
import { allocateToPositions, type PositionLoadings } from "./decomposition";
import { correlationToCovariance, covarianceToCorrelation, matVec, matrixToRows, type SymmetricMatrix } from "./matrix";
import { checkPsd, repairPsd, type PsdCheck, type PsdRepair } from "./psd";
import { positionsToExposures, type Position } from "./exposures";
import type { BacktestRefit, CandidateEvidence, CandidateMethod, CorrelationSpec, ProcessFit, ResolvedCorrelation, ResolvedFactorModel, ResolvedModel, StoredBacktestSeries, StoredCorrelation, VolatilityChoice } from "../process/types";
import { nearestCorrelation } from "./nearest-correlation";
import {
  correlationForm, correlationOf, describeCorrelation, describeRefit, factorHorizonVariance, firstDefinedDay, fitFactor, forEachBlock, forEachDailyCovariance,
  matrixForm, neededReturns, refitBlocks, resolveCorrelation, resolveFactorSpecs, resolvedFactor, type FactorSpec,
} from "./per-factor";
import { specLabel, specStartUp } from "../process/registry";
import { describeInit, type InitRule } from "../estimators/initial-variance";
import { candidateRows, failedRow, methodOfCandidate, rowFromSeries, standardCandidates, type CandidateContext } from "./candidates";
import { countOf, isAre, listSome } from "../../text/count";

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
  componentVar10d: number;
  componentEs10d: number;
  /** component VaR per unit of market value (the VaR change per unit when the position is scaled up) */
  marginalVar: number;
}

export interface GroupFigure {
  componentVar: number;
  componentEs: number;
  componentVar10d: number;
  componentEs10d: number;
}

export interface ConfidenceFigures {
  confidence: number;
  oneDay: VarFigure;
  tenDay: VarFigure;
  contributions: PositionContribution[];
  byFactor: { factor: string; exposure: number; marginalVar: number; componentVar: number }[];
  byAssetClass: Record<string, GroupFigure & { standAloneVar: number; standAloneEs: number; standAloneVar10d: number; standAloneEs10d: number }>;
  byCurrency: Record<string, GroupFigure>;
  /** Σ stand-alone VaR by asset class − total VaR (one day) */
  diversificationBenefit: number;
  diversificationBenefit10d: number;
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
  byConfidence: { confidence: number; oneDay: VarFigure; tenDay: VarFigure }[];
  statement: string;
}

export interface VarHistoryPoint {
  /** the last date whose data the figure uses; the figure is the VaR for the next business day */
  asOf: string;
  /** by confidence, in the order of `confidences` */
  var1d: number[];
  var10d: number[];
  es1d: number[];
  es10d: number[];
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

interface Scenarios {
  /** factor-major scenario returns */
  x: Float64Array[];
  count: number;
}

interface Evaluation {
  var: number;
  es: number;
  varMarginal: Float64Array;
  esMarginal: Float64Array;
}

const SQRT_STATEMENT = "square-root-of-time scaling assumes independent, identically distributed returns and understates risk when returns are positively autocorrelated";

function trailingRun(values: ArrayLike<number>): number {
  let n = 0;
  for (let t = values.length - 1; t >= 0 && Number.isFinite(values[t]); t--) n++;
  return n;
}

function sortedLosses(pnl: ArrayLike<number>, start: number, end: number, out: Float64Array): Float64Array {
  const n = end - start;
  const a = out.subarray(0, n);
  for (let i = 0; i < n; i++) a[i] = -pnl[start + i];
  a.sort();
  return a;
}

/** VaR (type-7) and ES (fractional tail mean) from ascending losses; the convention of historicalTail. */
function tailOfSorted(losses: Float64Array, confidence: number): VarFigure {
  return tailOfSortedLosses(losses, confidence);
}

function scenarioPnl(sc: Scenarios, e: ArrayLike<number>): Float64Array {
  const p = new Float64Array(sc.count);
  for (let i = 0; i < sc.x.length; i++) {
    const ei = e[i];
    if (ei === 0) continue;
    const xi = sc.x[i];
    for (let s = 0; s < sc.count; s++) p[s] += ei * xi[s];
  }
  return p;
}

function evaluateScenarios(sc: Scenarios, e: ArrayLike<number>, confidence: number): Evaluation {
  const tail = historicalTail(scenarioPnl(sc, e), confidence);
  const k = sc.x.length;
  const varMarginal = new Float64Array(k);
  const esMarginal = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    const xi = sc.x[i];
    let a = 0;
    for (let j = 0; j < tail.varWeights.indices.length; j++) a -= tail.varWeights.weights[j] * xi[tail.varWeights.indices[j]];
    let b = 0;
    for (let j = 0; j < tail.esWeights.indices.length; j++) b -= tail.esWeights.weights[j] * xi[tail.esWeights.indices[j]];
    varMarginal[i] = a;
    esMarginal[i] = b;
  }
  return { var: tail.var, es: tail.es, varMarginal, esMarginal };
}

function evaluateParametric(cov: SymmetricMatrix, e: ArrayLike<number>, confidence: number, options: ParametricOptions): Evaluation & { sigma: number } {
  const q = varMultiplier(confidence, options);
  const qEs = esMultiplier(confidence, options);
  const se = matVec(cov, e);
  let variance = 0;
  for (let i = 0; i < cov.size; i++) variance += e[i] * se[i];
  const sigma = Math.sqrt(Math.max(0, variance));
  const k = cov.size;
  const varMarginal = new Float64Array(k);
  const esMarginal = new Float64Array(k);
  if (sigma > 0) for (let i = 0; i < k; i++) { varMarginal[i] = (q * se[i]) / sigma; esMarginal[i] = (qEs * se[i]) / sigma; }
  return { var: q * sigma, es: qEs * sigma, varMarginal, esMarginal, sigma };
}

function scaleEvaluation(ev: Evaluation, factor: number): Evaluation {
  return { var: ev.var * factor, es: ev.es * factor, varMarginal: ev.varMarginal.map((x) => x * factor), esMarginal: ev.esMarginal.map((x) => x * factor) };
}

function dot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

/** Per-factor volatility model: variance of each working day, the next-day forecast, term-structure parameters. */
interface VolatilityModel {
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
export interface PreparedRun {
  dates: string[];
  factorIds: string[];
  returns: Float64Array[];
  exposures: Float64Array;
  loadings: PositionLoadings[];
  positions: Position[];
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

function withDefaults(m: MonthEndMethod = {}): PreparedRun["method"] {
  const methods = m.methods ?? ["parametric", "historical"];
  if (methods.length === 0) throw new RangeError("runMonthEnd requires at least one VaR method");
  for (const x of methods) if (!["parametric", "historical", "filtered"].includes(x)) throw new RangeError(`runMonthEnd: unknown VaR method "${x}"`);
  const method = {
    methods,
    primaryMethod: m.primaryMethod ?? methods[0],
    covariance: m.covariance ?? "ewma",
    lambda: m.lambda ?? 0.94,
    covarianceWindow: m.covarianceWindow ?? 250,
    historicalWindow: m.historicalWindow ?? 500,
    confidences: m.confidences ?? [0.99, 0.975],
    horizonDays: m.horizonDays ?? 10,
    scaling: m.scaling ?? "sqrt",
    distribution: m.distribution ?? "normal",
    nu: m.nu,
    stressWindow: m.stressWindow ?? "search",
    stressWindowDays: m.stressWindowDays ?? 250,
    historyDays: m.historyDays ?? 60,
    backtestDays: m.backtestDays ?? 250,
    startupDays: m.startupDays ?? 30,
    volatility: m.volatility,
    correlation: m.volatility ? resolveCorrelation(m.correlation, m.lambda ?? 0.94) : undefined,
    backtestRefit: m.backtestRefit ?? (m.volatility ? { mode: "rolling", everyDays: 21 } : { mode: "full-sample" }),
    candidates: m.candidates,
  } as PreparedRun["method"];
  if (!m.volatility && m.correlation) throw new RangeError("runMonthEnd: a correlation estimator applies with per-factor volatility processes (method.volatility)");
  if (m.volatility && !m.volatility.default) throw new RangeError("runMonthEnd: method.volatility needs a default process");
  const refit = method.backtestRefit;
  if (refit.mode === "rolling" ? !(Number.isInteger(refit.everyDays) && refit.everyDays >= 1) : refit.mode !== "full-sample") throw new RangeError('runMonthEnd: backtestRefit is { mode: "rolling", everyDays: a whole number >= 1 } or { mode: "full-sample" }');
  if (refit.mode === "rolling" && !m.volatility && method.covariance === "garch-ccc") throw new RangeError("runMonthEnd: rolling refits need per-factor volatility processes (method.volatility); the legacy garch-ccc covariance is fitted once on the whole sample");
  if (!method.methods.includes(method.primaryMethod)) method.methods = [...method.methods, method.primaryMethod];
  if (!["equal", "ewma", "garch-ccc"].includes(method.covariance)) throw new RangeError(`runMonthEnd: unknown covariance "${method.covariance}"`);
  if (!(method.lambda > 0 && method.lambda < 1)) throw new RangeError("runMonthEnd requires 0 < lambda < 1");
  for (const c of method.confidences) if (!(c > 0 && c < 1)) throw new RangeError("runMonthEnd requires 0 < confidence < 1");
  if (!(Number.isInteger(method.horizonDays) && method.horizonDays >= 1)) throw new RangeError("runMonthEnd requires a whole-day horizon >= 1");
  for (const [name, v] of [["covarianceWindow", method.covarianceWindow], ["historicalWindow", method.historicalWindow], ["stressWindowDays", method.stressWindowDays], ["historyDays", method.historyDays], ["backtestDays", method.backtestDays]] as const) {
    if (!(Number.isInteger(v) && v >= 2)) throw new RangeError(`runMonthEnd requires ${name} to be a whole number >= 2`);
  }
  if (!["sqrt", "term", "overlap"].includes(method.scaling)) throw new RangeError(`runMonthEnd: unknown scaling "${method.scaling}"`);
  if (method.scaling === "term" && method.covariance !== "garch-ccc" && !method.volatility) throw new RangeError('runMonthEnd: scaling "term" needs per-factor volatility processes (or the garch-ccc covariance)');
  if (method.distribution === "t" && !((method.nu ?? 0) > 2)) throw new RangeError("runMonthEnd requires nu > 2 for the t distribution");
  return method;
}

function minimumDays(method: PreparedRun["method"]): number {
  let need = 2;
  for (const m of method.methods) {
    if (m === "parametric") {
      if (method.volatility) {
        const c = method.correlation as CorrelationSpec;
        need = Math.max(need, c.kind === "equal" ? c.window : c.kind === "ewma" ? (c.startupDays ?? 30) : 2);
      } else need = Math.max(need, method.covariance === "equal" ? method.covarianceWindow : method.covariance === "garch-ccc" ? 100 : method.startupDays);
    } else need = Math.max(need, method.historicalWindow);
  }
  return need;
}

/**
 * Prepare a run: usable factors, exposures, the working sample, per-factor volatility and the covariance
 * with its PSD check and any repair.
 * @throws {RangeError} on misaligned returns or when no position has usable history
 */
export function prepareRun(input: MonthEndInput, onProgress?: ProgressCallback): PreparedRun {
  const method = withDefaults(input.method);
  const warnings: EngineWarning[] = [];
  const T = input.returns.dates.length;
  for (const [id, values] of Object.entries(input.returns.factors)) {
    if (values.length !== T) throw new RangeError(`runMonthEnd requires aligned returns: factor "${id}" has ${values.length} values for ${T} dates`);
  }
  if (input.positions.length === 0) throw new RangeError("runMonthEnd requires at least one position");
  const baseNeed = minimumDays(method);
  // each factor's class: its positions' asset class, "fx" for an exchange-rate factor
  const fxOf = input.fxFactorId ?? ((c: string, r: string) => `${c}${r}`);
  const classes = new Map<string, string | null>();
  for (const p of input.positions) {
    const id = p.factor ?? p.instrument;
    if (!classes.has(id)) classes.set(id, p.assetClass ?? null);
  }
  for (const p of input.positions) {
    const c = p.currency ?? input.reportingCurrency;
    if (c !== input.reportingCurrency) {
      const fx = fxOf(c, input.reportingCurrency);
      if (!classes.has(fx)) classes.set(fx, "fx");
    }
  }
  const classOf = (id: string): string | null => classes.get(id) ?? null;
  const specOf = new Map<string, FactorSpec>();
  const factorSpec = (id: string): FactorSpec => {
    let fs = specOf.get(id);
    if (!fs) {
      fs = resolveFactorSpecs([id], classOf, method.volatility as VolatilityChoice)[0];
      specOf.set(id, fs);
    }
    return fs;
  };
  const needOf = (id: string): number => (method.volatility ? Math.max(baseNeed, neededReturns(factorSpec(id).spec)) : baseNeed);
  const runs = new Map<string, number>();
  const excludedFactors: { factor: string; reason: string }[] = [];
  const usable = (id: string): boolean => {
    const values = input.returns.factors[id];
    if (!values) return false;
    let run = runs.get(id);
    const need = needOf(id);
    if (run === undefined) {
      run = trailingRun(values);
      runs.set(id, run);
      if (run < need) {
        const why = method.volatility ? ` (${factorSpec(id).spec.kind === "ma" ? "its moving-average window" : "its volatility process"}${classOf(id) ? `, asset class ${classOf(id)}` : ""})` : "";
        excludedFactors.push({ factor: id, reason: run === 0 ? "no price history up to the last date" : `only ${run} days of returns up to the last date; the method needs ${need}${why}` });
      }
    }
    return run >= need;
  };
  const ex = positionsToExposures(input.positions, usable, { reportingCurrency: input.reportingCurrency, fxFactorId: input.fxFactorId });
  for (const p of input.positions) {
    const id = p.factor ?? p.instrument;
    if (!input.returns.factors[id] && !excludedFactors.some((e) => e.factor === id)) excludedFactors.push({ factor: id, reason: "no price history in the input" });
  }
  warnings.push(...ex.warnings);
  if (excludedFactors.length) {
    warnings.push({
      code: "factor-excluded",
      message: `${countOf(excludedFactors.length, "factor")} ${isAre(excludedFactors.length)} left out for lack of history: ${listSome(excludedFactors.map((f) => `${f.factor} (${f.reason})`), 10, "; ")}.`,
    });
  }
  if (ex.factors.length === 0) throw new RangeError(`runMonthEnd: no position has usable price history${excludedFactors.length ? ` (${excludedFactors[0].factor}: ${excludedFactors[0].reason})` : ""}`);
  let L = T;
  let shortest = "";
  for (const id of ex.factors) {
    const r = runs.get(id) as number;
    if (r < L) { L = r; shortest = id; }
  }
  if (L < T) warnings.push({ code: "short-history", message: `The working sample is the last ${L} of ${T} days: factor ${shortest} has no return on the day before (it starts there or has a gap); every figure uses these ${L} days.` });
  const dates = input.returns.dates.slice(T - L);
  const returns = ex.factors.map((id) => Float64Array.from(Array.prototype.slice.call(input.returns.factors[id], T - L) as number[]));
  const k = ex.factors.length;
  onProgress?.("exposures", 1);

  if (method.volatility) return preparePerFactor({ method, dates, factorIds: ex.factors, returns, exposures: ex.exposures, loadings: ex.loadings, positions: ex.positionIndex.map((j) => input.positions[j]), excludedFactors, excludedPositions: ex.excluded.map((e) => ({ instrument: e.instrument, marketValue: e.marketValue, reason: e.reason })), warnings, specs: ex.factors.map(factorSpec), onProgress });

  // per-factor volatility: GARCH(1,1) for garch-ccc, EWMA where filtering needs it
  let volatility: VolatilityModel | null = null;
  const startup = Math.min(method.startupDays, L);
  const ewmaModel = (): VolatilityModel => {
    const variance: Float64Array[] = [];
    const current = new Float64Array(k);
    for (let i = 0; i < k; i++) {
      let s = 0;
      for (let t = 0; t < startup; t++) s += returns[i][t] ** 2;
      const path = ewmaVariance(returns[i], method.lambda, Math.max(s / startup, 1e-300));
      variance.push(path.variance);
      current[i] = path.currentVariance;
    }
    const p = { omega: 0, alpha: 1 - method.lambda, beta: method.lambda };
    return { variance, current, params: new Array(k).fill(p), labels: new Array(k).fill(`ewma λ=${method.lambda}`), paramsOut: new Array(k).fill({ lambda: method.lambda }) };
  };
  if (method.covariance === "garch-ccc") {
    const variance: Float64Array[] = [];
    const current = new Float64Array(k);
    const params: Garch11Params[] = [];
    const labels: string[] = [];
    const paramsOut: Record<string, number>[] = [];
    const fellBack: string[] = [];
    const failed: string[] = [];
    const fitWarnings = new Map<string, string[]>();
    for (let i = 0; i < k; i++) {
      try {
        const fit = fitGarch11(returns[i], { mean: "zero", fallback: "ewma" });
        variance.push(fit.variance);
        current[i] = fit.currentVariance;
        if (fit.kind === "garch") {
          params.push({ omega: fit.params.omega, alpha: fit.params.alpha, beta: fit.params.beta });
          labels.push("garch(1,1)");
        } else {
          const lambda = fit.params.lambda ?? 0.94;
          params.push({ omega: 0, alpha: 1 - lambda, beta: lambda });
          labels.push(`ewma λ=${lambda} (GARCH fallback)`);
          fellBack.push(ex.factors[i]);
        }
        paramsOut.push({ ...fit.params });
        for (const w of fit.warnings) {
          const list = fitWarnings.get(w.code) ?? [];
          list.push(ex.factors[i]);
          fitWarnings.set(w.code, list);
        }
      } catch (error) {
        let s = 0;
        for (let t = 0; t < startup; t++) s += returns[i][t] ** 2;
        const path = ewmaVariance(returns[i], method.lambda, Math.max(s / startup, 1e-300));
        variance.push(path.variance);
        current[i] = path.currentVariance;
        params.push({ omega: 0, alpha: 1 - method.lambda, beta: method.lambda });
        labels.push(`ewma λ=${method.lambda} (GARCH failed)`);
        paramsOut.push({ lambda: method.lambda });
        failed.push(`${ex.factors[i]}: ${error instanceof Error ? error.message : String(error)}`);
      }
      if (i % 25 === 0) onProgress?.("volatility", i / k);
    }
    if (fellBack.length) warnings.push({ code: "garch-fallback", message: `GARCH(1,1) failed or was near-integrated for ${countOf(fellBack.length, "factor")}; EWMA (λ = 0.94) is used instead: ${listSome(fellBack, 10)}.` });
    if (failed.length) warnings.push({ code: "garch-failed", message: `GARCH(1,1) could not be fitted for ${countOf(failed.length, "factor")}; EWMA is used: ${listSome(failed, 5, "; ")}.` });
    for (const [code, list] of fitWarnings) {
      if (code === "near-integrated" || code === "not-converged") continue; // reported as garch-fallback above
      warnings.push({ code: `garch-${code}`, message: `GARCH(1,1) fit warning "${code}" for ${countOf(list.length, "factor")}: ${listSome(list, 10)}.` });
    }
    volatility = { variance, current, params, labels, paramsOut };
  } else if (method.methods.includes("filtered")) {
    volatility = ewmaModel();
  }
  for (let i = 0; i < k; i++) {
    const v = volatility?.current[i];
    if (v !== undefined && !(v > 0)) throw new RangeError(`runMonthEnd: factor "${ex.factors[i]}" has zero variance`);
  }
  onProgress?.("volatility", 1);

  // one-day covariance for parametric VaR, checked for positive semi-definiteness
  let covariance: SymmetricMatrix;
  let correlation: SymmetricMatrix | null = null;
  let psd: PreparedRun["psd"];
  if (method.covariance === "garch-ccc" && volatility) {
    correlation = standardisedCorrelation(returns, volatility.variance);
    const check = checkPsd(correlation);
    let repair: PsdRepair | null = null;
    if (check.status === "indefinite") {
      repair = nearestCorrelationRepair(correlation);
      correlation = repair.matrix;
    }
    covariance = correlationToCovariance(correlation, volatility.current.map(Math.sqrt));
    psd = { matrix: "correlation", check, repair: repair && stripMatrix(repair) };
  } else {
    if (method.covariance === "equal") {
      const w = Math.min(method.covarianceWindow, L);
      covariance = equalWeightCovariance(returns, { start: L - w, end: L });
    } else covariance = ewmaCovariance(returns, method.lambda, { startupDays: startup });
    const check = checkPsd(covariance);
    let repair: PsdRepair | null = null;
    if (check.status === "indefinite") {
      repair = repairPsd(covariance);
      covariance = repair.matrix;
    }
    psd = { matrix: "covariance", check, repair: repair && stripMatrix(repair) };
  }
  psdWarnings(psd, warnings);
  onProgress?.("covariance", 1);
  const included = ex.positionIndex.map((j) => input.positions[j]);
  return {
    dates, factorIds: ex.factors, returns, exposures: ex.exposures, loadings: ex.loadings, positions: included, covariance, correlation, volatility, perFactor: null, psd, method,
    excludedFactors,
    excludedPositions: ex.excluded.map((e) => ({ instrument: e.instrument, marketValue: e.marketValue, reason: e.reason })),
    warnings,
  };
}

/** The warnings a PSD check and repair give, each sentence true of what was done. */
function psdWarnings(psd: PreparedRun["psd"], warnings: EngineWarning[]): void {
  if (psd.repair) {
    const how =
      psd.matrix === "correlation"
        ? "it was replaced by the nearest correlation matrix in the Frobenius norm (Higham 2002, alternating projections with Dykstra's correction)"
        : "it was replaced by the nearest positive semi-definite matrix in the Frobenius norm (negative eigenvalues set to zero, Higham 1988)";
    warnings.push({
      code: "matrix-repaired",
      message: `The ${psd.matrix} matrix was not positive semi-definite (${psd.repair.negativeEigenvalues} negative eigenvalue(s), smallest ${psd.repair.minEigenvalueBefore.toExponential(3)}); ${how}, a distance of ${psd.repair.frobeniusChange.toExponential(3)} in the Frobenius norm (${(psd.repair.relativeChange * 100).toFixed(4)} % relative, largest element change ${psd.repair.maxElementChange.toExponential(3)}).`,
    });
  }
  if (psd.check.status === "positive-semidefinite") {
    warnings.push({ code: "matrix-singular", message: `The ${psd.matrix} matrix is positive semi-definite but singular (${psd.check.zeroPivots} zero pivot(s)): some factor combinations have no variance in the sample, typically when there are more factors than days.` });
  }
}

/** The constant correlation of standardised residuals over [first, end), repaired if need be (a refit's R). */
function cccAt(returns: readonly Float64Array[], paths: readonly Float64Array[], first: number, end: number): SymmetricMatrix {
  const r = standardisedCorrelation(returns, paths, first, end);
  return checkPsd(r).status === "indefinite" ? nearestCorrelation(r).matrix : r;
}

/** The nearest correlation matrix as a PsdRepair record (with the matrix). */
function nearestCorrelationRepair(r: SymmetricMatrix): PsdRepair {
  const near = nearestCorrelation(r);
  let norm = 0;
  let maxElement = 0;
  for (let i = 0; i < r.values.length; i++) {
    norm += r.values[i] * r.values[i];
    maxElement = Math.max(maxElement, Math.abs(near.matrix.values[i] - r.values[i]));
  }
  return {
    matrix: near.matrix,
    repaired: near.negativeEigenvaluesBefore > 0,
    minEigenvalueBefore: near.minEigenvalueBefore,
    negativeEigenvalues: near.negativeEigenvaluesBefore,
    frobeniusChange: near.frobeniusDistance,
    relativeChange: norm > 0 ? near.frobeniusDistance / Math.sqrt(norm) : 0,
    maxElementChange: maxElement,
    method: `${near.method}; ${near.iterations} iteration(s)${near.converged ? "" : ", stopped at the iteration limit"}`,
  };
}

interface PerFactorInput {
  method: PreparedRun["method"];
  dates: string[];
  factorIds: string[];
  returns: Float64Array[];
  exposures: Float64Array;
  loadings: PositionLoadings[];
  positions: Position[];
  excludedFactors: PreparedRun["excludedFactors"];
  excludedPositions: PreparedRun["excludedPositions"];
  warnings: EngineWarning[];
  specs: FactorSpec[];
  onProgress?: ProgressCallback;
}

/** Prepare a run with per-factor processes: today's fits, R by the chosen estimator (repaired if need be), D·R·D. */
function preparePerFactor(x: PerFactorInput): PreparedRun {
  const { method, returns, specs, warnings } = x;
  const k = returns.length;
  const L = x.dates.length;
  const H = method.horizonDays;
  const fits: ProcessFit[] = [];
  for (let i = 0; i < k; i++) {
    fits.push(fitFactor(returns[i], specs[i]));
    if (i % 25 === 0) x.onProgress?.("volatility", i / k);
  }
  // warnings of the fits, grouped by code
  const byCode = new Map<string, string[]>();
  const fellBack: string[] = [];
  fits.forEach((f, i) => {
    if (f.fallback) fellBack.push(`${x.factorIds[i]} (${f.fallback.reason})`);
    for (const w of f.fit.warnings) {
      if (w.code === "fallback-used" || (f.fallback && (w.code === "near-integrated" || w.code === "not-converged"))) continue;
      const list = byCode.get(w.code) ?? [];
      list.push(x.factorIds[i]);
      byCode.set(w.code, list);
    }
  });
  if (fellBack.length) warnings.push({ code: "volatility-fallback", message: `The chosen process failed or was near-integrated for ${countOf(fellBack.length, "factor")}; its stated EWMA fallback is used instead: ${listSome(fellBack, 10)}.` });
  for (const [code, list] of byCode) warnings.push({ code: `volatility-${code}`, message: `Volatility fit warning "${code}" for ${countOf(list.length, "factor")}: ${listSome(list, 10)}.` });
  x.onProgress?.("volatility", 1);

  const firstDefined = firstDefinedDay(specs);
  const term = method.scaling === "term";
  const variance = fits.map((f) => f.variance);
  const current = Float64Array.from(fits, (f) => f.nextVariance);
  const horizonVariance = Float64Array.from(fits, (f, i) => factorHorizonVariance(f, f.nextVariance, returns[i], L, H, term));
  const corrSpec = method.correlation as CorrelationSpec;
  if (corrSpec.kind === "ccc" && L - firstDefined < 2) throw new RangeError(`runMonthEnd: the constant correlation needs at least 2 days after the longest moving-average window (${firstDefined} days)`);
  const raw = correlationOf(corrSpec, returns, variance, L, firstDefined);
  const check = checkPsd(raw);
  const repair = check.status === "indefinite" ? nearestCorrelationRepair(raw) : null;
  const correlation = repair ? repair.matrix : raw;
  const covariance = correlationToCovariance(correlation, current.map(Math.sqrt));
  const psd: PreparedRun["psd"] = { matrix: "correlation", check, repair: repair && stripMatrix(repair) };
  psdWarnings(psd, warnings);
  x.onProgress?.("covariance", 1);
  const desc = describeCorrelation(corrSpec, L);
  const correlationInfo: ResolvedCorrelation = {
    spec: corrSpec, label: desc.label, statement: desc.statement, check: check.status,
    repair: repair && { method: repair.method, frobeniusDistance: repair.frobeniusChange, iterations: 0, negativeEigenvaluesBefore: repair.negativeEigenvalues, minEigenvalueBefore: repair.minEigenvalueBefore },
  };
  const volatility: VolatilityModel = {
    variance,
    current,
    params: fits.map((f) => ({ omega: f.params.omega ?? 0, alpha: f.params.alpha ?? 0, beta: f.params.beta ?? 0 })),
    labels: fits.map((f) => f.label),
    paramsOut: fits.map((f) => ({ ...f.params })),
  };
  return {
    dates: x.dates, factorIds: x.factorIds, returns, exposures: x.exposures, loadings: x.loadings, positions: x.positions, covariance, correlation, volatility,
    perFactor: { specs, fits, correlationSpec: corrSpec, correlationInfo, firstDefined, term, horizonVariance },
    psd, method, excludedFactors: x.excludedFactors, excludedPositions: x.excludedPositions, warnings,
  };
}

function stripMatrix(r: PsdRepair): Omit<PsdRepair, "matrix"> {
  const { matrix: _matrix, ...rest } = r;
  void _matrix;
  return rest;
}

function varCore(input: MonthEndInput, onProgress?: ProgressCallback) {
  const prepared = prepareRun(input, onProgress);
  const { dates, factorIds, returns, exposures, loadings, positions, covariance, correlation, volatility, method } = prepared;
  const warnings = [...prepared.warnings];
  const L = dates.length;
  const k = factorIds.length;
  const H = method.horizonDays;
  const profile = input.capitalProfile ?? BASEL_CAPITAL_PROFILE;
  const confidences = [...method.confidences];
  if (!confidences.includes(profile.confidence)) confidences.push(profile.confidence);
  const paramOptions: ParametricOptions = { distribution: method.distribution, nu: method.nu };

  // the static book's P&L on every working day
  const pnl = new Float64Array(L);
  for (let i = 0; i < k; i++) {
    const e = exposures[i];
    const r = returns[i];
    for (let t = 0; t < L; t++) pnl[t] += e * r[t];
  }
  const assetClassOf = positions.map((p) => p.assetClass ?? "unclassified");
  const currencyOf = positions.map((p) => p.currency ?? input.reportingCurrency);
  const classes = [...new Set(assetClassOf)];
  const classExposures = new Map<string, Float64Array>();
  for (const c of classes) classExposures.set(c, new Float64Array(k));
  loadings.forEach((l, j) => {
    const v = classExposures.get(assetClassOf[j]) as Float64Array;
    for (let m = 0; m < l.factorIndices.length; m++) v[l.factorIndices[m]] += l.amounts[m];
  });

  // horizon covariance from the term structures, when chosen
  let covariance10: SymmetricMatrix | null = null;
  if (prepared.perFactor) {
    if (prepared.perFactor.term) covariance10 = correlationToCovariance(correlation as SymmetricMatrix, prepared.perFactor.horizonVariance.map(Math.sqrt));
  } else if (method.scaling === "term" && volatility && correlation) {
    const vols10 = new Float64Array(k);
    for (let i = 0; i < k; i++) vols10[i] = Math.sqrt(garchHorizonVariance(volatility.current[i], volatility.params[i], H));
    covariance10 = correlationToCovariance(correlation, vols10);
  }

  const W = Math.min(method.historicalWindow, L);
  if (W < method.historicalWindow && method.methods.some((m) => m !== "parametric")) {
    warnings.push({ code: "short-window", message: `The historical window is ${W} days, shorter than the ${method.historicalWindow} asked for.` });
  }
  const scalingFor = (m: VarMethod): HorizonScaling => {
    if (method.scaling === "term") return m === "parametric" ? "term" : "sqrt";
    if (method.scaling === "overlap") return m === "parametric" ? "sqrt" : "overlap";
    return "sqrt";
  };
  if (prepared.perFactor && method.methods.includes("filtered") && L - W < prepared.perFactor.firstDefined) {
    throw new RangeError(`runMonthEnd: filtered historical simulation over ${W} days needs each factor's variance on every day of the window; the longest moving-average window (${prepared.perFactor.firstDefined} days) leaves only ${L - prepared.perFactor.firstDefined}`);
  }
  const filteredScenarios = (at: number, start: number, end: number): Scenarios => {
    const vm = volatility as VolatilityModel;
    const x = returns.map((r, i) => {
      const out = new Float64Array(end - start);
      const now = at >= L ? vm.current[i] : vm.variance[i][at];
      for (let s = start; s < end; s++) out[s - start] = r[s] * Math.sqrt(now / vm.variance[i][s]);
      return out;
    });
    return { x, count: end - start };
  };
  const windowScenarios = (start: number, end: number): Scenarios => ({ x: returns.map((r) => r.subarray(start, end)), count: end - start });
  const overlapScenarios = (sc: Scenarios): Scenarios => {
    const x = sc.x.map((r) => overlappingSums(r, H));
    return { x, count: sc.count - H + 1 };
  };

  // evaluation of one method for any exposure vector
  const evaluators = (m: VarMethod): { one: (e: ArrayLike<number>, c: number) => Evaluation; ten: (e: ArrayLike<number>, c: number) => Evaluation; sigma: number; scenarios: number | null } => {
    const scaling = scalingFor(m);
    if (m === "parametric") {
      const one = (e: ArrayLike<number>, c: number) => evaluateParametric(covariance, e, c, paramOptions);
      const ten = covariance10
        ? (e: ArrayLike<number>, c: number) => evaluateParametric(covariance10 as SymmetricMatrix, e, c, paramOptions)
        : (e: ArrayLike<number>, c: number) => scaleEvaluation(one(e, c), Math.sqrt(H));
      return { one, ten, sigma: evaluateParametric(covariance, exposures, 0.99, paramOptions).sigma, scenarios: null };
    }
    const sc = m === "historical" ? windowScenarios(L - W, L) : filteredScenarios(L, L - W, L);
    const one = (e: ArrayLike<number>, c: number) => evaluateScenarios(sc, e, c);
    let ten: (e: ArrayLike<number>, c: number) => Evaluation;
    if (scaling === "overlap") {
      if (sc.count < H + 1) throw new RangeError(`runMonthEnd: the historical window is too short for overlapping ${H}-day returns`);
      const sc10 = overlapScenarios(sc);
      ten = (e, c) => evaluateScenarios(sc10, e, c);
    } else ten = (e, c) => scaleEvaluation(one(e, c), Math.sqrt(H));
    const p = scenarioPnl(sc, exposures);
    return { one, ten, sigma: Math.sqrt(dot(p, p) / p.length), scenarios: sc.count };
  };

  const methodFigures: MethodFigures[] = [];
  method.methods.forEach((m, mi) => {
    const ev = evaluators(m);
    const byConfidence: ConfidenceFigures[] = confidences.map((c) => {
      const one = ev.one(exposures, c);
      const ten = ev.ten(exposures, c);
      const posVar = allocateToPositions(loadings, one.varMarginal);
      const posEs = allocateToPositions(loadings, one.esMarginal);
      const posVar10 = allocateToPositions(loadings, ten.varMarginal);
      const posEs10 = allocateToPositions(loadings, ten.esMarginal);
      const contributions: PositionContribution[] = positions.map((p, j) => ({
        instrument: p.instrument,
        assetClass: assetClassOf[j],
        currency: currencyOf[j],
        marketValue: p.marketValue,
        exposure: p.deltaExposure ?? p.marketValue,
        componentVar: posVar[j],
        componentEs: posEs[j],
        componentVar10d: posVar10[j],
        componentEs10d: posEs10[j],
        marginalVar: p.marketValue !== 0 ? posVar[j] / p.marketValue : 0,
      }));
      const byAssetClass: ConfidenceFigures["byAssetClass"] = {};
      let standAloneSum = 0;
      let standAloneSum10 = 0;
      for (const cls of classes) {
        const e = classExposures.get(cls) as Float64Array;
        const s1 = ev.one(e, c);
        const s10 = ev.ten(e, c);
        standAloneSum += s1.var;
        standAloneSum10 += s10.var;
        byAssetClass[cls] = { componentVar: 0, componentEs: 0, componentVar10d: 0, componentEs10d: 0, standAloneVar: s1.var, standAloneEs: s1.es, standAloneVar10d: s10.var, standAloneEs10d: s10.es };
      }
      const byCurrency: Record<string, GroupFigure> = {};
      for (let j = 0; j < positions.length; j++) {
        const a = byAssetClass[assetClassOf[j]];
        a.componentVar += posVar[j]; a.componentEs += posEs[j]; a.componentVar10d += posVar10[j]; a.componentEs10d += posEs10[j];
        const g = (byCurrency[currencyOf[j]] ??= { componentVar: 0, componentEs: 0, componentVar10d: 0, componentEs10d: 0 });
        g.componentVar += posVar[j]; g.componentEs += posEs[j]; g.componentVar10d += posVar10[j]; g.componentEs10d += posEs10[j];
      }
      return {
        confidence: c,
        oneDay: { var: one.var, es: one.es },
        tenDay: { var: ten.var, es: ten.es },
        contributions,
        byFactor: factorIds.map((f, i) => ({ factor: f, exposure: exposures[i], marginalVar: one.varMarginal[i], componentVar: exposures[i] * one.varMarginal[i] })),
        byAssetClass,
        byCurrency,
        diversificationBenefit: standAloneSum - one.var,
        diversificationBenefit10d: standAloneSum10 - ten.var,
      };
    });
    methodFigures.push({ method: m, portfolioVolatility: ev.sigma, scaling: scalingFor(m), scalingStatement: describeScaling(scalingFor(m), H, !!prepared.perFactor), scenarios: ev.scenarios, byConfidence });
    onProgress?.("var", (mi + 1) / method.methods.length);
  });
  return { prepared, dates, factorIds, returns, exposures, loadings, positions, covariance, covariance10, correlation, volatility, method, warnings, L, k, H, profile, confidences, paramOptions, pnl, W, scalingFor, windowScenarios, overlapScenarios, methodFigures };
}

/** The VaR and ES figures of a book without the stressed VaR, history, backtest and capital (the `var` command). */
export interface PortfolioVarResult {
  engineVersion: string;
  asOf: string;
  confidences: number[];
  horizonDays: number;
  methods: MethodFigures[];
  covarianceCheck: MonthEndResult["covarianceCheck"];
  factors: MonthEndResult["factors"];
  excludedPositions: MonthEndResult["excludedPositions"];
  sample: MonthEndResult["sample"];
  choices: MonthEndResult["choices"];
  warnings: EngineWarning[];
  limitations: string[];
  /** the resolved model configuration (per factor process and one-day variance, correlation, horizon rule) */
  model: ResolvedModel;
  /** the correlation matrix behind the parametric figures */
  correlation: StoredCorrelation;
}

/**
 * VaR and ES at one day and the horizon, per confidence and method, with the Euler decomposition; the same
 * computation as runMonthEnd's first stage.
 * @throws {RangeError} on impossible input
 */
export function portfolioVar(input: MonthEndInput): PortfolioVarResult {
  const core = varCore(input);
  const { method, L, H, W, dates } = core;
  const model = resolveModel(core.prepared, core.scalingFor, L, H);
  return {
    engineVersion: ENGINE_VERSION,
    asOf: dates[L - 1],
    confidences: core.confidences,
    horizonDays: H,
    methods: core.methodFigures,
    covarianceCheck: core.prepared.psd,
    factors: { used: core.factorIds, excluded: core.prepared.excludedFactors },
    excludedPositions: core.prepared.excludedPositions,
    sample: { days: L, firstDate: dates[0], lastDate: dates[L - 1] },
    choices: describeChoices(method, core.scalingFor, L, W, H, core.confidences),
    warnings: core.warnings,
    limitations: [...describeLimitations(method, core.scalingFor, L, W, H), ...modelLimitations(model, core.prepared)],
    model,
    correlation: storedCorrelation(core.prepared),
  };
}

/**
 * The month-end run: every figure a filing needs, in one plain object.
 * @param input positions, aligned factor returns, reporting currency, method and capital rule profile
 * @param onProgress optional callback with a stage name and the fraction done
 * @throws {RangeError} on impossible input (misaligned returns, no usable position, bad options)
 */
export function runMonthEnd(input: MonthEndInput, onProgress?: ProgressCallback): MonthEndResult {
  const core = varCore(input, onProgress);
  const { prepared, dates, factorIds, returns, exposures, loadings, covariance, covariance10, correlation, volatility, method, warnings, L, k, H, profile, confidences, paramOptions, pnl, W, scalingFor, windowScenarios, methodFigures } = core;
  void loadings;
  // stressed VaR: the primary method on a stress window, chosen or searched
  const primary = method.primaryMethod;
  const S = Math.min(method.stressWindowDays, L);
  let stressStart: number;
  let stressEnd: number;
  let searchRule: string | null = null;
  let windowsSearched: number | null = null;
  let chosenBy: "search" | "analyst";
  if (method.stressWindow === "search") {
    const search = searchStressWindow(pnl, S, profile.confidence, primary === "parametric" ? "parametric" : "historical");
    stressStart = search.best.start;
    stressEnd = search.best.end;
    searchRule = search.rule + " (searched within the working sample)";
    windowsSearched = search.windows;
    chosenBy = "search";
    if (S < method.stressWindowDays) warnings.push({ code: "short-stress-window", message: `The stress window is ${S} days: the working sample is shorter than ${method.stressWindowDays}.` });
  } else {
    const { start, end } = method.stressWindow as { start: string; end: string };
    stressStart = dates.findIndex((d) => d >= start);
    let last = -1;
    for (let t = L - 1; t >= 0; t--) if (dates[t] <= end) { last = t; break; }
    if (stressStart < 0 || last < stressStart) throw new RangeError(`runMonthEnd: the stress window ${start} to ${end} has no days in the working sample (${dates[0]} to ${dates[L - 1]})`);
    stressEnd = last + 1;
    chosenBy = "analyst";
    if (stressEnd - stressStart < 250) warnings.push({ code: "short-stress-window", message: `The chosen stress window has ${stressEnd - stressStart} days, fewer than the 250 of a 12-month period.` });
    if (dates[0] > start) warnings.push({ code: "stress-window-clipped", message: `The stress window starts at ${dates[stressStart]}: the working sample has no earlier days.` });
  }
  const stressScenarios = windowScenarios(stressStart, stressEnd);
  const stressCov = primary === "parametric" ? equalWeightCovariance(returns, { start: stressStart, end: stressEnd }) : null;
  const stressedByConfidence = confidences.map((c) => {
    let one: VarFigure;
    let ten: VarFigure;
    if (stressCov) {
      const e1 = evaluateParametric(stressCov, exposures, c, paramOptions);
      one = { var: e1.var, es: e1.es };
      ten = { var: e1.var * Math.sqrt(H), es: e1.es * Math.sqrt(H) };
    } else {
      const p = scenarioPnl(stressScenarios, exposures);
      const t1 = historicalTail(p, c);
      one = { var: t1.var, es: t1.es };
      if (scalingFor(primary) === "overlap") {
        const t10 = historicalTail(overlappingSums(p, H), c);
        ten = { var: t10.var, es: t10.es };
      } else ten = { var: t1.var * Math.sqrt(H), es: t1.es * Math.sqrt(H) };
    }
    return { confidence: c, oneDay: one, tenDay: ten };
  });
  const stressed: StressedFigures = {
    method: primary,
    window: { start: dates[stressStart], end: dates[stressEnd - 1], days: stressEnd - stressStart, chosenBy },
    searchRule,
    windowsSearched,
    byConfidence: stressedByConfidence,
    statement:
      primary === "parametric"
        ? `Stressed VaR: parametric VaR of today's book with the equal-weight, zero-mean covariance of the stress window (a recursive or GARCH estimate over one window would depend on its start-up); ${H} days by ${scalingFor(primary) === "term" ? "square-root-of-time (the term structure does not apply to a window estimate)" : "square-root-of-time"}.`
        : `Stressed VaR: historical simulation of today's book over the stress window's returns, unfiltered (filtering would rescale the stress away); ${H} days by ${scalingFor(primary) === "overlap" ? `overlapping ${H}-day returns` : "square-root-of-time"}.`,
  };
  onProgress?.("stressed", 1);

  // VaR history: forecasts f_s for day s made with data up to s − 1, for s = from..L (s = L is today's figure)
  const B = method.backtestDays;
  const Hd = method.historyDays;
  const pfState = prepared.perFactor;
  let needBefore = primary === "parametric" ? (method.covariance === "equal" ? Math.min(method.covarianceWindow, L) : 1) : W;
  if (pfState && primary !== "historical") {
    const c = pfState.correlationSpec;
    // the correlation's own window, the variance paths' start, and (rolling) the earliest refit's data
    needBefore = primary === "parametric" ? (c.kind === "equal" ? c.window : c.kind === "ccc" ? pfState.firstDefined + 2 : 1) : W + pfState.firstDefined;
    if (method.backtestRefit.mode === "rolling") {
      const most = Math.max(...pfState.specs.map((f) => neededReturns(f.spec)));
      needBefore = Math.max(needBefore, most + method.backtestRefit.everyDays - 1);
    }
  }
  let span = Math.max(B, Hd - 1);
  if (L - span < needBefore) {
    span = Math.max(0, L - needBefore);
    warnings.push({ code: "short-history", message: `Only ${span} past days can be backtested or shown in the VaR history with this method and sample (asked for ${B} and ${Hd}).` });
  }
  const from = L - span;
  const cCount = confidences.length;
  const series = (n: number) => Array.from({ length: cCount }, () => new Float64Array(n));
  const count = span + 1;
  const var1 = series(count), var10 = series(count), es1 = series(count), es10 = series(count);
  const qs = confidences.map((c) => varMultiplier(c, paramOptions));
  const qEs = confidences.map((c) => esMultiplier(c, paramOptions));
  const sqrtH = Math.sqrt(H);
  const scalingPrimary = scalingFor(primary);
  const blocks = pfState && primary !== "historical" ? refitBlocks(L, from, method.backtestRefit) : [];
  if (primary === "parametric") {
    const sigma1 = new Float64Array(count);
    const sigma10 = new Float64Array(count);
    if (pfState) {
      // D from each factor's process as fitted on the stated schedule; R by the chosen estimator, data up to s − 1
      const term = pfState.term;
      const hist = Array.from({ length: k }, () => new Float64Array(count));
      const hist10 = term ? Array.from({ length: k }, () => new Float64Array(count)) : null;
      const corr = pfState.correlationSpec;
      const w = new Float64Array(k);
      const w10 = new Float64Array(k);
      const scratch = new Float64Array(k);
      let done = 0;
      forEachBlock(returns, pfState.specs, pfState.fits, blocks, dates, (block, { fits, paths }) => {
        let R: SymmetricMatrix | null = null;
        if (corr.kind === "ccc") {
          R = block.tau === L || method.backtestRefit.mode === "full-sample" ? (correlation as SymmetricMatrix) : cccAt(returns, paths, pfState.firstDefined, block.tau);
        }
        for (let s = block.start; s < block.end; s++) {
          if (s >= L) continue;
          const n = s - from;
          for (let i = 0; i < k; i++) {
            const h = paths[i][s];
            hist[i][n] = h;
            if (hist10) hist10[i][n] = factorHorizonVariance(fits[i], h, returns[i], s, H, true);
          }
          if (R) {
            for (let i = 0; i < k; i++) {
              w[i] = exposures[i] * Math.sqrt(hist[i][n]);
              if (hist10) w10[i] = exposures[i] * Math.sqrt(hist10[i][n]);
            }
            sigma1[n] = Math.sqrt(Math.max(0, matrixForm(R, w)));
            if (hist10) sigma10[n] = Math.sqrt(Math.max(0, matrixForm(R, w10)));
          }
        }
        done += block.end - block.start;
        onProgress?.("history", Math.min(1, done / count));
      });
      if (corr.kind !== "ccc") {
        forEachDailyCovariance(corr, returns, from, L, (s, cov) => {
          const n = s - from;
          for (let i = 0; i < k; i++) w[i] = exposures[i] * Math.sqrt(hist[i][n]);
          sigma1[n] = Math.sqrt(Math.max(0, correlationForm(cov, w, k, scratch)));
          if (hist10) {
            for (let i = 0; i < k; i++) w10[i] = exposures[i] * Math.sqrt(hist10[i][n]);
            sigma10[n] = Math.sqrt(Math.max(0, correlationForm(cov, w10, k, scratch)));
          }
        });
      }
      // today's point: exactly today's figures
      sigma1[L - from] = evaluateParametric(covariance, exposures, 0.99, paramOptions).sigma;
      if (covariance10) sigma10[L - from] = evaluateParametric(covariance10, exposures, 0.99, paramOptions).sigma;
    } else if (method.covariance === "equal") {
      const C = Math.min(method.covarianceWindow, L);
      for (let s = from; s <= L; s++) {
        let ss = 0;
        for (let u = s - C; u < s; u++) ss += pnl[u] * pnl[u];
        sigma1[s - from] = Math.sqrt(ss / C);
      }
    } else if (method.covariance === "ewma") {
      // e'Σₛe follows the same recursion on the book's P&L: σ²ₛ₊₁ = λσ²ₛ + (1−λ)pₛ²
      const st = Math.min(method.startupDays, L);
      let v = 0;
      for (let t = 0; t < st; t++) v += pnl[t] * pnl[t];
      v /= st;
      for (let s = 0; s <= L; s++) {
        if (s >= from) sigma1[s - from] = Math.sqrt(v);
        if (s < L) v = method.lambda * v + (1 - method.lambda) * pnl[s] * pnl[s];
      }
    } else {
      const vm = volatility as VolatilityModel;
      const R = correlation as SymmetricMatrix;
      const w = new Float64Array(k);
      const w10 = new Float64Array(k);
      for (let s = from; s <= L; s++) {
        for (let i = 0; i < k; i++) {
          const h = s >= L ? vm.current[i] : vm.variance[i][s];
          w[i] = exposures[i] * Math.sqrt(h);
          if (scalingPrimary === "term") w10[i] = exposures[i] * Math.sqrt(garchHorizonVariance(h, vm.params[i], H));
        }
        sigma1[s - from] = Math.sqrt(Math.max(0, dot(w, matVec(R, w))));
        if (scalingPrimary === "term") sigma10[s - from] = Math.sqrt(Math.max(0, dot(w10, matVec(R, w10))));
      }
    }
    for (let n = 0; n < count; n++) {
      const s10 = scalingPrimary === "term" ? sigma10[n] : sigma1[n] * sqrtH;
      for (let c = 0; c < cCount; c++) {
        var1[c][n] = qs[c] * sigma1[n]; es1[c][n] = qEs[c] * sigma1[n];
        var10[c][n] = qs[c] * s10; es10[c][n] = qEs[c] * s10;
      }
    }
  } else {
    const scratch = new Float64Array(W);
    const scratch10 = new Float64Array(W);
    const vm = volatility;
    const p = new Float64Array(W);
    const tails = (n: number): void => {
      const sorted = sortedLosses(p, 0, W, scratch);
      let sorted10: Float64Array | null = null;
      if (scalingPrimary === "overlap") sorted10 = sortedLosses(overlappingSums(p, H), 0, W - H + 1, scratch10);
      for (let c = 0; c < cCount; c++) {
        const t1 = tailOfSorted(sorted, confidences[c]);
        var1[c][n] = t1.var; es1[c][n] = t1.es;
        if (sorted10) {
          const t10 = tailOfSorted(sorted10, confidences[c]);
          var10[c][n] = t10.var; es10[c][n] = t10.es;
        } else { var10[c][n] = t1.var * sqrtH; es10[c][n] = t1.es * sqrtH; }
      }
    };
    if (pfState && primary === "filtered") {
      // each factor rescaled by its own process, as fitted on the stated schedule (today's point: today's fits)
      let done = 0;
      forEachBlock(returns, pfState.specs, pfState.fits, blocks, dates, (block, { paths }) => {
        for (let s = block.start; s < block.end; s++) {
          p.fill(0);
          for (let i = 0; i < k; i++) {
            const r = returns[i];
            const hv = s >= L ? (vm as VolatilityModel).variance[i] : paths[i];
            const now = s >= L ? (vm as VolatilityModel).current[i] : paths[i][s];
            const e = exposures[i];
            for (let u = 0; u < W; u++) p[u] += e * r[s - W + u] * Math.sqrt(now / hv[s - W + u]);
          }
          tails(s - from);
        }
        done += block.end - block.start;
        onProgress?.("history", Math.min(1, done / count));
      });
    } else for (let s = from; s <= L; s++) {
      const n = s - from;
      if (primary === "historical") for (let u = 0; u < W; u++) p[u] = pnl[s - W + u];
      else {
        p.fill(0);
        for (let i = 0; i < k; i++) {
          const r = returns[i];
          const hv = (vm as VolatilityModel).variance[i];
          const now = s >= L ? (vm as VolatilityModel).current[i] : hv[s];
          const e = exposures[i];
          for (let u = 0; u < W; u++) p[u] += e * r[s - W + u] * Math.sqrt(now / hv[s - W + u]);
        }
      }
      tails(n);
      if (n % 25 === 0) onProgress?.("history", n / count);
    }
  }
  const asOfIndex = (s: number) => dates[s - 1];
  const points: VarHistoryPoint[] = [];
  for (let s = Math.max(from, L - Hd + 1); s <= L; s++) {
    const n = s - from;
    points.push({ asOf: asOfIndex(s), var1d: var1.map((v) => v[n]), var10d: var10.map((v) => v[n]), es1d: es1.map((v) => v[n]), es10d: es10.map((v) => v[n]) });
  }
  onProgress?.("history", 1);

  // backtest: the book's P&L on day s against the one-day VaR forecast for s, at the profile's confidence
  const ci = confidences.indexOf(profile.confidence);
  const btFrom = Math.max(from, L - B);
  const btDates = dates.slice(btFrom, L);
  const btPnl = pnl.subarray(btFrom, L);
  const btVar = var1[ci].subarray(btFrom - from, L - from);
  const bt = btDates.length > 0 ? runBacktest(btDates, btPnl, btVar, profile.confidence) : null;
  if (!bt) throw new RangeError("runMonthEnd: no past days are available for the backtest");
  warnings.push(...bt.warnings);
  onProgress?.("backtest", 1);

  // capital under the profile: VaR and sVaR at the profile's horizon, 60-day averages
  const horizonOf = (n: number, c: number, arr1: Float64Array[], arr10: Float64Array[]) => (profile.horizonDays === 1 ? arr1[c][n] : profile.horizonDays === H ? arr10[c][n] : arr1[c][n] * Math.sqrt(profile.horizonDays));
  const capVars: number[] = [];
  for (let s = Math.max(from, L - profile.averagingDays + 1); s <= L; s++) capVars.push(horizonOf(s - from, ci, var1, var10));
  if (capVars.length < profile.averagingDays) throw new RangeError(`runMonthEnd: capital needs ${profile.averagingDays} days of VaR history, the sample gives ${capVars.length}`);
  const sCi = stressedByConfidence[ci];
  const sVar = profile.horizonDays === 1 ? sCi.oneDay.var : profile.horizonDays === H ? sCi.tenDay.var : sCi.oneDay.var * Math.sqrt(profile.horizonDays);
  const plusFactor = bt.days === 250 ? bt.plusFactor : trafficLight(bt.days, bt.exceptions, 1 - profile.confidence).plusFactor;
  const capital = capitalCharge({ varHistory: capVars, stressedVarHistory: new Array(capVars.length).fill(sVar), plusFactor }, profile);
  onProgress?.("capital", 1);

  const limitations = describeLimitations(method, scalingFor, L, W, H);
  const choices: MonthEndResult["choices"] = {
    ...describeChoices(method, scalingFor, L, W, H, confidences),
    primaryMethod: primary,
    stressWindow: chosenBy === "search" ? `searched: the ${S}-day window with the highest VaR` : "chosen by the analyst",
    historyDays: points.length,
    backtestDays: bt.days,
    varHistoryRule: "static book: today's exposures applied to each past day's inputs; one forecast per day using data up to the day before",
    capitalProfile: `m_c = ${profile.multiplierBase} + plus factor, m_s = ${profile.stressedMultiplierBase}${profile.plusFactorOnStressed ? " + plus factor" : ""}, ${profile.averagingDays}-day averages, ${profile.confidence * 100} %, ${profile.horizonDays}-day`,
  };


  // the backtest day by day, the resolved model and the correlation, stored with the run
  const backtestSeries: StoredBacktestSeries = { confidence: profile.confidence, method: primary, dates: [], pnl: [], var: [], exception: [] };
  for (let s = btFrom; s < L; s++) {
    backtestSeries.dates.push(dates[s]);
    backtestSeries.pnl.push(pnl[s]);
    backtestSeries.var.push(var1[ci][s - from]);
    backtestSeries.exception.push(-pnl[s] > var1[ci][s - from]);
  }
  const model = resolveModel(prepared, scalingFor, L, H);
  limitations.push(...modelLimitations(model, prepared));

  // candidate-method evidence on the book, when asked for
  let candidates: CandidateEvidence | undefined;
  const ask = method.candidates;
  if (ask && (ask.include === "standard" || (ask.extra?.length ?? 0) > 0)) {
    const list = [...(ask.include === "standard" ? standardCandidates(ask.archOrder ?? 5) : []), ...(ask.extra ?? [])];
    const ctx: CandidateContext = {
      dates, pnl, backtestFrom: btFrom, refit: method.backtestRefit.mode === "full-sample" && !prepared.perFactor ? { mode: "rolling", everyDays: 21 } : method.backtestRefit,
      confidence: profile.confidence, profile, stressedVar: profile.includeStressed ? sVar : null, term: method.scaling === "term",
    };
    const ownRow = rowFromSeries({ id: "this-method", label: `This run's method: ${model.statements[0] ?? primary}`, basis: "method" }, ctx, btVar, capVars);
    const given = list.filter((c) => c.basis === "method").map((c) => {
      try {
        const other = runMonthEnd({ ...input, method: methodOfCandidate(input.method, c) });
        const ci2 = other.confidences.indexOf(profile.confidence);
        const pts = other.varHistory.points;
        const cap2 = pts.slice(-profile.averagingDays).map((p) => (profile.horizonDays === 1 ? p.var1d[ci2] : profile.horizonDays === other.horizonDays ? p.var10d[ci2] : p.var1d[ci2] * Math.sqrt(profile.horizonDays)));
        const series = other.backtestSeries as StoredBacktestSeries;
        if (series.dates.length !== btVar.length || series.dates[0] !== dates[btFrom]) throw new RangeError(`its backtest covers ${series.dates.length} days from ${series.dates[0]}, not the run's ${btVar.length} from ${dates[btFrom]}`);
        return rowFromSeries(c, ctx, series.var, cap2);
      } catch (error) {
        return failedRow(c, (error as Error).message);
      }
    });
    candidates = candidateRows(ctx, list, [ownRow, ...given]);
    onProgress?.("candidates", 1);
  }

  return {
    engineVersion: ENGINE_VERSION,
    asOf: dates[L - 1],
    reportingCurrency: input.reportingCurrency,
    confidences,
    horizonDays: H,
    primaryMethod: primary,
    methods: methodFigures,
    stressed,
    varHistory: { method: primary, points, statement: "Static book: today's positions valued with each past day's inputs. Each point is the VaR for the next business day using data up to its date; the last point is today's figure." },
    backtest: { ...bt, method: primary, statement: `Hypothetical P&L of today's book on each of the last ${bt.days} days against that day's one-day ${profile.confidence * 100} % VaR forecast from the day before (${primary}).` },
    capital: { ...capital, stressedVarStatement: "Static book and a fixed stress window: the stressed VaR is the same on each of the averaging days." },
    covarianceCheck: prepared.psd,
    volatilityModels: volatility
      ? factorIds.map((f, i) => ({ factor: f, model: volatility.labels[i], params: volatility.paramsOut[i], currentVolatility: Math.sqrt(volatility.current[i]) }))
      : null,
    factors: { used: factorIds, excluded: prepared.excludedFactors },
    excludedPositions: prepared.excludedPositions,
    sample: { days: L, firstDate: dates[0], lastDate: dates[L - 1] },
    choices,
    warnings,
    limitations,
    model,
    correlation: storedCorrelation(prepared),
    backtestSeries,
    ...(candidates ? { candidates } : {}),
  };
}

type Scaler = (m: VarMethod) => HorizonScaling;

/** The correlation behind the parametric figures, as stored with a run. */
export function storedCorrelation(prepared: PreparedRun): StoredCorrelation {
  const m = prepared.correlation ?? covarianceToCorrelation(prepared.covariance).correlation;
  const method = prepared.method;
  const L = prepared.dates.length;
  const basis = prepared.perFactor
    ? describeCorrelation(prepared.perFactor.correlationSpec, L).label
    : method.covariance === "garch-ccc"
      ? "Constant correlation of the GARCH(1,1)-standardised returns"
      : method.covariance === "ewma"
        ? `EWMA covariance (λ = ${method.lambda}, zero mean) scaled to correlations`
        : `Equal-weight covariance over ${Math.min(method.covarianceWindow, L)} days (zero mean) scaled to correlations`;
  return { factors: [...prepared.factorIds], matrix: matrixToRows(m), basis };
}

/** The factor records of the legacy single-covariance paths. */
function legacyFactors(prepared: PreparedRun, H: number, term: boolean): ResolvedFactorModel[] {
  const method = prepared.method;
  const L = prepared.dates.length;
  const k = prepared.factorIds.length;
  const cov = prepared.covariance;
  const vm = prepared.volatility;
  return prepared.factorIds.map((factor, i) => {
    let spec: ResolvedFactorModel["spec"];
    let label: string;
    let params: Record<string, number>;
    let variance = cov.values[i * k + i];
    let process: ResolvedFactorModel["process"];
    let fallback: ResolvedFactorModel["fallback"] = null;
    let horizon = H * variance;
    if (method.covariance === "garch-ccc" && vm) {
      spec = { kind: "garch", distribution: "normal", mean: "zero", targeting: false, fallback: "ewma", fallbackLambda: 0.94, init: "sample" };
      variance = vm.current[i];
      params = { ...vm.paramsOut[i] };
      process = vm.labels[i].startsWith("garch") ? "garch" : "ewma";
      label = process === "garch" ? specLabel(spec, params) : `EWMA, λ = ${params.lambda ?? method.lambda}, zero mean (${vm.labels[i].includes("failed") ? "GARCH(1,1) could not be fitted" : "fallback from GARCH(1,1)"})`;
      if (process === "ewma") fallback = { from: "garch", reason: vm.labels[i].includes("failed") ? "not-converged" : "near-integrated", label: specLabel(spec) };
      horizon = term ? garchHorizonVariance(variance, vm.params[i], H) : H * variance;
    } else if (method.covariance === "equal") {
      const w = Math.min(method.covarianceWindow, L);
      spec = { kind: "ma", window: w, divisor: "m", mean: "zero" };
      process = "ma";
      label = specLabel(spec);
      params = { window: w };
    } else {
      spec = { kind: "ewma", lambda: method.lambda, fit: false, init: { firstReturns: Math.min(method.startupDays, L) } };
      process = "ewma";
      label = specLabel(spec);
      params = { lambda: method.lambda };
    }
    return {
      factor, assetClass: null, source: "legacy", spec, process, label, params, parameterNames: Object.keys(params),
      startUp: spec.kind === "ma" ? specStartUp(spec) : describeInit((spec as { init: InitRule }).init),
      fallback, variance, horizonVariance: horizon, longRunVariance: null, logLikelihood: null, warnings: [], limitations: [],
    };
  });
}

/** Group factors by label for a sentence: "GARCH(1,1), … for 3 factors (equity: A, B, C)". */
function volatilitySentence(factors: readonly ResolvedFactorModel[]): string {
  const groups = new Map<string, ResolvedFactorModel[]>();
  for (const f of factors) {
    const key = `${specLabel(f.spec)}|${f.startUp}`;
    const list = groups.get(key) ?? [];
    list.push(f);
    groups.set(key, list);
  }
  const parts = [...groups.values()].map((list) => {
    const classes = [...new Set(list.map((f) => f.assetClass ?? "unclassified"))];
    const names = list.slice(0, 6).map((f) => f.factor).join(", ") + (list.length > 6 ? ", …" : "");
    return `${specLabel(list[0].spec)} (start-up: ${list[0].startUp}) for ${countOf(list.length, "factor")} (${classes.join(", ")}: ${names})`;
  });
  const fell = factors.filter((f) => f.fallback);
  const fallback = fell.length ? ` The stated EWMA fallback was used for ${countOf(fell.length, "factor")}: ${listSome(fell.map((f) => `${f.factor} (${f.fallback!.reason})`), 6)}.` : "";
  return `Volatility: ${parts.join("; ")}.${fallback}`;
}

/** The resolved model configuration of a prepared run: the one source for sentences about the method. */
export function resolveModel(prepared: PreparedRun, scalingFor: Scaler, L: number, H: number): ResolvedModel {
  const method = prepared.method;
  const pf = prepared.perFactor;
  const term = method.scaling === "term";
  const factors = pf ? pf.specs.map((fs, i) => resolvedFactor(fs, pf.fits[i], pf.horizonVariance[i])) : legacyFactors(prepared, H, term);
  let correlation: ResolvedCorrelation;
  if (pf) correlation = pf.correlationInfo;
  else {
    const repair = prepared.psd.repair;
    const label = storedCorrelation(prepared).basis;
    correlation = {
      spec: method.covariance === "garch-ccc" ? { kind: "ccc" } : null,
      label,
      statement:
        method.covariance === "garch-ccc"
          ? "Correlation: constant correlation of the GARCH(1,1)-standardised returns over the whole sample."
          : `Covariance: one ${method.covariance === "ewma" ? `EWMA covariance of the factor returns (λ = ${method.lambda}, zero mean, started from the equal-weight covariance of the first ${Math.min(method.startupDays, L)} days)` : `equal-weight covariance of the factor returns over the last ${Math.min(method.covarianceWindow, L)} days (zero mean)`}; each factor's volatility and the correlations come from the same matrix.`,
      check: prepared.psd.check.status,
      repair: repair ? { method: repair.method, frobeniusDistance: repair.frobeniusChange, iterations: 0, negativeEigenvaluesBefore: repair.negativeEigenvalues, minEigenvalueBefore: repair.minEigenvalueBefore } : null,
    };
  }
  const scalings = method.methods.map((m) => scalingFor(m));
  const horizonStatement =
    H === 1
      ? "One-day figures only: no horizon scaling."
      : term
        ? `${H}-day parametric figures: each factor's own variance forecast summed over the ${H} days (GARCH(1,1) and ARCH forecasts revert towards their long-run level; EWMA and moving-average forecasts are flat), combined with the correlation; historical figures use square-root-of-time.`
        : method.scaling === "overlap"
          ? `${H}-day figures: overlapping ${H}-day P&L sums for historical simulation; square-root-of-time (√${H} × one-day) for parametric VaR.`
          : `${H}-day figures: square-root-of-time, √${H} × the one-day figure.`;
  let backtest: ResolvedModel["backtest"];
  if (pf) {
    const d = describeRefit(method.backtestRefit);
    const corrNote =
      pf.correlationSpec.kind === "ccc"
        ? method.backtestRefit.mode === "rolling" ? " The constant correlation is re-estimated at each refit from that fit's standardised residuals." : " The constant correlation is the whole-sample estimate."
        : " The correlation on each day uses the returns up to the day before.";
    backtest = { refit: method.backtestRefit, statement: d.statement + corrNote, limitation: d.limitation };
  } else if (method.covariance === "garch-ccc") {
    backtest = { refit: { mode: "full-sample" }, ...describeRefit({ mode: "full-sample" }) };
  } else {
    backtest = { refit: method.backtestRefit, statement: `Backtest and VaR history: out of sample. The ${method.covariance === "ewma" ? `EWMA recursion (λ = ${method.lambda}, fixed)` : "equal-weight window"} uses only data up to the day before; nothing is estimated from the tested days.`, limitation: null };
  }
  const corrSentence = correlation.statement + (correlation.repair ? ` It was not positive semi-definite and was replaced by the nearest correlation matrix (Higham 2002), a Frobenius distance of ${correlation.repair.frobeniusDistance.toExponential(3)}.` : "");
  const statements = [pf || method.covariance === "garch-ccc" ? volatilitySentence(factors) : corrSentence, ...(pf || method.covariance === "garch-ccc" ? [corrSentence] : []), horizonStatement, backtest.statement];
  return {
    covariance: pf ? "per-factor" : method.covariance,
    factors,
    correlation,
    horizon: { days: H, rule: term ? "term" : "sqrt", scaling: scalings, statement: horizonStatement },
    backtest,
    statements,
  };
}

/** Limitations that follow from the resolved model (per-factor processes, correlation, refit rule). */
function modelLimitations(model: ResolvedModel, prepared: PreparedRun): string[] {
  if (!prepared.perFactor) return [];
  const out: string[] = [];
  const seen = new Set<string>();
  for (const f of model.factors) {
    for (const l of f.limitations) {
      const key = `${f.process}: ${l}`;
      if (seen.has(key)) continue;
      seen.add(key);
      out.push(`${specLabel(f.spec)}: ${l}`);
    }
  }
  const c = prepared.perFactor.correlationSpec;
  if (c.kind === "ccc") out.push("Constant correlation: the correlation between factors is one number for the sample; correlations that rise in a crisis are not modelled.");
  else if (c.kind === "ewma") out.push(`EWMA correlation: λ = ${c.lambda} is chosen, not estimated; it reacts to recent co-movements and forgets older ones.`);
  else out.push(`Equal-weight correlation over ${c.window} days: a joint large move counts fully for ${c.window} days and then drops out abruptly.`);
  if (model.backtest.limitation) out.push(model.backtest.limitation);
  return out;
}

function describeLimitations(method: PreparedRun["method"], scalingFor: Scaler, L: number, W: number, H: number): string[] {
  const limitations = [
    "Every position is treated linearly through its exposure (its delta-equivalent where given): option convexity (gamma) and volatility (vega) risk are not captured.",
    "Factor returns are applied to exposures as P&L = exposure × return; for log returns this is a first-order approximation.",
    "Static book: the VaR history, backtest and stressed VaR apply today's positions to past days (hypothetical P&L); trading during the period is not reflected.",
    "Exchange-rate risk is taken on each foreign position's market value; cross effects between price and exchange-rate moves are second order and left out.",
  ];
  if (method.methods.includes("parametric")) limitations.push(method.distribution === "normal" ? "Parametric VaR assumes normally distributed P&L and understates extreme losses when returns have fat tails." : `Parametric VaR assumes Student-t P&L with ν = ${method.nu}; skew is not captured.`);
  if (method.methods.some((m) => m !== "parametric")) limitations.push(`Historical simulation sees only the ${W} days of its window; at 99 % only about ${(W * 0.01).toFixed(1)} observations lie beyond the VaR.`);
  if (method.methods.some((m) => scalingFor(m) === "sqrt") && H > 1) limitations.push(`${H}-day figures use square-root-of-time where stated: ${SQRT_STATEMENT}.`);
  if (method.volatility) return limitations; // the per-factor processes' own limitations follow from the resolved model
  if (method.covariance === "garch-ccc") limitations.push("GARCH-CCC: the correlation is constant; correlations that rise in a crisis are not modelled. GARCH parameters are fitted once on the whole sample and reused for the past days' forecasts, so the backtest is in-sample for those parameters.");
  if (method.covariance === "ewma") limitations.push(`EWMA: λ = ${method.lambda} is chosen, not estimated; the forecast is flat over the horizon (no mean reversion).`);
  if (method.covariance === "equal") limitations.push(`Equal weights over ${Math.min(method.covarianceWindow, L)} days: a large return moves VaR for exactly that long and then drops out abruptly.`);

  return limitations;
}

function describeChoices(method: PreparedRun["method"], scalingFor: Scaler, L: number, W: number, H: number, confidences: number[]): MonthEndResult["choices"] {
  if (method.volatility) {
    const c = method.correlation as CorrelationSpec;
    return {
      methods: method.methods,
      covariance: `D·R·D: each factor's volatility from its own process (as the method assigns by factor, asset class or default), correlation ${describeCorrelation(c, L).label}`,
      filteringVolatility: method.methods.includes("filtered") ? "each factor's own process" : "not used",
      historicalWindowDays: method.methods.some((m) => m !== "parametric") ? W : "not used",
      quantileConvention: method.methods.some((m) => m !== "parametric") ? HISTORICAL_QUANTILE_CONVENTION : "not used",
      confidences,
      horizonDays: H,
      scaling: method.methods.map((m) => `${m}: ${describeScaling(scalingFor(m), H, true)}`),
      distribution: method.distribution === "t" ? `Student-t, ν = ${method.nu}, scaled to unit variance` : "normal",
      backtestRefit: method.backtestRefit.mode === "rolling" ? `every ${method.backtestRefit.everyDays} business days, out of sample` : "fitted once on the whole sample (in-sample)",
      exposureRule: "exposure to the price factor = delta-equivalent exposure where given, otherwise market value; foreign positions add their market value as exposure to the exchange-rate factor",
    };
  }
  return {
    methods: method.methods,
    covariance: method.covariance === "garch-ccc" ? "GARCH(1,1) per factor (zero mean, normal, sample start-up; EWMA fallback), constant correlation of standardised residuals" : method.covariance === "ewma" ? `EWMA, λ = ${method.lambda}, zero mean, started from the equal-weight covariance of the first ${Math.min(method.startupDays, L)} days` : `equal weights over the last ${Math.min(method.covarianceWindow, L)} days, zero mean`,
    filteringVolatility: method.methods.includes("filtered") ? (method.covariance === "garch-ccc" ? "GARCH(1,1) per factor" : `EWMA λ = ${method.lambda} per factor`) : "not used",
    historicalWindowDays: method.methods.some((m) => m !== "parametric") ? W : "not used",
    quantileConvention: method.methods.some((m) => m !== "parametric") ? HISTORICAL_QUANTILE_CONVENTION : "not used",
    confidences,
    horizonDays: H,
    scaling: method.methods.map((m) => `${m}: ${describeScaling(scalingFor(m), H)}`),
    distribution: method.distribution === "t" ? `Student-t, ν = ${method.nu}, scaled to unit variance` : "normal",
    exposureRule: "exposure to the price factor = delta-equivalent exposure where given, otherwise market value; foreign positions add their market value as exposure to the exchange-rate factor",
  };
}
