import { describe, expect, it } from "vitest";
import { gammaln } from "simple-statistics";
import {
  lnGamma, normalCdf, normalQuantile, regularizedBeta, regularizedGammaP, regularizedGammaQ, studentTCdf, studentTQuantile,
} from "@/lib/risk/var/distributions";
import { esMultiplier, parametricVar, varMultiplier } from "@/lib/risk/var/parametric";

describe("special functions", () => {
  it("lnGamma at exact values: Γ(n) = (n−1)!, Γ(1/2) = √π (facts)", () => {
    expect(lnGamma(1)).toBeCloseTo(0, 14);
    expect(lnGamma(5)).toBeCloseTo(Math.log(24), 13);
    expect(lnGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 14);
    expect(lnGamma(20)).toBeCloseTo(Math.log(121645100408832000), 11);
  });

  it("lnGamma agrees with simple-statistics' gammaln (an independent implementation)", () => {
    for (const x of [0.3, 1.7, 3.2, 12.5, 50]) expect(lnGamma(x)).toBeCloseTo(gammaln(x), 8);
  });

  it("P + Q = 1 and P(1, x) = 1 − e^(−x) (facts)", () => {
    for (const [a, x] of [[0.5, 0.2], [1, 3], [3, 2], [10, 15]]) {
      expect(regularizedGammaP(a, x) + regularizedGammaQ(a, x)).toBeCloseTo(1, 14);
    }
    expect(regularizedGammaP(1, 2)).toBeCloseTo(1 - Math.exp(-2), 14);
  });

  it("normal cdf: symmetric, Φ(0) = 1/2, far tail Φ(−8) ≈ 6.22e−16 (from memory)", () => {
    expect(normalCdf(0)).toBeCloseTo(0.5, 15);
    for (const x of [0.3, 1.1, 2.5, 4]) expect(normalCdf(x) + normalCdf(-x)).toBeCloseTo(1, 14);
    expect(normalCdf(-8) / 6.22096057427178e-16).toBeCloseTo(1, 6);
  });

  it("normal quantile inverts the cdf across the range, tails included", () => {
    for (const p of [1e-10, 1e-4, 0.01, 0.02425, 0.3, 0.5, 0.77, 0.975, 0.999, 1 - 1e-9]) {
      const x = normalQuantile(p);
      const back = p < 0.5 ? normalCdf(x) : 1 - normalCdf(x);
      expect(back / (p < 0.5 ? p : 1 - p)).toBeCloseTo(1, 9);
    }
    expect(() => normalQuantile(1)).toThrow("normalQuantile requires 0 < p < 1");
  });

  it("regularised beta: I_x(1, 1) = x, I_x(a, b) = 1 − I_{1−x}(b, a) (facts)", () => {
    expect(regularizedBeta(0.3, 1, 1)).toBeCloseTo(0.3, 14);
    expect(regularizedBeta(0.3, 2.5, 4) + regularizedBeta(0.7, 4, 2.5)).toBeCloseTo(1, 14);
  });

  it("Student t: t with 1 degree of freedom is Cauchy; quantiles from the printed t table (from memory)", () => {
    expect(studentTCdf(1, 1)).toBeCloseTo(0.75, 14); // Cauchy: 1/2 + atan(1)/π
    expect(studentTQuantile(0.975, 10)).toBeCloseTo(2.228139, 5); // from memory
    expect(studentTQuantile(0.99, 5)).toBeCloseTo(3.36493, 4); // from memory
    expect(studentTQuantile(0.01, 5)).toBeCloseTo(-studentTQuantile(0.99, 5), 12);
    expect(studentTCdf(studentTQuantile(0.995, 4), 4)).toBeCloseTo(0.995, 12);
  });

  it("Student-t VaR tends to the normal as ν grows, and has fatter 99 % tails for small ν (unit variance)", () => {
    expect(varMultiplier(0.99, { distribution: "t", nu: 1e6 })).toBeCloseTo(varMultiplier(0.99), 4);
    expect(esMultiplier(0.99, { distribution: "t", nu: 1e6 })).toBeCloseTo(esMultiplier(0.99), 4);
    expect(varMultiplier(0.99, { distribution: "t", nu: 4 })).toBeGreaterThan(varMultiplier(0.99) * 0.99);
    expect(esMultiplier(0.99, { distribution: "t", nu: 4 })).toBeGreaterThan(esMultiplier(0.99));
    expect(() => parametricVar(1, 0.99, { distribution: "t", nu: 2 })).toThrow(/nu > 2/);
    expect(() => parametricVar(1, 1.5)).toThrow("parametricVar requires 0 < confidence < 1");
  });
});
