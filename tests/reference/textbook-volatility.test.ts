import { describe, expect, it } from "vitest";
import {
  ewmaVariance, fitEwma, garch11Variance, garchLongRunVariance, garchTermStructure, movingAverageVariance,
  weightedVariance, flatForecast, fitMovingAverage, forecastVariance, mulberry32, normalSampler,
} from "@/lib/risk";

describe("textbook worked examples (Hull, Risk Management and Financial Institutions; Options, Futures, and Other Derivatives)", () => {
  it("EWMA update: λ = 0.90, σ = 1 %, u = 2 % gives σ² = 0.00013, σ = 1.1402 %", () => {
    // Hull, Risk Management and Financial Institutions, volatility chapter: EWMA update example
    const v = ewmaVariance([0.02], 0.9, 0.01 ** 2).currentVariance;
    expect(v).toBeCloseTo(0.00013, 12);
    expect(Math.sqrt(v)).toBeCloseTo(0.011402, 6);
  });

  it("GARCH long-run level: ω = 0.000002, α = 0.13, β = 0.86 gives γ = 0.01, V_L = 0.0002, 1.4142 % a day", () => {
    // Hull, Risk Management and Financial Institutions, volatility chapter: GARCH(1,1) long-run variance example
    const p = { omega: 0.000002, alpha: 0.13, beta: 0.86 };
    expect(garchLongRunVariance(p)).toBeCloseTo(0.0002, 12);
    expect(p.omega / garchLongRunVariance(p)).toBeCloseTo(0.01, 12); // γ = ω / V_L
    expect(Math.sqrt(garchLongRunVariance(p))).toBeCloseTo(0.014142, 6);
  });

  it("GARCH update: same parameters, σ = 1.6 %, u = 1 % gives σ² = 0.00023516, σ = 1.53 %", () => {
    // Hull, Risk Management and Financial Institutions, volatility chapter: GARCH(1,1) update example
    const v = garch11Variance([0.01], { omega: 0.000002, alpha: 0.13, beta: 0.86 }, 0.016 ** 2).currentVariance;
    expect(v).toBeCloseTo(0.00023516, 12);
    expect(Math.sqrt(v)).toBeCloseTo(0.0153, 4);
  });

  it("GARCH on an equity index: α+β = 0.99351, V_L = 0.0002075, 1.4404 % a day", () => {
    // Hull, Options, Futures, and Other Derivatives, chapter on estimating volatilities: equity index example
    const p = { omega: 0.0000013465, alpha: 0.083394, beta: 0.910116 };
    expect(garchLongRunVariance(p)).toBeCloseTo(0.0002075, 7);
    // α+β read from the engine's forecast: each step moves the gap to V_L by the factor α+β
    const vl = garchLongRunVariance(p);
    const f = garchTermStructure({ ...p, currentVariance: 0.0004 }, 2);
    expect((f[1] - vl) / (f[0] - vl)).toBeCloseTo(0.99351, 5);
    expect(Math.sqrt(garchLongRunVariance(p))).toBeCloseTo(0.014404, 6);
  });
});

describe("EWMA data needs and half-life (J.P. Morgan/Reuters 1996)", () => {
  it("λ = 0.94 needs about 74 days for 1 % tolerance and has a half-life of about 11 days", () => {
    // J.P. Morgan/Reuters (1996), Technical Document, 4th edition: K = ln ε / ln λ
    const u = Array.from({ length: 300 }, (_, i) => 0.01 * Math.sin(i));
    const d = fitEwma(u, { lambda: 0.94 }).diagnostics;
    expect(Math.round(d.daysFor1PercentWeight as number)).toBe(74);
    expect(Math.round(d.halfLifeDays as number)).toBe(11);
  });
});

describe("identities any correct engine satisfies (facts of the trade)", () => {
  const draw = normalSampler(mulberry32(7));
  const u = Array.from({ length: 400 }, () => 0.01 * draw());

  it("the equal-weight moving average is the weighted form with γ = 0 and every αᵢ = 1/M", () => {
    const m = 25;
    const ma = movingAverageVariance(u, { window: m, divisor: "m", mean: "zero" });
    const wf = weightedVariance(u, { gamma: 0, longRunVariance: 0, weights: Array(m).fill(1 / m) });
    for (let t = m; t < u.length; t++) expect(ma.variance[t]).toBeCloseTo(wf.variance[t], 15);
    expect(ma.currentVariance).toBeCloseTo(wf.currentVariance, 15);
  });

  it("EWMA is GARCH(1,1) with ω = 0, α = 1−λ, β = λ", () => {
    const a = ewmaVariance(u, 0.94, 1e-4);
    const b = garch11Variance(u, { omega: 0, alpha: 0.06, beta: 0.94 }, 1e-4);
    for (let t = 0; t < u.length; t++) expect(a.variance[t]).toBeCloseTo(b.variance[t], 18);
    expect(a.currentVariance).toBeCloseTo(b.currentVariance, 18);
  });

  it("in EWMA each older squared return weighs λ times the next newer one", () => {
    const lambda = 0.94, base = ewmaVariance(u, lambda, 1e-4).currentVariance;
    // σ²ₙ is linear in each u²: bump one squared return and read its weight
    const weight = (lag: number): number => {
      const v = u.slice();
      const i = u.length - lag;
      v[i] = Math.sqrt(u[i] ** 2 + 1e-4);
      return (ewmaVariance(v, lambda, 1e-4).currentVariance - base) / 1e-4;
    };
    expect(weight(1)).toBeCloseTo(1 - lambda, 10);
    for (let lag = 1; lag < 20; lag++) expect(weight(lag + 1) / weight(lag)).toBeCloseTo(lambda, 8);
  });

  it("GARCH weights γ, α, β sum to one with ω = γ·V_L, and the forecast reverts towards V_L", () => {
    const p = { omega: 0.000002, alpha: 0.13, beta: 0.86 };
    const vl = garchLongRunVariance(p);
    const gamma = 1 - p.alpha - p.beta;
    expect(gamma * vl).toBeCloseTo(p.omega, 18);
    for (const start of [0.0001, 0.0004]) {
      const f = garchTermStructure({ ...p, currentVariance: start }, 2000);
      for (let t = 1; t < f.length; t++) expect(Math.abs(f[t] - vl)).toBeLessThanOrEqual(Math.abs(f[t - 1] - vl));
      expect(f[1999]).toBeCloseTo(vl, 12);
      // closed form E[σ²ₙ₊ₜ] = V_L + (α+β)ᵗ⁻¹(σ²ₙ₊₁ − V_L)
      for (const t of [1, 2, 10, 100]) expect(f[t - 1]).toBeCloseTo(vl + (p.alpha + p.beta) ** (t - 1) * (start - vl), 15);
    }
  });

  it("EWMA and the moving average forecast a flat line", () => {
    const e = fitEwma(u);
    expect(Array.from(forecastVariance(e, 5))).toEqual(Array.from(flatForecast(e.currentVariance, 5)));
    const m = fitMovingAverage(u, { window: 20 });
    expect(new Set(forecastVariance(m, 5)).size).toBe(1);
  });
});
