import type { VariancePath } from "./garch11-variance";
import { standardisedMoments, kurtosisWarning } from "../fit-diagnostics";
import { LIMITATIONS } from "../limitations";
import { ENGINE_VERSION } from "../version";
import type { EngineWarning, VolatilityFit } from "../types";

/** Options of the equal-weight moving average. */
export interface MovingAverageOptions {
  /** number of returns M in the window */
  window: number;
  /** divide by M or by M−1 */
  divisor: "m" | "m-1";
  /** zero mean (sum of squares) or the window's sample mean */
  mean: "zero" | "sample";
}

/**
 * Equal-weight moving-average variance over the last M returns: variance[t] uses returns t−M..t−1
 * (NaN for t < M); currentVariance uses the last M returns.
 * @throws {RangeError} if the window is not an integer of at least 2, or longer than the returns
 * @example movingAverageVariance([0.01, -0.02, 0.015], { window: 3, divisor: "m", mean: "zero" }).currentVariance; // ≈ 2.4167e-4
 */
export function movingAverageVariance(returns: ArrayLike<number>, options: MovingAverageOptions): VariancePath {
  const { window: m, divisor, mean } = options;
  const n = returns.length;
  if (!(Number.isInteger(m) && m >= 2)) throw new RangeError("movingAverageVariance requires an integer window of at least 2");
  if (n < m) throw new RangeError(`movingAverageVariance requires at least ${m} returns`);
  if (divisor !== "m" && divisor !== "m-1") throw new RangeError('movingAverageVariance requires divisor "m" or "m-1"');
  if (mean !== "zero" && mean !== "sample") throw new RangeError('movingAverageVariance requires mean "zero" or "sample"');
  const d = divisor === "m" ? m : m - 1;
  const variance = new Float64Array(n);
  let s1 = 0;
  let s2 = 0;
  for (let i = 0; i < m; i++) { const u = returns[i]; s1 += u; s2 += u * u; }
  const value = (): number => {
    const ss = mean === "zero" ? s2 : s2 - (s1 * s1) / m;
    return ss > 0 ? ss / d : 0;
  };
  for (let t = 0; t < m; t++) variance[t] = NaN;
  for (let t = m; t < n; t++) {
    variance[t] = value();
    const add = returns[t];
    const drop = returns[t - m];
    s1 += add - drop;
    s2 += add * add - drop * drop;
    // re-sum now and then so rounding from the running sums cannot build up
    if ((t - m) % 512 === 511) {
      s1 = 0; s2 = 0;
      for (let i = t - m + 1; i <= t; i++) { const u = returns[i]; s1 += u; s2 += u * u; }
    }
  }
  return { variance, currentVariance: value() };
}

/**
 * The equal-weight moving average as a VolatilityFit (flat forecast, no likelihood: nothing is estimated).
 * @throws {RangeError} as movingAverageVariance
 */
export function fitMovingAverage(returns: ArrayLike<number>, options: Partial<MovingAverageOptions> = {}): VolatilityFit {
  const opts: MovingAverageOptions = { window: options.window ?? 20, divisor: options.divisor ?? "m", mean: options.mean ?? "zero" };
  for (let i = 0; i < returns.length; i++) if (!Number.isFinite(returns[i])) throw new Error(`fitMovingAverage requires finite returns: return ${i} is ${returns[i]}`);
  const path = movingAverageVariance(returns, opts);
  const residuals = opts.mean === "zero" ? returns : Float64Array.from(returns as ArrayLike<number>, (u, t) => (t >= opts.window ? u - windowMean(returns, t, opts.window) : u));
  const moments = standardisedMoments(residuals, path.variance);
  const warnings: EngineWarning[] = [];
  const kurt = kurtosisWarning(moments.kurtosis, true);
  if (kurt) warnings.push(kurt);
  return {
    kind: "ma",
    params: { window: opts.window },
    variance: path.variance,
    currentVariance: path.currentVariance,
    longRunVariance: null,
    logLikelihood: null,
    initialization: `none: the first value is for day ${opts.window + 1}, after a full window of ${opts.window} returns`,
    diagnostics: { n: returns.length, window: opts.window, divisor: opts.divisor, mean: opts.mean, standardisedSkewness: moments.skewness, standardisedKurtosis: moments.kurtosis },
    warnings,
    limitations: [...LIMITATIONS.ma],
    engineVersion: ENGINE_VERSION,
  };
}

function windowMean(returns: ArrayLike<number>, t: number, m: number): number {
  let s = 0;
  for (let i = t - m; i < t; i++) s += returns[i];
  return s / m;
}
