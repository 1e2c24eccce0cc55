import { describe, expect, it } from "vitest";
import { matrixFromRows } from "@/lib/risk/portfolio/matrix";
import { eulerDecomposition } from "@/lib/risk/portfolio/decomposition";
import { parametricVar } from "@/lib/risk/var/parametric";

describe("two-asset parametric VaR", () => {
  // Worked by hand from the textbook formula σ²ₚ = w₁²σ₁² + w₂²σ₂² + 2ρw₁w₂σ₁σ₂:
  // w₁ = 1,000,000 at σ₁ = 2 % a day, w₂ = 500,000 at σ₂ = 1 % a day, ρ = 0.3
  // σ²ₚ = 20,000² + 5,000² + 2·0.3·20,000·5,000 = 4.0e8 + 2.5e7 + 6.0e7 = 4.85e8, σₚ = 22,022.7155
  // 99 % one-day VaR = 2.326348 × 22,022.7155 = 51,232.50 (z = Φ⁻¹(0.99) from standard normal tables)
  const cov = matrixFromRows([
    [0.02 * 0.02, 0.3 * 0.02 * 0.01],
    [0.3 * 0.02 * 0.01, 0.01 * 0.01],
  ]);

  it("long–long: σₚ = 22,022.72, VaR = 51,232.50", () => {
    const d = eulerDecomposition([1_000_000, 500_000], cov, 0.99);
    expect(d.sigma).toBeCloseTo(22022.71554554524, 6);
    expect(d.var).toBeCloseTo(51232.5, 0);
    expect(d.var).toBeCloseTo(parametricVar(22022.71554554524, 0.99), 8);
  });

  it("long–short: the cross term changes sign, σₚ = √(4.0e8 + 2.5e7 − 6.0e7) = 19,104.97", () => {
    const d = eulerDecomposition([1_000_000, -500_000], cov, 0.99);
    expect(d.sigma).toBeCloseTo(19104.9731745428, 6);
  });
});
