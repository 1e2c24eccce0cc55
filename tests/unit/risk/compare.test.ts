import { describe, expect, it } from "vitest";
import { compareEstimators, ewmaVariance, fitEwma, mulberry32, normalSampler, simulateGarch11 } from "@/lib/risk";

const x = Array.from(simulateGarch11(normalSampler(mulberry32(77)), { omega: 0.01, alpha: 0.12, beta: 0.86 }, 3000));

describe("compareEstimators", () => {
  const result = compareEstimators(x, { estimationDays: 2000, evaluationDays: 1000 });

  it("scores EWMA 0.94 exactly as a plain loop over the evaluation window does", () => {
    const est = x.slice(0, 2000);
    const h = ewmaVariance(x, 0.94, fitEwma(est).variance[0]).variance;
    let q = 0, se = 0, exc = 0;
    for (let t = 2000; t < 3000; t++) { q += Math.log(h[t]) + x[t] ** 2 / h[t]; se += (x[t] ** 2 - h[t]) ** 2; if (x[t] < -2.326348 * Math.sqrt(h[t])) exc++; }
    const row = result.ranking.find((r) => r.id === "ewma-0.94")!;
    expect(row.qlike).toBeCloseTo(q / 1000, 12);
    expect(row.mse).toBeCloseTo(se / 1000, 12);
    expect(row.varExceptions).toBe(exc);
  });

  it("ranks GARCH first on a GARCH series, and says so in one sentence", () => {
    expect(result.ranking[0].id).toMatch(/^garch/);
    expect(result.reading.split(". ").length).toBe(1);
    expect(result.expectedExceptions).toBe(10);
    expect(result.failed).toEqual([]);
  });

  it("refuses windows the data cannot hold", () => {
    expect(() => compareEstimators(x.slice(0, 200), { estimationDays: 150, evaluationDays: 100 })).toThrow(/at least 250 returns/);
    expect(() => compareEstimators(x, { estimationDays: 50, evaluationDays: 100 })).toThrow(RangeError);
  });
});
