import type { VariancePath } from "./garch11-variance";

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
