/** Method statement → engine input, the capital profile, the plus-factor table, alignment and canonical hashing. Pure. */
import { describe, expect, it } from "vitest";
import { DEFAULT_METHOD_CONTENT, methodContentSchema, type MethodContent } from "@/lib/validation/method";
import { ESTIMATOR_DEFAULTS } from "@/lib/method/defaults";
import { capitalProfileOf, engineMethodOf, estimatorFor, firmPlusFactor, storedHistoryDays, DEFAULT_T_NU } from "@/lib/runs/method-map";
import { alignReturns, usableSeries } from "@/lib/runs/align";
import { canonicalJson, hashOf, sha256Hex } from "@/lib/domain/canonical";
import { choicesFor } from "@/lib/runs/factor-volatility";
import { progressOf } from "@/lib/data/run-execution";
import { RUN_STAGES } from "@/lib/runs/types";

const row = { id: "p1", name: "Firm profile", confidence: 0.99, horizonDays: 10, averagingDays: 60, baseMultiplier: 3, stressedMultiplier: 3, backtestDays: 250, plusFactors: { "5": 0.4, "6": 0.5, "7": 0.65, "8": 0.75, "9": 0.85, "10": 1 } };
const capital = capitalProfileOf(row);

function content(overrides: Partial<MethodContent>): MethodContent {
  return methodContentSchema.parse({ ...DEFAULT_METHOD_CONTENT, ...overrides });
}

describe("method statement → engine method", () => {
  it("computes parametric and historical always, with the chosen method as primary", () => {
    const m = engineMethodOf(content({ varMethod: "historical", scaling: "overlap" }), capital);
    expect(m.methods).toEqual(["parametric", "historical"]);
    expect(m.primaryMethod).toBe("historical");
    expect(m.scaling).toBe("overlap");
  });

  it("adds filtered historical simulation when the method chooses it", () => {
    const m = engineMethodOf(content({ varMethod: "filtered" }), capital);
    expect(m.methods).toEqual(["parametric", "historical", "filtered"]);
    expect(m.primaryMethod).toBe("filtered");
  });

  it("passes covariance, λ, windows, confidences, horizon, scaling and distribution through", () => {
    const c = content({ covariance: "garch-ccc", covarianceLambda: 0.97, covarianceWindow: 300, historicalWindow: 750, confidences: [0.995, 0.99], horizonDays: 5, scaling: "term", distribution: "t" });
    const m = engineMethodOf(c, capital);
    expect(m).toMatchObject({ covariance: "garch-ccc", lambda: 0.97, covarianceWindow: 300, historicalWindow: 750, confidences: [0.995, 0.99], horizonDays: 5, scaling: "term", distribution: "t", nu: DEFAULT_T_NU });
  });

  it("gives no ν for the normal distribution", () => {
    expect(engineMethodOf(content({}), capital).nu).toBeUndefined();
  });

  it("maps a searched and a chosen stress window", () => {
    expect(engineMethodOf(content({ stressWindow: { mode: "search" } }), capital).stressWindow).toBe("search");
    expect(engineMethodOf(content({ stressWindow: { mode: "chosen", start: "2024-03-01", end: "2024-05-31" } }), capital).stressWindow).toEqual({ start: "2024-03-01", end: "2024-05-31" });
  });

  it("takes backtest days from the capital profile and asks for a VaR forecast on every backtest day", () => {
    const long = capitalProfileOf({ ...row, averagingDays: 90, backtestDays: 500 });
    const m = engineMethodOf(content({}), long);
    expect(m.backtestDays).toBe(500);
    expect(m.historyDays).toBe(501);
    expect(engineMethodOf(content({}), capital).historyDays).toBe(251);
    expect(storedHistoryDays(long)).toBe(90);
    expect(storedHistoryDays(capital)).toBe(60);
  });
});

describe("capital rule profile", () => {
  it("maps the stored row onto the engine's profile", () => {
    expect(capital.profile).toEqual({ multiplierBase: 3, stressedMultiplierBase: 3, plusFactorOnStressed: true, averagingDays: 60, confidence: 0.99, horizonDays: 10, includeStressed: true });
    expect(capital.id).toBe("p1");
  });

  // Plus factors by exceptions in 250 days: Basel Committee (1996), supervisory framework for backtesting, Table 2
  // (green 0–4: 0; yellow 5: 0.40, 6: 0.50, 7: 0.65, 8: 0.75, 9: 0.85; red 10 or more: 1.00).
  it.each([
    [0, 0],
    [4, 0],
    [5, 0.4],
    [6, 0.5],
    [7, 0.65],
    [8, 0.75],
    [9, 0.85],
    [10, 1],
    [14, 1],
  ])("%i exceptions give a plus factor of %f under the firm's table", (exceptions, plus) => {
    expect(firmPlusFactor(row.plusFactors, exceptions)).toBe(plus);
  });
});

describe("per-factor estimator", () => {
  const c = content({
    defaultEstimator: { kind: "ewma", lambdaMode: "fixed", lambda: 0.94 },
    byAssetClass: { equity: { kind: "garch", distribution: "t", mean: "zero", targeting: false, fallback: "ewma" }, fx: { kind: "arch", order: 2 } },
    minHistory: 250,
  });

  it("takes the asset class's choice, exchange rates as fx, and the default elsewhere", () => {
    expect(estimatorFor(c, "equity")).toEqual({ choice: c.byAssetClass.equity, from: "asset-class" });
    expect(estimatorFor(c, "fx").choice).toEqual({ kind: "arch", order: 2 });
    expect(estimatorFor(c, "government_bond")).toEqual({ choice: c.defaultEstimator, from: "default" });
  });

  it("fits every family, the chosen one with its own settings", () => {
    const { choices, chosen } = choicesFor(c, "fx");
    expect(choices.map((x) => x.kind)).toEqual(["ma", "ewma", "arch", "garch"]);
    expect(choices[2]).toBe(chosen);
    expect(chosen).toEqual({ kind: "arch", order: 2 });
    // the families not chosen take the one table of defaults, the same the method form starts a new choice with
    expect(choices[1]).toEqual(ESTIMATOR_DEFAULTS.ewma);
    expect(choices[0]).toEqual(ESTIMATOR_DEFAULTS.ma);
  });
});

describe("alignment of stored closes", () => {
  const prices = {
    dates: ["2026-01-01", "2026-01-02", "2026-01-05", "2026-01-06", "2026-01-07"],
    factors: {
      A: { assetClass: "equity", currency: "EUR", closes: [100, 101, 102, 103, 104] },
      B: { assetClass: "equity", currency: "EUR", closes: [50, null, 51, 52, 53] },
      C: { assetClass: "equity", currency: "EUR", closes: [null, null, null, 10, 11] },
    },
  };

  it("leaves out a date on which a factor inside its history has no close, for every factor", () => {
    const a = alignReturns(prices);
    expect(a.droppedDates).toEqual([{ date: "2026-01-02", missing: ["B"] }]);
    expect(a.returns.dates).toEqual(["2026-01-05", "2026-01-06", "2026-01-07"]);
    // the return on 5 January spans the gap for both A and B: ln(102/100), ln(51/50)
    expect(a.returns.factors.A[0]).toBe(Math.log(102 / 100));
    expect(a.returns.factors.B[0]).toBe(Math.log(51 / 50));
  });

  it("gives a factor no return before its first close, and counts its unbroken returns", () => {
    const a = alignReturns(prices);
    expect(Number.isNaN(a.returns.factors.C[0])).toBe(true);
    expect(Number.isNaN(a.returns.factors.C[1])).toBe(true); // 6 January: no earlier close on the axis
    expect(a.usableReturns).toEqual({ A: 3, B: 3, C: 1 });
    expect(usableSeries(a, "C")).toEqual({ dates: ["2026-01-07"], returns: Float64Array.from([Math.log(11 / 10)]) });
  });
});

describe("canonical JSON and hashes", () => {
  // SHA-256("abc") = ba7816bf…15ad: FIPS 180-2, Appendix B.1.
  it("hashes by SHA-256", () => {
    expect(sha256Hex("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  });

  it("does not depend on the order keys were written in", () => {
    expect(canonicalJson({ b: 1, a: [2, { d: null, c: "x" }] })).toBe('{"a":[2,{"c":"x","d":null}],"b":1}');
    expect(hashOf({ b: 1, a: 2 })).toBe(hashOf({ a: 2, b: 1 }));
  });

  it("refuses a number JSON cannot hold", () => {
    expect(() => canonicalJson({ a: NaN })).toThrow(/no JSON form/);
  });
});

describe("progress", () => {
  it("rises through the stages and ends at 1", () => {
    const values = RUN_STAGES.map((s) => progressOf(s.key, 1));
    for (let i = 1; i < values.length; i++) expect(values[i]).toBeGreaterThan(values[i - 1]);
    expect(progressOf("done", 1)).toBe(1);
    expect(progressOf("factor-volatility", 0.5)).toBeGreaterThan(progressOf("inputs", 1));
    expect(progressOf("factor-volatility", 0.5)).toBeLessThan(progressOf("factor-volatility", 1));
  });
});
