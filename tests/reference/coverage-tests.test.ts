import { describe, expect, it } from "vitest";
import { chiSquaredPValue } from "@/lib/risk/backtest/chi-squared";
import { kupiecTest } from "@/lib/risk/backtest/kupiec";
import { christoffersenTest } from "@/lib/risk/backtest/christoffersen";

describe("χ² p-values against published critical values", () => {
  // Source: χ² tables (e.g. Abramowitz & Stegun 1964, Handbook of Mathematical Functions, ch. 26; chapter from memory): χ²(1) 3.841459 (5 %), 6.634897 (1 %); χ²(2) 5.991465 (5 %), 9.210340 (1 %)
  it.each([
    [3.841459, 1, 0.05],
    [6.634897, 1, 0.01],
    [5.991465, 2, 0.05],
    [9.21034, 2, 0.01],
  ])("P(χ² ≥ %f; df %i) = %f", (statistic, df, p) => {
    expect(chiSquaredPValue(statistic, df)).toBeCloseTo(p, 7);
  });

  it("χ²(2) has the closed form exp(−x/2) (a fact of the distribution)", () => {
    for (const x of [0.1, 1, 4, 12, 30]) expect(chiSquaredPValue(x, 2)).toBeCloseTo(Math.exp(-x / 2), 14);
  });

  it("a zero statistic has p-value 1", () => {
    expect(chiSquaredPValue(0, 1)).toBe(1);
  });
});

describe("Kupiec (1995) proportion of failures", () => {
  // Source: Kupiec (1995), "Techniques for verifying the accuracy of risk measurement models", J. Derivatives 3
  // LR_POF = −2 ln[(1−p)^(T−x) p^x] + 2 ln[(1−x/T)^(T−x) (x/T)^x]; values worked by hand from that formula
  it("x = 0: LR = −2·T·ln(1−p) (0·ln 0 = 0)", () => {
    const r = kupiecTest(250, 0, 0.01);
    expect(r.lr).toBeCloseTo(-2 * 250 * Math.log(0.99), 12); // 5.025167926750726
    expect(r.lr).toBeCloseTo(5.025167926750726, 10);
    expect(r.pValue).toBeLessThan(0.05); // above the 5 % critical value 3.841459
  });

  it("x = T: LR = −2·T·ln p", () => {
    const r = kupiecTest(10, 10, 0.01);
    expect(r.lr).toBeCloseTo(92.10340371976181, 10);
  });

  it("x = 5 of 250 at 1 %: LR = 1.956809788 (worked by hand from the formula)", () => {
    const r = kupiecTest(250, 5, 0.01);
    expect(r.lr).toBeCloseTo(1.956809788230622, 10);
    expect(r.pValue).toBeGreaterThan(0.05);
  });

  it("exactly the expected rate gives LR = 0", () => {
    expect(kupiecTest(200, 2, 0.01).lr).toBeCloseTo(0, 12);
  });

  it("refuses impossible counts", () => {
    expect(() => kupiecTest(10, 11, 0.01)).toThrow(/0 <= exceptions <= days/);
    expect(() => kupiecTest(10, 1, 1)).toThrow(/0 < expectedRate < 1/);
  });
});

describe("Christoffersen (1998) independence and conditional coverage", () => {
  // Source: Christoffersen (1998), "Evaluating interval forecasts", International Economic Review 39
  it("counts transitions and computes LR_ind and LR_cc (worked by hand from the formulas)", () => {
    // sequence 0 1 1 1 0 0 0 0: transitions 01, 11, 11, 10, 00, 00, 00 → n00 3, n01 1, n10 1, n11 2
    const r = christoffersenTest([0, 1, 1, 1, 0, 0, 0, 0], 0.01);
    expect([r.n00, r.n01, r.n10, r.n11]).toEqual([3, 1, 1, 2]);
    expect(r.pi01).toBeCloseTo(1 / 4, 15);
    expect(r.pi11).toBeCloseTo(2 / 3, 15);
    expect(r.pi).toBeCloseTo(3 / 7, 15);
    expect(r.lrInd).toBeCloseTo(1.2429472990872608, 10);
    expect(r.lrPof).toBeCloseTo(17.146512663935848, 10);
    expect(r.lrCc).toBeCloseTo(18.389459963023107, 10);
    expect(r.pValueCc).toBeCloseTo(chiSquaredPValue(r.lrCc, 2), 15);
  });

  it("no exceptions at all: LR_ind = 0 (0·ln 0 = 0), LR_cc = LR_POF", () => {
    const r = christoffersenTest(new Array(250).fill(false), 0.01);
    expect(r.lrInd).toBe(0);
    expect(r.lrCc).toBeCloseTo(5.025167926750726, 10);
  });

  it("every day an exception (x = T): finite statistics", () => {
    const r = christoffersenTest(new Array(20).fill(true), 0.01);
    expect(r.lrInd).toBe(0);
    expect(Number.isFinite(r.lrCc)).toBe(true);
  });

  it("spread-out exceptions: π01 = π11 gives LR_ind = 0", () => {
    // 0 0 1 1 0 0 0 1 0 0 → n00 4, n01 2, n10 2, n11 1: π01 = π11 = π = 1/3
    const r = christoffersenTest([0, 0, 1, 1, 0, 0, 0, 1, 0, 0], 0.01);
    expect([r.n00, r.n01, r.n10, r.n11]).toEqual([4, 2, 2, 1]);
    expect(r.lrInd).toBeCloseTo(0, 12);
  });
});
