import { describe, expect, it } from "vitest";
import { minimizeBfgs, minimizeMultiStart } from "@/lib/risk";

const rosenbrock = (x: Float64Array, g: Float64Array): number => {
  const [a, b] = x;
  g[0] = -2 * (1 - a) - 400 * a * (b - a * a);
  g[1] = 200 * (b - a * a);
  return (1 - a) ** 2 + 100 * (b - a * a) ** 2;
};

describe("minimizeBfgs", () => {
  it("minimises the Rosenbrock function from the classic start", () => {
    const r = minimizeBfgs(rosenbrock, [-1.2, 1], { gradientTolerance: 1e-10 });
    expect(r.converged).toBe(true);
    expect(r.x[0]).toBeCloseTo(1, 8);
    expect(r.x[1]).toBeCloseTo(1, 8);
  });
  it("finds a badly scaled quadratic's minimum and its inverse Hessian", () => {
    const f = (x: Float64Array, g: Float64Array) => { g[0] = 2 * (x[0] - 3); g[1] = 2000 * (x[1] + 1); return (x[0] - 3) ** 2 + 1000 * (x[1] + 1) ** 2; };
    const r = minimizeBfgs(f, [0, 0], { gradientTolerance: 1e-10 });
    expect(r.x[0]).toBeCloseTo(3, 9);
    expect(r.x[1]).toBeCloseTo(-1, 9);
    expect(r.inverseHessian[3]).toBeCloseTo(1 / 2000, 6);
  });
  it("with the exact inverse Hessian as its start, takes one Newton step on a quadratic", () => {
    const f = (x: Float64Array, g: Float64Array) => { g[0] = 2 * (x[0] - 3); g[1] = 2000 * (x[1] + 1); return (x[0] - 3) ** 2 + 1000 * (x[1] + 1) ** 2; };
    const r = minimizeBfgs(f, [0, 0], { initialInverseHessian: Float64Array.from([0.5, 0, 0, 0.0005]) });
    expect(r.x[0]).toBeCloseTo(3, 12);
    expect(r.x[1]).toBeCloseTo(-1, 12);
    expect(r.iterations).toBeLessThanOrEqual(2);
  });
  it("treats a non-finite value as outside the domain and backs off", () => {
    const f = (x: Float64Array, g: Float64Array) => { if (x[0] <= 0) return NaN; g[0] = 1 - 1 / x[0]; return x[0] - Math.log(x[0]); };
    const r = minimizeBfgs(f, [5]);
    expect(r.x[0]).toBeCloseTo(1, 6);
  });
  it("refuses a start outside the domain", () => {
    expect(() => minimizeBfgs(() => NaN, [0])).toThrow(RangeError);
  });
  it("multi-start keeps the best of several local minima", () => {
    // two wells: a shallow one at x = −1 and the deeper one at x = 2
    const f = (x: Float64Array, g: Float64Array) => { const v = (x[0] + 1) ** 2 * (x[0] - 2) ** 2 - x[0]; g[0] = 2 * (x[0] + 1) * (x[0] - 2) ** 2 + 2 * (x[0] + 1) ** 2 * (x[0] - 2) - 1; return v; };
    const r = minimizeMultiStart(f, [[-1.2], [2.5]], { runs: 2 });
    expect(r.x[0]).toBeGreaterThan(1.9);
    expect(r.runs).toBe(2);
  });
});
