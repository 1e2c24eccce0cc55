import type { VariancePath } from "./garch11-variance";

/** ARCH(m) parameters: σ²ₜ = ω + Σᵢ αᵢ·u²ₜ₋ᵢ. */
export interface ArchParams {
  omega: number;
  /** α₁..α_m (α₁ weighs yesterday's squared residual) */
  alphas: readonly number[];
}

/**
 * ARCH(m) conditional variance; squared residuals before the first return are the backcast value.
 * @param backcast the pre-sample squared residual, chosen and stated by the caller
 * @throws {RangeError} on a negative parameter or a non-positive backcast
 */
export function archVariance(returns: ArrayLike<number>, params: ArchParams, backcast: number): VariancePath {
  const { omega, alphas } = params;
  const m = alphas.length;
  if (!(omega >= 0) || alphas.some((a) => !(a >= 0))) throw new RangeError("archVariance requires non-negative omega and alphas");
  if (!(backcast > 0)) throw new RangeError("archVariance requires a positive backcast");
  const n = returns.length;
  const variance = new Float64Array(n);
  const at = (t: number): number => {
    let h = omega;
    for (let i = 0; i < m; i++) { const j = t - 1 - i; const u2 = j >= 0 ? returns[j] * returns[j] : backcast; h += alphas[i] * u2; }
    return h;
  };
  for (let t = 0; t < n; t++) variance[t] = at(t);
  return { variance, currentVariance: at(n) };
}
