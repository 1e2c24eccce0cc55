/**
 * Filtered historical simulation: each past return rescaled by the ratio of the current volatility to the
 * volatility of its own day, r̃ₜ = rₜ · σ_now / σₜ, so old scenarios carry today's level of risk.
 */

/**
 * Rescale returns by current over then-current volatility.
 * @param returns daily returns, oldest first
 * @param variance the conditional variance of each return (from an estimator, same length)
 * @param currentVariance the variance forecast for the day the scenarios are for
 * @throws {RangeError} on unequal lengths or a non-positive variance
 */
export function filterReturns(returns: ArrayLike<number>, variance: ArrayLike<number>, currentVariance: number): Float64Array {
  if (returns.length !== variance.length) throw new RangeError("filterReturns requires returns and variance of equal length");
  if (!(currentVariance > 0)) throw new RangeError("filterReturns requires a positive current variance");
  const out = new Float64Array(returns.length);
  const sNow = Math.sqrt(currentVariance);
  for (let t = 0; t < returns.length; t++) {
    if (!(variance[t] > 0)) throw new RangeError(`filterReturns requires positive variances (day ${t})`);
    out[t] = (returns[t] * sNow) / Math.sqrt(variance[t]);
  }
  return out;
}
