/**
 * The registry of volatility processes: one implementation of VolatilityProcess per estimator family (moving
 * average, EWMA, ARCH(m), GARCH(1,1)). The command line, compareEstimators, the factor report and the portfolio
 * all fit, filter and forecast through here; no other file switches on the estimator kind.
 */
import { fitMovingAverage, movingAverageVariance } from "../estimators/moving-average";
import { EWMA_FIT_MIN_RETURNS, fitEwma } from "../estimators/ewma";
import { ARCH_MAX_ORDER, fitArch } from "../estimators/arch";
import { GARCH_MIN_RETURNS, fitGarch11 } from "../estimators/garch11";
import { backcastValue, backcastWeights, checkInit, describeInit, type InitRule } from "../estimators/initial-variance";
import { archForecast } from "../forecast-kernels";
import type { VolatilityFit } from "../types";
import type { FitOptions, ProcessFit, VolatilityKind, VolatilityProcess, VolatilitySpec } from "./types";

type MaSpec = Extract<VolatilitySpec, { kind: "ma" }>;
type EwmaSpec = Extract<VolatilitySpec, { kind: "ewma" }>;
type ArchSpec = Extract<VolatilitySpec, { kind: "arch" }>;
type GarchSpec = Extract<VolatilitySpec, { kind: "garch" }>;

const fmt = (x: number, digits = 4): string => (Number.isFinite(x) ? String(Number(x.toFixed(digits))) : String(x));

function finiteReturns(returns: ArrayLike<number>, name: string): void {
  for (let i = 0; i < returns.length; i++) if (!Number.isFinite(returns[i])) throw new Error(`${name} requires finite returns: return ${i} is ${returns[i]}`);
}

/** Backcast B over returns[0..end) at mean mu. */
function backcastOf(returns: ArrayLike<number>, rule: Exclude<InitRule, number | "unconditional">, end: number, mu = 0): number {
  return backcastValue(returns, backcastWeights(rule, end)!, mu);
}

function baseFit(spec: VolatilitySpec, used: VolatilitySpec, fit: VolatilityFit, init: InitRule | null, label: string, parameterNames: string[]): ProcessFit {
  const fallback = fit.fallbackFrom ? { from: fit.fallbackFrom.kind, reason: fit.fallbackFrom.reason, label: specLabel(spec, fit.fallbackFrom.params) } : null;
  return {
    spec,
    process: fit.kind,
    used,
    label,
    params: { ...fit.params },
    parameterNames,
    init,
    startUp: fit.initialization,
    variance: fit.variance,
    nextVariance: fit.currentVariance,
    fallback,
    fit,
  };
}

const flat = (v: number, h: number): Float64Array => new Float64Array(h).fill(v);

const maProcess: VolatilityProcess<MaSpec> = {
  kind: "ma",
  resolve: (spec) => ({ kind: "ma", window: spec.window, divisor: spec.divisor ?? "m", mean: spec.mean ?? "zero" }),
  label: (spec) => `Moving average, ${spec.window} days, ${(spec.mean ?? "zero") === "zero" ? "zero mean" : "sample mean"}, divisor ${(spec.divisor ?? "m") === "m" ? "M" : "M−1"}`,
  parameterNames: () => ["window"],
  minimumReturns: (spec) => spec.window,
  fit(returns, spec) {
    const s = maProcess.resolve(spec);
    const fit = fitMovingAverage(returns, { window: s.window, divisor: s.divisor, mean: s.mean });
    return baseFit(s, s, fit, null, maProcess.label(s), ["window"]);
  },
  filter(returns, spec, _params, _initEnd, buffer) {
    const s = maProcess.resolve(spec);
    const path = movingAverageVariance(returns, { window: s.window, divisor: s.divisor!, mean: s.mean! });
    const out = buffer ?? new Float64Array(returns.length + 1);
    out.set(path.variance);
    out[returns.length] = path.currentVariance;
    return out;
  },
  forecast: (fit, h) => flat(fit.nextVariance, h),
  forecastFrom: (_spec, _params, next, _recent, h) => flat(next, h),
  limitations: (fit) => [...fit.fit.limitations],
};

const ewmaProcess: VolatilityProcess<EwmaSpec> = {
  kind: "ewma",
  resolve: (spec) => ({ kind: "ewma", lambda: spec.lambda, fit: spec.fit ?? false, init: spec.init ?? "sample" }),
  label: (spec, params) =>
    spec.fit
      ? `EWMA, λ fitted${params?.lambda !== undefined ? ` = ${fmt(params.lambda)}` : ""} (starting value ${spec.lambda}), zero mean`
      : `EWMA, λ = ${spec.lambda}, zero mean`,
  parameterNames: () => ["lambda"],
  minimumReturns: (spec) => (spec.fit ? EWMA_FIT_MIN_RETURNS : 2),
  fit(returns, spec, options = {}) {
    const s = ewmaProcess.resolve(spec);
    const warm = options.warmStart?.lambda;
    const start = s.fit && warm !== undefined && warm > 0 && warm < 1 ? warm : s.lambda;
    const fit = fitEwma(returns, { lambda: s.fit ? "fit" : s.lambda, init: s.init, ...(s.fit ? { start } : {}) });
    return baseFit(s, s, fit, s.init!, ewmaProcess.label(s, fit.params), ["lambda"]);
  },
  filter(returns, spec, params, initEnd = returns.length, buffer) {
    const s = ewmaProcess.resolve(spec);
    const lambda = params.lambda ?? s.lambda;
    const init = s.init!;
    let h = typeof init === "number" ? init : backcastOf(returns, init, initEnd);
    const n = returns.length;
    const out = buffer ?? new Float64Array(n + 1);
    const a = 1 - lambda;
    for (let t = 0; t < n; t++) {
      out[t] = h;
      const u = returns[t];
      h = 0 + a * u * u + lambda * h;
    }
    out[n] = h;
    return out;
  },
  forecast: (fit, h) => flat(fit.nextVariance, h),
  forecastFrom: (_spec, _params, next, _recent, h) => flat(next, h),
  limitations: (fit) => [...fit.fit.limitations],
};

const archAlphas = (params: Record<string, number>, m: number): number[] => Array.from({ length: m }, (_, i) => params[`alpha${i + 1}`]);

const archProcess: VolatilityProcess<ArchSpec> = {
  kind: "arch",
  resolve: (spec) => ({ kind: "arch", order: spec.order, init: spec.init ?? "sample" }),
  label: (spec) => `ARCH(${spec.order}), normal errors, zero mean`,
  parameterNames: (spec) => ["omega", ...Array.from({ length: spec.order }, (_, i) => `alpha${i + 1}`)],
  minimumReturns: (spec) => 100 + 10 * spec.order,
  fit(returns, spec, options = {}) {
    const s = archProcess.resolve(spec);
    if (!(Number.isInteger(s.order) && s.order >= 1 && s.order <= ARCH_MAX_ORDER)) throw new RangeError(`ARCH order must be a whole number from 1 to ${ARCH_MAX_ORDER}`);
    const fit = fitArch(returns, { order: s.order, init: s.init, warmStart: options.warmStart });
    return baseFit(s, s, fit, s.init as InitRule, archProcess.label(s), archProcess.parameterNames(s));
  },
  filter(returns, spec, params, initEnd = returns.length, buffer) {
    const s = archProcess.resolve(spec);
    const m = s.order;
    const alphas = archAlphas(params, m);
    const b = backcastOf(returns, s.init as Exclude<InitRule, number | "unconditional">, initEnd);
    const n = returns.length;
    const out = buffer ?? new Float64Array(n + 1);
    for (let t = 0; t <= n; t++) {
      let h = params.omega;
      for (let i = 0; i < m; i++) { const j = t - 1 - i; const u2 = j >= 0 ? returns[j] * returns[j] : b; h += alphas[i] * u2; }
      out[t] = h;
    }
    return out;
  },
  forecast: (fit, h) => archForecast(fit.params.omega, archAlphas(fit.params, (fit.spec as ArchSpec).order), fit.fit.recentSquaredResiduals ?? [], h),
  forecastFrom: (spec, params, _next, recent, h) => archForecast(params.omega, archAlphas(params, spec.order), Array.from(recent), h),
  limitations: (fit) => [...fit.fit.limitations],
};

const garchProcess: VolatilityProcess<GarchSpec> = {
  kind: "garch",
  resolve: (spec) => ({
    kind: "garch",
    distribution: spec.distribution ?? "normal",
    mean: spec.mean ?? "zero",
    targeting: spec.targeting ?? false,
    fallback: spec.fallback ?? "none",
    ...((spec.fallback ?? "none") === "ewma" ? { fallbackLambda: spec.fallbackLambda ?? 0.94 } : {}),
    init: spec.init ?? "sample",
  }),
  label: (spec, params) => {
    const s = garchProcess.resolve(spec);
    const parts = [
      "GARCH(1,1)",
      s.distribution === "t" ? `Student-t errors${params?.nu !== undefined ? ` (ν = ${fmt(params.nu, 2)})` : ""}` : "normal errors",
      s.mean === "fit" ? "fitted constant mean" : "zero mean",
    ];
    if (s.targeting) parts.push("variance targeting");
    if (s.fallback === "ewma") parts.push(`EWMA fallback (λ = ${s.fallbackLambda})`);
    return parts.join(", ");
  },
  parameterNames: (spec) => {
    const s = garchProcess.resolve(spec);
    return [...(s.mean === "fit" ? ["mu"] : []), "omega", "alpha", "beta", ...(s.distribution === "t" ? ["nu"] : [])];
  },
  minimumReturns: () => GARCH_MIN_RETURNS,
  fit(returns, spec, options = {}) {
    const s = garchProcess.resolve(spec);
    const fit = fitGarch11(returns, {
      mean: s.mean,
      distribution: s.distribution,
      targeting: s.targeting,
      init: s.init,
      fallback: s.fallback,
      ...(s.fallback === "ewma" ? { fallbackLambda: s.fallbackLambda } : {}),
      warmStart: options.warmStart && options.warmStart.alpha !== undefined ? options.warmStart : undefined,
      warmInverseHessian: options.warmStart && options.warmStart.alpha !== undefined ? options.warmInverseHessian : undefined,
      lean: options.lean,
    });
    if (fit.kind === "ewma") {
      const used: EwmaSpec = { kind: "ewma", lambda: fit.params.lambda, fit: false, init: (s.init === "unconditional" ? "sample" : s.init) as EwmaSpec["init"] };
      const out = baseFit(s, used, fit, used.init!, `${ewmaProcess.label(used)} (fallback from ${garchProcess.label(s)})`, ["lambda"]);
      return out;
    }
    return baseFit(s, s, fit, s.init!, garchProcess.label(s, fit.params), garchProcess.parameterNames(s));
  },
  filter(returns, spec, params, initEnd = returns.length, buffer) {
    const s = garchProcess.resolve(spec);
    const { omega, alpha, beta } = params;
    const mu = params.mu ?? 0;
    const persistence = alpha + beta;
    const init = s.init!;
    let h: number;
    if (typeof init === "number") h = init;
    else if (init === "unconditional") h = omega / (1 - persistence);
    else h = omega + persistence * backcastOf(returns, init, initEnd, mu);
    const n = returns.length;
    const out = buffer ?? new Float64Array(n + 1);
    for (let t = 0; t < n; t++) {
      out[t] = h;
      const u = returns[t] - mu;
      h = omega + alpha * u * u + beta * h;
    }
    out[n] = h;
    return out;
  },
  forecast: (fit, h) => garchProcess.forecastFrom(fit.spec as GarchSpec, fit.params, fit.nextVariance, [], h),
  forecastFrom: (_spec, params, next, _recent, h) => {
    const out = new Float64Array(h);
    const p = params.alpha + params.beta;
    let e = next;
    for (let t = 0; t < h; t++) { out[t] = e; e = params.omega + p * e; }
    return out;
  },
  limitations: (fit) => [...fit.fit.limitations],
};

const REGISTRY: { [K in VolatilityKind]: VolatilityProcess<Extract<VolatilitySpec, { kind: K }>> } = {
  ma: maProcess,
  ewma: ewmaProcess,
  arch: archProcess,
  garch: garchProcess,
};

/** Every registered kind, in the order reports list them. */
export const VOLATILITY_KINDS: readonly VolatilityKind[] = ["ma", "ewma", "arch", "garch"];

/** The process of a kind. @throws {RangeError} on an unknown kind */
export function volatilityProcess<K extends VolatilityKind>(kind: K): VolatilityProcess<Extract<VolatilitySpec, { kind: K }>> {
  const p = REGISTRY[kind];
  if (!p) throw new RangeError(`unknown volatility process "${String(kind)}" (one of ${VOLATILITY_KINDS.join(", ")})`);
  return p as VolatilityProcess<Extract<VolatilitySpec, { kind: K }>>;
}

// the registry entries take their own spec type; their methods are bivariant, so any one serves a spec of its kind
const anyProcess = (spec: VolatilitySpec): VolatilityProcess<VolatilitySpec> => volatilityProcess(spec.kind);

/**
 * Check a spec is well formed, naming the setting. @throws {RangeError}
 */
export function checkSpec(spec: VolatilitySpec): void {
  if (!spec || typeof spec !== "object") throw new RangeError("a volatility process is required");
  switch (spec.kind) {
    case "ma":
      if (!(Number.isInteger(spec.window) && spec.window >= 2)) throw new RangeError(`moving average: the window must be a whole number of at least 2 days, not ${spec.window}`);
      if (spec.divisor !== undefined && spec.divisor !== "m" && spec.divisor !== "m-1") throw new RangeError('moving average: divisor "m" or "m-1"');
      if (spec.mean !== undefined && spec.mean !== "zero" && spec.mean !== "sample") throw new RangeError('moving average: mean "zero" or "sample"');
      return;
    case "ewma":
      if (!(spec.lambda > 0 && spec.lambda < 1)) throw new RangeError(`EWMA: λ must be between 0 and 1, not ${spec.lambda}`);
      if (spec.init !== undefined) checkInit(spec.init, "EWMA");
      if ((spec.init as InitRule) === "unconditional") throw new RangeError("EWMA has no unconditional variance to start from");
      return;
    case "arch":
      if (!(Number.isInteger(spec.order) && spec.order >= 1 && spec.order <= ARCH_MAX_ORDER)) throw new RangeError(`ARCH: the order must be a whole number from 1 to ${ARCH_MAX_ORDER}, not ${spec.order}`);
      if (spec.init !== undefined) checkInit(spec.init, "ARCH");
      return;
    case "garch":
      if (spec.distribution !== undefined && spec.distribution !== "normal" && spec.distribution !== "t") throw new RangeError('GARCH(1,1): distribution "normal" or "t"');
      if (spec.mean !== undefined && spec.mean !== "zero" && spec.mean !== "fit") throw new RangeError('GARCH(1,1): mean "zero" or "fit"');
      if (spec.fallback !== undefined && spec.fallback !== "ewma" && spec.fallback !== "none") throw new RangeError('GARCH(1,1): fallback "ewma" or "none"');
      if (spec.fallbackLambda !== undefined && !(spec.fallbackLambda > 0 && spec.fallbackLambda < 1)) throw new RangeError("GARCH(1,1): the fallback λ must be between 0 and 1");
      if (spec.init !== undefined) checkInit(spec.init, "GARCH(1,1)");
      return;
    default:
      throw new RangeError(`unknown volatility process "${(spec as { kind: string }).kind}" (one of ${VOLATILITY_KINDS.join(", ")})`);
  }
}

/** The spec with every default filled in. */
export function resolveSpec(spec: VolatilitySpec): VolatilitySpec {
  checkSpec(spec);
  return anyProcess(spec).resolve(spec);
}

/** Plain-English label of a spec, with fitted parameters where given. */
export function specLabel(spec: VolatilitySpec, params?: Record<string, number>): string {
  return anyProcess(spec).label(anyProcess(spec).resolve(spec), params);
}

/** The start-up rule of a spec, stated (the moving average has none). */
export function specStartUp(spec: VolatilitySpec): string {
  const s = resolveSpec(spec);
  if (s.kind === "ma") return `none: the first value is for day ${s.window + 1}, after a full window of ${s.window} returns`;
  return describeInit(s.init as InitRule);
}

/** Fewest returns the spec needs (the window for a moving average, 100 + 10·m for ARCH(m), 100 for GARCH, 50 for fitted EWMA). */
export function minimumReturns(spec: VolatilitySpec): number {
  const s = resolveSpec(spec);
  return anyProcess(s).minimumReturns(s);
}

/** Parameter names of a spec, in the order reports list them. */
export function parameterNames(spec: VolatilitySpec): string[] {
  const s = resolveSpec(spec);
  return anyProcess(s).parameterNames(s);
}

/** Fit a spec on returns (oldest first). @throws {Error} with the engine's reason when the fit is impossible */
export function fitProcess(returns: ArrayLike<number>, spec: VolatilitySpec, options: FitOptions = {}): ProcessFit {
  const s = resolveSpec(spec);
  finiteReturns(returns, specLabel(s));
  return anyProcess(s).fit(returns, s, options);
}

/**
 * The variance path of a fitted process over returns (which may extend past the fit's own data) with its
 * parameters held fixed and its start-up from returns[0..initEnd): out[t] is the variance of returns[t] given
 * the returns before it, out[n] the forecast for the day after the last.
 */
export function filterFit(fit: Pick<ProcessFit, "used" | "params">, returns: ArrayLike<number>, initEnd = returns.length, out?: Float64Array): Float64Array {
  if (out && out.length !== returns.length + 1) throw new RangeError("filterFit requires an output of one more value than the returns");
  return anyProcess(fit.used).filter(returns, fit.used, fit.params, initEnd, out);
}

/** True when the spec estimates parameters from the data (false for the moving average and a fixed λ). */
export function estimatesParameters(spec: VolatilitySpec): boolean {
  return !(spec.kind === "ma" || (spec.kind === "ewma" && !spec.fit));
}

/** Daily variance forecasts for days 1..h after the fit's data (term structure; flat for ma and ewma). */
export function forecastFit(fit: ProcessFit, horizonDays: number): Float64Array {
  if (!(Number.isInteger(horizonDays) && horizonDays >= 1)) throw new RangeError("forecast requires an integer horizon of at least 1 day");
  if (fit.used.kind !== fit.spec.kind) return anyProcess(fit.used).forecastFrom(fit.used, fit.params, fit.nextVariance, [], horizonDays);
  return anyProcess(fit.spec).forecast(fit, horizonDays);
}

/**
 * The sum of the daily variance forecasts over h days from a state: next-day variance, and the returns up to
 * that day (ARCH needs the last m squared ones).
 */
export function horizonVariance(fit: Pick<ProcessFit, "used" | "params">, nextVariance: number, returns: ArrayLike<number>, end: number, horizonDays: number): number {
  if (horizonDays === 1) return nextVariance;
  const used = fit.used;
  let recent: number[] = [];
  if (used.kind === "arch") {
    recent = [];
    for (let i = 0; i < used.order; i++) { const j = end - 1 - i; recent.push(j >= 0 ? returns[j] * returns[j] : nextVariance); }
  }
  const path = anyProcess(used).forecastFrom(used, fit.params, nextVariance, recent, horizonDays);
  let s = 0;
  for (let i = 0; i < path.length; i++) s += path[i];
  return s;
}

/** Limitations of the family and of this fit. */
export function processLimitations(fit: ProcessFit): string[] {
  const out = anyProcess(fit.spec).limitations(fit);
  if (fit.fallback) out.push(`The chosen ${fit.fallback.label} ${fit.fallback.reason === "near-integrated" ? "was near-integrated" : "did not converge"} on this history; ${fit.label} produced the figures instead.`);
  return out;
}

/** True when the process's forecast reverts over the horizon (ARCH and GARCH); flat for ma and ewma. */
export function hasTermStructure(spec: VolatilitySpec): boolean {
  return spec.kind === "arch" || spec.kind === "garch";
}

/**
 * The spec a bare VolatilityFit answers (its family and fitted parameters), so a caller holding only a fit can
 * forecast through the registry.
 */
export function specOfFit(fit: VolatilityFit): VolatilitySpec {
  switch (fit.kind) {
    case "ma":
      return { kind: "ma", window: fit.params.window };
    case "ewma":
      return { kind: "ewma", lambda: fit.params.lambda };
    case "arch":
      return { kind: "arch", order: Object.keys(fit.params).filter((key) => /^alpha\d+$/.test(key)).length };
    case "garch":
      return { kind: "garch", ...(fit.params.mu !== undefined ? { mean: "fit" as const } : {}), ...(fit.params.nu !== undefined ? { distribution: "t" as const } : {}) };
  }
}

/** Daily variance forecasts for days 1..h from a bare VolatilityFit (GARCH and ARCH revert, MA and EWMA are flat). */
export function forecastOfFit(fit: VolatilityFit, horizonDays: number): Float64Array {
  if (!(Number.isInteger(horizonDays) && horizonDays >= 1)) throw new RangeError("forecast requires an integer horizon of at least 1 day");
  const spec = specOfFit(fit);
  return anyProcess(spec).forecastFrom(spec, fit.params, fit.currentVariance, fit.recentSquaredResiduals ?? [], horizonDays);
}
