import { describe, expect, it } from "vitest";
import { quantile, quantileSorted } from "simple-statistics";
import { historicalTail, historicalVar, lossQuantile, lossQuantileAndEs } from "@/lib/risk/var/historical";

// Convention: VaR is the R type-7 (linear interpolation, h = (n−1)·p) quantile of the losses −P&L.
// Oracle: simple-statistics 7.12 quantile / quantileSorted, which implements "type=7 in R/numpy"
// (its source, src/quantile_sorted.js, says so).
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296);
}

describe("historical-simulation quantiles against simple-statistics (type 7)", () => {
  const rand = lcg(7);
  for (const n of [250, 500, 37, 2]) {
    const pnl = Array.from({ length: n }, () => (rand() - 0.5) * 1000 + (rand() < 0.05 ? -3000 * rand() : 0));
    const losses = pnl.map((x) => -x);
    for (const confidence of [0.99, 0.975, 0.95, 0.5]) {
      it(`n = ${n}, confidence ${confidence}`, () => {
        const oracle = quantile(losses, confidence);
        expect(historicalVar(pnl, confidence)).toBeCloseTo(oracle, 9);
        expect(lossQuantile(pnl, 0, n, confidence)).toBeCloseTo(oracle, 9);
        expect(lossQuantileAndEs(pnl, 0, n, confidence).var).toBeCloseTo(oracle, 9);
        expect(quantileSorted([...losses].sort((a, b) => a - b), confidence)).toBeCloseTo(oracle, 12);
      });
    }
  }

  it("ES is the fractional tail mean: 250 days at 99 % = (L₍₂₅₀₎ + L₍₂₄₉₎ + 0.5·L₍₂₄₈₎)/2.5 (worked by hand)", () => {
    const pnl = Array.from({ length: 250 }, (_, i) => -(i + 1)); // losses 1..250
    const tail = historicalTail(pnl, 0.99);
    expect(tail.es).toBeCloseTo((250 + 249 + 0.5 * 248) / 2.5, 12);
    expect(lossQuantileAndEs(pnl, 0, 250, 0.99).es).toBeCloseTo(tail.es, 12);
    // type 7: h = 249 × 0.99 = 246.51 → L = 247 + 0.51 × (248 − 247)
    expect(tail.var).toBeCloseTo(247.51, 10);
  });

  it("refuses a confidence outside (0, 1)", () => {
    expect(() => historicalVar([1, 2, 3], 1)).toThrow("historicalTail requires 0 < confidence < 1");
  });
});
