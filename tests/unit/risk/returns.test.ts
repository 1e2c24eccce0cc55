import { describe, expect, it } from "vitest";
import { alignSeries, logReturns, simpleReturns } from "@/lib/risk";

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
