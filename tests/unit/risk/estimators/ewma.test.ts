import { describe, expect, it } from "vitest";
import { ewmaVariance, fitEwma, garch11Variance, mulberry32, normalSampler } from "@/lib/risk";
import { ewmaLogLikelihood } from "@/lib/risk/estimators/ewma";

const d = normalSampler(mulberry32(17));
const u: number[] = [];
{ let h = 1e-4; for (let t = 0; t < 1500; t++) { const e = Math.sqrt(h) * d(); u.push(e); h = 0.96 * h + 0.04 * e * e; } }

describe("ewmaVariance", () => {
  it("matches the style guide example", () => {
    expect(ewmaVariance([0.01, -0.02, 0.015], 0.94, 1e-4).currentVariance).toBeCloseTo(1.2442e-4, 12);
  });
  it("is the GARCH kernel with ω = 0 (identity)", () => {
    const a = ewmaVariance(u, 0.94, 2e-4).variance, b = garch11Variance(u, { omega: 0, alpha: 0.06, beta: 0.94 }, 2e-4).variance;
    for (let t = 0; t < u.length; t++) expect(a[t]).toBeCloseTo(b[t], 18);
  });
  it("matches a plain loop", () => {
    let h = 2e-4;
    const fast = ewmaVariance(u, 0.9, 2e-4).variance;
    for (let t = 0; t < u.length; t++) { expect(fast[t]).toBeCloseTo(h, 16); h = 0.9 * h + 0.1 * u[t] ** 2; }
  });
  it("refuses λ outside (0, 1)", () => {
    expect(() => ewmaVariance(u, 1, 1e-4)).toThrow(RangeError);
    expect(() => ewmaVariance(u, 0, 1e-4)).toThrow("ewmaVariance requires 0 < lambda < 1");
  });
});

describe("fitEwma", () => {
  it("fixes λ = 0.94 by default, reports half-life and effective days, flat forecast", () => {
    const fit = fitEwma(u);
    expect(fit.params.lambda).toBe(0.94);
    expect(fit.diagnostics.halfLifeDays).toBeCloseTo(Math.log(0.5) / Math.log(0.94), 12);
    expect(fit.diagnostics.effectiveDays).toBeCloseTo(1 / 0.06, 12);
    expect(fit.longRunVariance).toBeNull();
    expect(fit.initialization).toMatch(/^sample/);
  });
  it("fits λ by maximum likelihood near the simulated 0.96, at a zero derivative", () => {
    const fit = fitEwma(u, { lambda: "fit" });
    expect(fit.params.lambda).toBeGreaterThan(0.93);
    expect(fit.params.lambda).toBeLessThan(0.985);
    const h1 = fit.variance[0];
    expect(Math.abs(ewmaLogLikelihood(u, fit.params.lambda, h1).derivative)).toBeLessThan(1e-3);
    expect(fit.logLikelihood!).toBeGreaterThanOrEqual(ewmaLogLikelihood(u, 0.94, h1).logLikelihood);
    expect(fit.standardErrors!.lambda).toBeGreaterThan(0);
  });
  it("the derivative of the likelihood in λ matches central differences", () => {
    const a = ewmaLogLikelihood(u, 0.95, 1e-4).derivative;
    const n = (ewmaLogLikelihood(u, 0.95 + 1e-7, 1e-4).logLikelihood - ewmaLogLikelihood(u, 0.95 - 1e-7, 1e-4).logLikelihood) / 2e-7;
    expect(a).toBeCloseTo(n, 1);
    expect(Math.abs(a - n) / Math.abs(n)).toBeLessThan(1e-5);
  });
  it("start-up rules are named and change the first variance", () => {
    expect(fitEwma(u, { init: { firstReturns: 20 } }).variance[0]).toBeCloseTo(u.slice(0, 20).reduce((s, x) => s + x * x, 0) / 20, 18);
    expect(fitEwma(u, { init: 3e-4 }).variance[0]).toBe(3e-4);
    expect(fitEwma(u, { init: "backcast" }).initialization).toMatch(/^backcast/);
  });
  it("warns when the history is shorter than the start-up weight needs", () => {
    expect(fitEwma(u.slice(0, 50)).warnings.map((w) => w.code)).toContain("short-history");
  });
});
