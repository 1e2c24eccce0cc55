import { describe, expect, it } from "vitest";
import { annualisedVolatilityTermStructure, archForecast, averageVariance, flatForecast, garchTermStructure } from "@/lib/risk";

describe("forecasts", () => {
  const p = { omega: 0.000002, alpha: 0.13, beta: 0.86, currentVariance: 0.0003 };
  it("term structure, average variance and annualised volatility agree with a plain loop", () => {
    const f = garchTermStructure(p, 30);
    const vl = p.omega / (1 - p.alpha - p.beta);
    let sum = 0;
    for (let t = 1; t <= 30; t++) {
      const e = vl + (p.alpha + p.beta) ** (t - 1) * (p.currentVariance - vl);
      expect(f[t - 1]).toBeCloseTo(e, 15);
      sum += e;
      expect(annualisedVolatilityTermStructure(f, 252)[t - 1]).toBeCloseTo(Math.sqrt((252 * sum) / t), 12);
    }
    expect(averageVariance(f)).toBeCloseTo(sum / 30, 15);
    expect(annualisedVolatilityTermStructure(f, 250)[0]).toBeCloseTo(Math.sqrt(250 * p.currentVariance), 12);
  });
  it("flat forecasts are flat, ARCH(1) forecasts are the GARCH one with β = 0", () => {
    expect(Array.from(flatForecast(2, 3))).toEqual([2, 2, 2]);
    const a = archForecast(0.1, [0.5], [4], 5);
    const g = garchTermStructure({ omega: 0.1, alpha: 0.5, beta: 0, currentVariance: 0.1 + 0.5 * 4 }, 5);
    for (let t = 0; t < 5; t++) expect(a[t]).toBeCloseTo(g[t], 15);
  });
  it("refuses a bad horizon or year length", () => {
    expect(() => garchTermStructure(p, 0)).toThrow(RangeError);
    expect(() => annualisedVolatilityTermStructure([1], 365 as 252)).toThrow(RangeError);
  });
});
