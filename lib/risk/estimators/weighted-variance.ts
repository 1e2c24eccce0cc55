import type { VariancePath } from "./garch11-variance";

/** The general weighted form σ²ₙ = γ·V_L + Σᵢ αᵢ·u²ₙ₋ᵢ, with γ + Σαᵢ = 1. */
export interface WeightedFormParams {
  /** weight γ of the long-run variance */
  gamma: number;
  /** long-run variance V_L (ignored when γ = 0) */
  longRunVariance: number;
  /** weights α₁..α_m of u²ₙ₋₁..u²ₙ₋ₘ (newest first) */
  weights: readonly number[];
}

/**
 * Variance by the general weighted form σ²ₙ = γ·V_L + Σᵢ αᵢ·u²ₙ₋ᵢ (NaN until m returns are available).
 * @throws {RangeError} if a weight is negative or the weights do not sum to one
 */
export function weightedVariance(returns: ArrayLike<number>, params: WeightedFormParams): VariancePath {
  const { gamma, longRunVariance, weights } = params;
  const m = weights.length;
  if (m < 1) throw new RangeError("weightedVariance requires at least one weight");
  let sum = gamma;
  for (const w of weights) { if (!(w >= 0)) throw new RangeError("weightedVariance requires non-negative weights"); sum += w; }
  if (!(gamma >= 0)) throw new RangeError("weightedVariance requires a non-negative gamma");
  if (Math.abs(sum - 1) > 1e-9) throw new RangeError(`weightedVariance requires gamma and the weights to sum to one (they sum to ${sum})`);
  if (returns.length < m) throw new RangeError(`weightedVariance requires at least ${m} returns`);
  const omega = gamma > 0 ? gamma * longRunVariance : 0;
  const n = returns.length;
  const variance = new Float64Array(n);
  const at = (t: number): number => {
    let h = omega;
    for (let i = 0; i < m; i++) { const u = returns[t - 1 - i]; h += weights[i] * u * u; }
    return h;
  };
  for (let t = 0; t < n; t++) variance[t] = t < m ? NaN : at(t);
  return { variance, currentVariance: at(n) };
}
