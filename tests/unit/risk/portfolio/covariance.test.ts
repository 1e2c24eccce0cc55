import { describe, expect, it } from "vitest";
import { equalWeightCovariance, ewmaCovariance, standardisedCorrelation } from "@/lib/risk/portfolio/covariance";
import { checkPsd, repairPsd } from "@/lib/risk/portfolio/psd";
import { matrixFromRows, quadraticForm } from "@/lib/risk/portfolio/matrix";

function lcg(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296);
}
const rand = lcg(42);
const series = Array.from({ length: 4 }, () => Float64Array.from({ length: 120 }, () => (rand() - 0.5) * 0.04));

describe("covariance", () => {
  it("equal weights, zero mean: Σᵢⱼ = mean of rᵢrⱼ (plain loop)", () => {
    const c = equalWeightCovariance(series, { start: 20, end: 120 });
    let s = 0;
    for (let t = 20; t < 120; t++) s += series[1][t] * series[3][t];
    expect(c.values[1 * 4 + 3]).toBeCloseTo(s / 100, 15);
    expect(c.values[3 * 4 + 1]).toBe(c.values[1 * 4 + 3]);
  });

  it("equal weights, sample mean: divisor n − 1", () => {
    const c = equalWeightCovariance(series, { mean: "sample" });
    const m0 = series[0].reduce((a, b) => a + b, 0) / 120;
    let s = 0;
    for (const x of series[0]) s += (x - m0) ** 2;
    expect(c.values[0]).toBeCloseTo(s / 119, 15);
  });

  it("EWMA covariance matches the plain recursion Σₙ = λΣₙ₋₁ + (1−λ)rₙ₋₁rₙ₋₁ᵀ", () => {
    const lambda = 0.94;
    const start = equalWeightCovariance(series, { start: 0, end: 30 });
    const loop = Float64Array.from(start.values);
    for (let t = 0; t < 120; t++) {
      for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) loop[i * 4 + j] = lambda * loop[i * 4 + j] + (1 - lambda) * series[i][t] * series[j][t];
    }
    const fast = ewmaCovariance(series, lambda, { startupDays: 30 });
    for (let k = 0; k < 16; k++) expect(fast.values[k]).toBeCloseTo(loop[k], 15);
    expect(() => ewmaCovariance(series, 1)).toThrow("ewmaCovariance requires 0 < lambda < 1");
  });

  it("standardised correlation has a unit diagonal and is PSD", () => {
    const variances = series.map((s) => Float64Array.from(s, () => 1e-4));
    const r = standardisedCorrelation(series, variances);
    for (let i = 0; i < 4; i++) expect(r.values[i * 5]).toBe(1);
    expect(checkPsd(r).status).toBe("positive-definite");
  });
});

describe("positive semi-definiteness", () => {
  it("finds a singular PSD matrix (more factors than days) semi-definite, not indefinite", () => {
    const few = Array.from({ length: 6 }, () => Float64Array.from({ length: 4 }, () => rand() - 0.5));
    const c = equalWeightCovariance(few);
    const check = checkPsd(c);
    expect(check.status).toBe("positive-semidefinite");
    expect(check.zeroPivots).toBe(2);
  });

  it("finds an inconsistent correlation matrix indefinite and repairs it, saying by how much", () => {
    // ρ12 = 0.9, ρ13 = 0.9, ρ23 = −0.9 cannot hold together
    const bad = matrixFromRows([[1, 0.9, 0.9], [0.9, 1, -0.9], [0.9, -0.9, 1]]);
    expect(checkPsd(bad).status).toBe("indefinite");
    const fix = repairPsd(bad, { keepUnitDiagonal: true });
    expect(fix.repaired).toBe(true);
    expect(fix.negativeEigenvalues).toBe(1);
    expect(fix.minEigenvalueBefore).toBeCloseTo(1 - 1.8, 10); // eigenvalues 1.9, 1.9, −0.8 (worked by hand)
    expect(fix.frobeniusChange).toBeGreaterThan(0);
    expect(checkPsd(fix.matrix).status).not.toBe("indefinite");
    for (let i = 0; i < 3; i++) expect(fix.matrix.values[i * 4]).toBeCloseTo(1, 12);
    for (const x of [[1, 1, 1], [1, -2, 0.5], [0, 1, -1]]) expect(quadraticForm(fix.matrix, x)).toBeGreaterThanOrEqual(-1e-12);
  });

  it("nearest PSD without rescaling: the change equals the size of the clipped eigenvalue", () => {
    const bad = matrixFromRows([[1, 0.9, 0.9], [0.9, 1, -0.9], [0.9, -0.9, 1]]);
    const fix = repairPsd(bad);
    expect(fix.frobeniusChange).toBeCloseTo(0.8, 10); // ‖λ_min v vᵀ‖_F = |λ_min|
  });

  it("leaves a PSD matrix unchanged", () => {
    const good = matrixFromRows([[2, 0.5], [0.5, 1]]);
    const fix = repairPsd(good);
    expect(fix.repaired).toBe(false);
    expect(fix.frobeniusChange).toBe(0);
  });
});
