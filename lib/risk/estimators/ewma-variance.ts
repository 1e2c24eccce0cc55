import { garch11Variance, type VariancePath } from "./garch11-variance";

/**
 * EWMA variance, σ²ₙ = λσ²ₙ₋₁ + (1−λ)u²ₙ₋₁: GARCH(1,1) with ω = 0, α = 1−λ, β = λ.
 * @param returns daily returns as decimals, oldest first
 * @param lambda smoothing constant in (0, 1)
 * @param initialVariance σ² of the first return, chosen and stated by the caller
 * @throws {RangeError} if lambda is outside (0, 1)
 * @example ewmaVariance([0.01, -0.02, 0.015], 0.94, 1e-4).currentVariance; // ≈ 1.2442e-4
 */
export function ewmaVariance(returns: ArrayLike<number>, lambda: number, initialVariance: number): VariancePath {
  if (!(lambda > 0 && lambda < 1)) throw new RangeError("ewmaVariance requires 0 < lambda < 1");
  return garch11Variance(returns, { omega: 0, alpha: 1 - lambda, beta: lambda }, initialVariance);
}
