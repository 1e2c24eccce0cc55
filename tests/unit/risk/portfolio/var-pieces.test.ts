import { describe, expect, it } from "vitest";
import { searchStressWindow } from "@/lib/risk/var/stressed";
import { filterReturns } from "@/lib/risk/var/filtered";
import { garchHorizonVariance, overlappingSums } from "@/lib/risk/var/scaling";
import { lossQuantile } from "@/lib/risk/var/historical";
import { normalQuantile } from "@/lib/risk/var/distributions";
import { positionsToExposures } from "@/lib/risk/portfolio/exposures";

function lcg(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296);
}

describe("stressed-window search", () => {
  const rand = lcg(3);
  const pnl = Float64Array.from({ length: 400 }, (_, t) => (rand() - 0.5) * (t > 200 && t < 260 ? 5 : 1));

  it("parametric: the rolling sum matches a plain loop over every window, and the best is the maximum", () => {
    const r = searchStressWindow(pnl, 100, 0.99, "parametric");
    expect(r.windows).toBe(301);
    const z = normalQuantile(0.99);
    let best = -Infinity;
    for (let k = 0; k <= 300; k++) {
      let ss = 0;
      for (let t = k; t < k + 100; t++) ss += pnl[t] ** 2;
      const v = z * Math.sqrt(ss / 100);
      expect(r.curve[k]).toBeCloseTo(v, 10);
      best = Math.max(best, v);
    }
    expect(r.best.var).toBeCloseTo(best, 12);
    expect(r.best.start).toBeGreaterThan(100);
    expect(r.best.start).toBeLessThan(260);
  });

  it("historical: every window's type-7 loss quantile, the highest wins", () => {
    const r = searchStressWindow(pnl, 100, 0.99, "historical");
    expect(r.curve[17]).toBeCloseTo(lossQuantile(pnl, 17, 117, 0.99), 12);
    expect(r.best.var).toBe(Math.max(...r.curve));
  });

  it("refuses a series shorter than the window", () => {
    expect(() => searchStressWindow(pnl.subarray(0, 50), 100, 0.99, "historical")).toThrow(/at least 100 days/);
  });
});

describe("filtering and scaling", () => {
  it("filtered returns carry today's volatility: r·σ_now/σ_t", () => {
    expect(Array.from(filterReturns([0.02, -0.01], [4e-4, 1e-4], 1e-4))).toEqual([0.01, -0.01]);
    expect(() => filterReturns([0.01], [0], 1e-4)).toThrow(/positive variances/);
  });

  it("GARCH horizon variance: sum of V_L + (α+β)^(t−1)(σ²₁ − V_L) (the GARCH(1,1) variance forecast, a fact of the trade)", () => {
    const p = { omega: 0.000002, alpha: 0.13, beta: 0.86 }; // Hull, Risk Management and Financial Institutions, volatility chapter: V_L = 0.0002
    const next = 0.0003;
    let expected = 0;
    for (let t = 1; t <= 10; t++) expected += 0.0002 + Math.pow(0.99, t - 1) * (next - 0.0002);
    expect(garchHorizonVariance(next, p, 10)).toBeCloseTo(expected, 15);
    expect(garchHorizonVariance(0.0002, p, 10)).toBeCloseTo(0.002, 15); // at V_L the term structure is flat
  });

  it("overlapping sums", () => {
    expect(Array.from(overlappingSums([1, 2, 3, 4, 5], 3))).toEqual([6, 9, 12]);
  });
});

describe("positions to exposures", () => {
  it("adds FX exposure for foreign positions, uses delta exposure where given, lists what is missing", () => {
    const has = (id: string) => ["A", "B", "EURUSD"].includes(id);
    const ex = positionsToExposures(
      [
        { instrument: "A", marketValue: 100, currency: "EUR" },
        { instrument: "B", marketValue: 10, deltaExposure: 55 },
        { instrument: "C", marketValue: 7 },
        { instrument: "A", marketValue: -40, currency: "GBP" },
      ],
      has,
      { reportingCurrency: "USD" },
    );
    expect(ex.factors).toEqual(["A", "EURUSD", "B"]);
    expect(Array.from(ex.exposures)).toEqual([60, 100, 55]);
    expect(ex.excluded.map((e) => e.instrument)).toEqual(["C"]);
    expect(ex.missingFx).toEqual([{ instrument: "A", currency: "GBP", factor: "GBPUSD" }]);
    expect(ex.warnings.map((w) => w.code)).toEqual(["position-excluded", "fx-factor-missing"]);
  });
});
