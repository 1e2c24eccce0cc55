/**
 * From one day to h days: square-root-of-time, the GARCH(1,1) variance term structure, or overlapping
 * h-day sums of daily P&L for historical simulation. The choice is stated in every output.
 */
import type { Garch11Params } from "../estimators/garch11-variance";

export type HorizonScaling = "sqrt" | "term" | "overlap";

/** Plain-words statement of a scaling choice. */
export function describeScaling(scaling: HorizonScaling, horizonDays: number, perFactor = false): string {
  if (horizonDays === 1) return "one-day figures, no scaling";
  if (scaling === "sqrt") return `square-root-of-time: ${horizonDays}-day = √${horizonDays} × one-day (assumes independent, identically distributed returns)`;
  if (scaling === "term" && perFactor) return `each factor's own variance term structure: ${horizonDays}-day variance = sum of its forecast daily variances for days 1..${horizonDays} (reverting for GARCH(1,1) and ARCH, flat for EWMA and the moving average), with the correlation`;
  if (scaling === "term") return `GARCH variance term structure: ${horizonDays}-day variance = sum of the forecast daily variances for days 1..${horizonDays}, per factor, with the constant correlation`;
  return `overlapping ${horizonDays}-day P&L: sums of ${horizonDays} consecutive daily P&L over the window (overlapping scenarios are not independent)`;
}

/**
 * Square-root-of-time scaling of a one-day figure.
 * @example sqrtTimeScale(1, 10); // 3.1622776601683795
 */
export function sqrtTimeScale(oneDay: number, horizonDays: number): number {
  if (!(horizonDays >= 1)) throw new RangeError("sqrtTimeScale requires horizonDays >= 1");
  return oneDay * Math.sqrt(horizonDays);
}

/**
 * Sum of the GARCH(1,1) variance forecasts for days 1..h: Σ E[σ²ₙ₊ₜ], E[σ²ₙ₊ₜ] = V_L + (α+β)ᵗ⁻¹(σ²ₙ₊₁ − V_L).
 * @param nextVariance σ²ₙ₊₁, the forecast for the first day
 */
export function garchHorizonVariance(nextVariance: number, params: Garch11Params, horizonDays: number): number {
  if (!(Number.isInteger(horizonDays) && horizonDays >= 1)) throw new RangeError("garchHorizonVariance requires a whole number of days >= 1");
  const persistence = params.alpha + params.beta;
  let e = nextVariance;
  let sum = 0;
  for (let t = 0; t < horizonDays; t++) {
    sum += e;
    e = params.omega + persistence * e;
  }
  return sum;
}

/**
 * Overlapping h-day sums of a daily series over [start, end): out[k] = x[start+k] + … + x[start+k+h−1].
 * @throws {RangeError} if the window is shorter than h
 */
export function overlappingSums(series: ArrayLike<number>, horizonDays: number, start = 0, end = series.length): Float64Array {
  const n = end - start - horizonDays + 1;
  if (!(horizonDays >= 1) || n < 1) throw new RangeError("overlappingSums requires a window of at least horizonDays values");
  const out = new Float64Array(n);
  let s = 0;
  for (let i = 0; i < horizonDays; i++) s += series[start + i];
  out[0] = s;
  for (let k = 1; k < n; k++) {
    s += series[start + k + horizonDays - 1] - series[start + k - 1];
    out[k] = s;
  }
  return out;
}
