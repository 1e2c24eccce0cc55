/** GARCH(1,1) parameters: σ²ₙ = ω + α·u²ₙ₋₁ + β·σ²ₙ₋₁. */
export interface Garch11Params {
  omega: number;
  alpha: number;
  beta: number;
}

/** A conditional variance path and the forecast for the day after the last return. */
export interface VariancePath {
  /** variance[t] is the variance of returns[t] given the returns before t */
  variance: Float64Array;
  /** the variance forecast for the day after the last return */
  currentVariance: number;
}

/**
 * The GARCH(1,1) recursion σ²ₜ = ω + α·u²ₜ₋₁ + β·σ²ₜ₋₁, the one kernel EWMA and GARCH share.
 * @param returns residuals uₜ (returns less any mean), oldest first
 * @param initialVariance σ² of the first return, chosen and stated by the caller
 * @throws {RangeError} if ω, α or β is negative or the initial variance is not positive
 * @example garch11Variance([0.01, -0.02, 0.015], { omega: 0, alpha: 0.06, beta: 0.94 }, 1e-4).currentVariance; // ≈ 1.2442e-4
 */
export function garch11Variance(returns: ArrayLike<number>, params: Garch11Params, initialVariance: number): VariancePath {
  const { omega, alpha, beta } = params;
  if (!(omega >= 0 && alpha >= 0 && beta >= 0)) throw new RangeError("garch11Variance requires omega, alpha and beta to be non-negative");
  if (!(initialVariance > 0 && Number.isFinite(initialVariance))) throw new RangeError("garch11Variance requires a positive initial variance");
  const n = returns.length;
  const variance = new Float64Array(n);
  let h = initialVariance;
  for (let t = 0; t < n; t++) {
    variance[t] = h;
    const u = returns[t];
    h = omega + alpha * u * u + beta * h;
  }
  return { variance, currentVariance: h };
}
