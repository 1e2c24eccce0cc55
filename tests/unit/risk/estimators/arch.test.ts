import { describe, expect, it } from "vitest";
import { archVariance, fitArch, forecastVariance, mulberry32, normalSampler } from "@/lib/risk";
import { archLogLikelihood } from "@/lib/risk/estimators/arch";

const d = normalSampler(mulberry32(31));
function simulateArch(omega: number, alphas: number[], n: number): number[] {
  const e: number[] = [];
  for (let t = 0; t < n + 200; t++) {
    let h = omega;
    alphas.forEach((a, i) => { h += a * (t - 1 - i >= 0 ? e[t - 1 - i] ** 2 : omega / (1 - alphas.reduce((s, v) => s + v, 0))); });
    e.push(Math.sqrt(h) * d());
  }
  return e.slice(200);
}
const x = simulateArch(0.2, [0.3, 0.2], 5000);

describe("ARCH(m)", () => {
  it("the kernel and the likelihood match a plain loop", () => {
    const alphas = [0.2, 0.1, 0.05];
    const b = 0.5;
    const fast = archVariance(x, { omega: 0.3, alphas }, b);
    let ll = 0;
    for (let t = 0; t < x.length; t++) {
      let h = 0.3;
      for (let i = 1; i <= 3; i++) h += alphas[i - 1] * (t - i >= 0 ? x[t - i] ** 2 : b);
      expect(fast.variance[t]).toBeCloseTo(h, 14);
      ll += -0.5 * (Math.log(2 * Math.PI) + Math.log(h) + x[t] ** 2 / h);
    }
    expect(archLogLikelihood(x, [0.3, ...alphas], b)).toBeCloseTo(ll, 8);
  });
  it("recovers simulated ARCH(2) parameters and zeroes the extra lags of an ARCH(4) fit", () => {
    const fit = fitArch(x, { order: 2 });
    expect(fit.params.alpha1).toBeGreaterThan(0.25);
    expect(fit.params.alpha1).toBeLessThan(0.36);
    expect(fit.params.alpha2).toBeGreaterThan(0.15);
    expect(fit.params.alpha2).toBeLessThan(0.26);
    const four = fitArch(x, { order: 4 });
    expect(four.params.alpha4).toBeLessThan(0.05);
    expect(four.logLikelihood!).toBeGreaterThanOrEqual(fit.logLikelihood! - 1e-6);
  });
  it("fits every order from 1 to 10, nested likelihoods never fall, and its forecast reverts towards ω/(1−Σα)", () => {
    let previous = -Infinity;
    for (let m = 1; m <= 10; m++) {
      const fit = fitArch(x.slice(0, 1500), { order: m });
      expect(fit.diagnostics.converged, `order ${m}`).toBe(true);
      // nested models: one more lag can never lower the maximised likelihood
      expect(fit.logLikelihood!, `order ${m}`).toBeGreaterThanOrEqual(previous - 1e-6);
      previous = fit.logLikelihood!;
      const f = forecastVariance(fit, 400);
      expect(f[399]).toBeCloseTo(fit.longRunVariance!, 6);
    }
  });
  it("refuses impossible orders", () => {
    expect(() => fitArch(x, { order: 0 })).toThrow(RangeError);
    expect(() => fitArch(x.slice(0, 120), { order: 5 })).toThrow("fitArch requires at least 150 returns for order 5");
  });
});
