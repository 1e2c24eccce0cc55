import { describe, expect, it } from "vitest";
import { alignedLogReturns, alignOnAxis, alignSeries, logReturns, simpleReturns } from "@/lib/risk";

describe("returns", () => {
  it("log and simple returns, decimals by default, percent on request", () => {
    expect(logReturns([100, 110, 99])).toEqual([Math.log(1.1), Math.log(0.9)]);
    expect(simpleReturns([100, 110, 99])[1]).toBeCloseTo(-0.1, 15);
    expect(logReturns([100, 110], { percent: true })[0]).toBeCloseTo(100 * Math.log(1.1), 12);
  });
  it("refuses non-positive prices, naming the index", () => {
    expect(() => logReturns([100, 0, 3])).toThrow("logReturns requires positive prices: price 1 is 0");
    expect(() => simpleReturns([1])).toThrow(RangeError);
  });
});

describe("alignSeries", () => {
  const a = { id: "A", dates: ["2024-01-02", "2024-01-03", "2024-01-04", "2024-01-05"], values: [1, 2, 3, 4] };
  const b = { id: "B", dates: ["2024-01-02", "2024-01-04", "2024-01-05", "2024-01-08"], values: [10, 30, NaN, 50] };

  it("drop: keeps the dates every series has, and reports the rest", () => {
    const r = alignSeries([a, b], { missing: "drop" });
    expect(r.dates).toEqual(["2024-01-02", "2024-01-04"]);
    expect(r.values).toEqual({ A: [1, 3], B: [10, 30] });
    expect(r.report.dropped.map((d) => [d.date, d.missingIds])).toEqual([["2024-01-03", ["B"]], ["2024-01-05", ["B"]], ["2024-01-08", ["A"]]]);
    expect(r.report.unionDates).toBe(5);
  });
  it("carry-forward: carries the last value up to the limit and flags each carried point", () => {
    const r = alignSeries([a, b], { missing: "carry-forward", carryLimit: 1 });
    expect(r.dates).toEqual(["2024-01-02", "2024-01-03", "2024-01-04", "2024-01-05", "2024-01-08"]);
    expect(r.values.B).toEqual([10, 10, 30, 30, 50]);
    expect(r.values.A).toEqual([1, 2, 3, 4, 4]);
    expect(r.report.carried).toEqual([
      { date: "2024-01-03", id: "B", fromDate: "2024-01-02" },
      { date: "2024-01-05", id: "B", fromDate: "2024-01-04" },
      { date: "2024-01-08", id: "A", fromDate: "2024-01-05" },
    ]);
    const strict = alignSeries([a, { id: "C", dates: ["2024-01-02", "2024-01-05"], values: [5, 6] }], { missing: "carry-forward", carryLimit: 1 });
    expect(strict.report.dropped).toEqual([{ date: "2024-01-04", missingIds: ["C"], reason: "beyond-carry-limit" }]);
  });
  it("never treats a missing price as zero; leading gaps cannot be carried", () => {
    const r = alignSeries([a, { id: "D", dates: ["2024-01-04"], values: [7] }], { missing: "carry-forward" });
    expect(r.report.dropped.slice(0, 2).map((d) => d.reason)).toEqual(["no-earlier-value", "no-earlier-value"]);
    expect(Object.values(r.values).flat()).not.toContain(0);
  });
  it("refuse: throws on the first missing value, naming series and date", () => {
    expect(() => alignSeries([a, b], { missing: "refuse" })).toThrow('series "B" has no value on 2024-01-03');
  });
  it("rejects malformed or repeated dates", () => {
    expect(() => alignSeries([{ id: "X", dates: ["02/01/2024"], values: [1] }], { missing: "drop" })).toThrow(/yyyy-mm-dd/);
    expect(() => alignSeries([{ id: "X", dates: ["2024-01-02", "2024-01-02"], values: [1, 2] }], { missing: "drop" })).toThrow(/twice/);
  });
});

// The run's rule (lib/runs/align.ts). Hand-worked example; the rule itself is common practice, no source.
describe("alignSeries, drop-inside-history", () => {
  // P lacks 4 January inside its history (2 to 8 January); Q starts on 4 January; R ends on 5 January, and lacks
  // 4 January inside its history too.
  const p = { id: "P", dates: ["2024-01-02", "2024-01-03", "2024-01-05", "2024-01-08"], values: [100, 102, 105, 104] };
  const q = { id: "Q", dates: ["2024-01-04", "2024-01-05", "2024-01-08"], values: [50, 51, 49] };
  const r = { id: "R", dates: ["2024-01-02", "2024-01-03", "2024-01-05"], values: [10, 11, 12] };

  it("leaves a date out only where a series inside its own history has no value; outside it, NaN", () => {
    const a = alignSeries([p, q, r], { missing: "drop-inside-history" });
    // hand-worked: union 2, 3, 4, 5, 8 January; 4 January goes (P and R are inside their histories), the rest stay
    expect(a.dates).toEqual(["2024-01-02", "2024-01-03", "2024-01-05", "2024-01-08"]);
    expect(a.values).toEqual({ P: [100, 102, 105, 104], Q: [NaN, NaN, 51, 49], R: [10, 11, 12, NaN] });
    expect(a.report.dropped).toEqual([{ date: "2024-01-04", missingIds: ["P", "R"], reason: "missing" }]);
    expect(a.report.carried).toEqual([]);
    expect(a.report.perSeries).toEqual({
      P: { observed: 4, carried: 0, outsideHistory: 0 },
      Q: { observed: 3, carried: 0, outsideHistory: 2 },
      R: { observed: 3, carried: 0, outsideHistory: 1 },
    });
    expect(a.report).toMatchObject({ missing: "drop-inside-history", carryLimit: null, unionDates: 5, keptDates: 4 });
    // "drop" on the same series keeps only the one date all three have
    expect(alignSeries([p, q, r], { missing: "drop" }).dates).toEqual(["2024-01-05"]);
  });

  it("log returns between kept dates span the gap; NaN where a value is missing; unbroken runs up to the last date", () => {
    const a = alignedLogReturns(alignSeries([p, q, r], { missing: "drop-inside-history" }));
    expect(a.dates).toEqual(["2024-01-03", "2024-01-05", "2024-01-08"]);
    // hand-worked: P's 5 January return is ln(105/102), over the left-out 4 January
    expect(a.returns.P).toEqual(Float64Array.from([Math.log(102 / 100), Math.log(105 / 102), Math.log(104 / 105)]));
    expect(a.returns.Q).toEqual(Float64Array.from([NaN, NaN, Math.log(49 / 51)]));
    expect(a.returns.R).toEqual(Float64Array.from([Math.log(11 / 10), Math.log(12 / 11), NaN]));
    expect(a.unbroken).toEqual({ P: 3, Q: 1, R: 0 });
  });

  it("on a given axis: a series with no value at all blocks nothing, and no series keeps every date", () => {
    const axis = ["2024-01-02", "2024-01-03", "2024-01-04"];
    const a = alignOnAxis(axis, [{ id: "P", values: [1, NaN, 3] }, { id: "E", values: [NaN, NaN, NaN] }], { missing: "drop-inside-history" });
    expect(a.dates).toEqual(["2024-01-02", "2024-01-04"]);
    expect(a.report.dropped).toEqual([{ date: "2024-01-03", missingIds: ["P"], reason: "missing" }]);
    expect(a.report.perSeries.E).toEqual({ observed: 0, carried: 0, outsideHistory: 2 });
    expect(alignOnAxis(axis, [], { missing: "drop-inside-history" }).dates).toEqual(axis);
  });
});
