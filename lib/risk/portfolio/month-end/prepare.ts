/** Preparing a month-end run: the method's defaults, usable factors, exposures, the working sample, volatility and covariance. */
import type { EngineWarning } from "../../types";
import { defaultFxFactorId, positionsToExposures } from "../exposures";
import type { CorrelationSpec, VolatilityChoice } from "../../process/types";
import { neededReturns, resolveCorrelation, resolveFactorSpecs, type FactorSpec } from "../per-factor";
import { countOf, isAre, listSome } from "../../../text/count";
import { trailingRun } from "./kernels";
import { legacyCovariance, legacyVolatility } from "./prepare-legacy";
import { preparePerFactor } from "./prepare-per-factor";
import type { MonthEndInput, MonthEndMethod, PreparedRun, ProgressCallback, RunSample } from "./types";

/** The method with every default filled in, checked: a RangeError names the first impossible choice. */
export function withDefaults(m: MonthEndMethod = {}): PreparedRun["method"] {
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

/** The fewest days of returns a factor needs under the method (before any per-factor process asks for more). */
export function minimumDays(method: PreparedRun["method"]): number {
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
  const fxOf = input.fxFactorId ?? defaultFxFactorId;
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
  const sample: RunSample = { dates, factorIds: ex.factors, returns, exposures: ex.exposures, loadings: ex.loadings, positions: ex.positionIndex.map((j) => input.positions[j]) };
  const excludedPositions = ex.excluded.map((e) => ({ instrument: e.instrument, marketValue: e.marketValue, reason: e.reason }));
  onProgress?.("exposures", 1);

  if (method.volatility) return preparePerFactor({ ...sample, method, excludedFactors, excludedPositions, warnings, specs: ex.factors.map(factorSpec), onProgress });
  const volatility = legacyVolatility(method, ex.factors, returns, warnings, onProgress);
  const { covariance, correlation, psd } = legacyCovariance(method, returns, volatility, warnings, onProgress);
  return { ...sample, covariance, correlation, volatility, perFactor: null, psd, method, excludedFactors, excludedPositions, warnings };
}
