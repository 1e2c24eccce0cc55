import { describe, expect, it } from "vitest";
import { fitMovingAverage, movingAverageVariance, mulberry32, normalSampler, weightedVariance } from "@/lib/risk";

const d = normalSampler(mulberry32(23));
const u = Array.from({ length: 3000 }, () => 0.01 * d() + 0.0005);

/** Plain loop: the window's variance written from the definition. */
function plain(t: number, m: number, divisor: "m" | "m-1", mean: "zero" | "sample"): number {
  const w = u.slice(t - m, t);
  const avg = mean === "zero" ? 0 : w.reduce((s, x) => s + x, 0) / m;
  return w.reduce((s, x) => s + (x - avg) ** 2, 0) / (divisor === "m" ? m : m - 1);
}

describe("movingAverageVariance", () => {
  for (const divisor of ["m", "m-1"] as const) for (const mean of ["zero", "sample"] as const) {
    it(`matches the plain loop (divisor ${divisor}, mean ${mean}) everywhere, including after re-summing`, () => {
      const m = 20;
      const fast = movingAverageVariance(u, { window: m, divisor, mean });
      expect(Number.isNaN(fast.variance[m - 1])).toBe(true);
      for (let t = m; t < u.length; t += 7) expect(fast.variance[t]).toBeCloseTo(plain(t, m, divisor, mean), 15);
      expect(fast.currentVariance).toBeCloseTo(plain(u.length, m, divisor, mean), 15);
    });
  }
  it("jumps when a large return leaves the window (the documented limitation)", () => {
    const x = Array(60).fill(0.01);
    x[10] = 0.1;
    const v = movingAverageVariance(x, { window: 20, divisor: "m", mean: "zero" }).variance;
    expect(v[30] - v[31]).toBeCloseTo((0.1 ** 2 - 0.01 ** 2) / 20, 15);
  });
  it("is the weighted form with equal weights", () => {
    const a = movingAverageVariance(u, { window: 10, divisor: "m", mean: "zero" });
    const b = weightedVariance(u, { gamma: 0, longRunVariance: 0, weights: Array(10).fill(0.1) });
    expect(a.currentVariance).toBeCloseTo(b.currentVariance, 16);
  });
  it("refuses a bad window", () => {
    expect(() => movingAverageVariance(u.slice(0, 5), { window: 10, divisor: "m", mean: "zero" })).toThrow("movingAverageVariance requires at least 10 returns");
    expect(() => movingAverageVariance(u, { window: 1, divisor: "m", mean: "zero" })).toThrow(RangeError);
    expect(() => weightedVariance(u, { gamma: 0.5, longRunVariance: 1, weights: [0.4] })).toThrow(/sum to one/);
  });
  it("fitMovingAverage states its window, no likelihood, and its limitations", () => {
    const fit = fitMovingAverage(u, { window: 250, divisor: "m-1", mean: "sample" });
    expect(fit.kind).toBe("ma");
    expect(fit.params.window).toBe(250);
    expect(fit.logLikelihood).toBeNull();
    expect(fit.limitations.join(" ")).toMatch(/leaves/);
  });
});
