import { describe, expect, it } from "vitest";
import { runMonthEnd, prepareRun, type MonthEndInput } from "@/lib/risk/portfolio/run-month-end";
import { ENGINE_VERSION } from "@/lib/risk/version";
import { varMultiplier } from "@/lib/risk/var/parametric";
import { bookInput, syntheticBook } from "./synthetic-book";

const book = syntheticBook(12, 900, 40, 11);
const base: MonthEndInput = bookInput(book);

function sum(values: number[]): number {
  return values.reduce((a, b) => a + b, 0);
}

describe("runMonthEnd", () => {
  const result = runMonthEnd({ ...base, method: { methods: ["parametric", "historical", "filtered"], covariance: "ewma" } });

  it("carries the engine version, choices, limitations and the sample", () => {
    expect(result.engineVersion).toBe(ENGINE_VERSION);
    expect(result.sample.days).toBe(900);
    expect(result.choices.quantileConvention).toMatch(/type-7/);
    expect(result.limitations.join(" ")).toMatch(/linearly/);
    expect(result.confidences).toEqual([0.99, 0.975]);
  });

  it("component VaR sums to the total by position, asset class and currency, for every method (Euler)", () => {
    for (const m of result.methods) {
      for (const c of m.byConfidence) {
        const total = c.oneDay.var;
        expect(sum(c.contributions.map((p) => p.componentVar))).toBeCloseTo(total, 4);
        expect(sum(c.contributions.map((p) => p.componentEs))).toBeCloseTo(c.oneDay.es, 4);
        expect(sum(c.contributions.map((p) => p.componentVarHorizon))).toBeCloseTo(c.horizon.var, 4);
        expect(sum(Object.values(c.byAssetClass).map((g) => g.componentVar))).toBeCloseTo(total, 4);
        expect(sum(Object.values(c.byCurrency).map((g) => g.componentVar))).toBeCloseTo(total, 4);
        expect(sum(c.byFactor.map((f) => f.componentVar))).toBeCloseTo(total, 4);
        const standAlone = sum(Object.values(c.byAssetClass).map((g) => g.standAloneVar));
        expect(c.diversificationBenefit).toBeCloseTo(standAlone - total, 6);
        if (m.method === "parametric") expect(c.diversificationBenefit).toBeGreaterThanOrEqual(-1e-6); // subadditive
      }
    }
  });

  it("ES is at least VaR; ten-day parametric is √10 × one-day under square-root scaling", () => {
    for (const m of result.methods) for (const c of m.byConfidence) expect(c.oneDay.es).toBeGreaterThanOrEqual(c.oneDay.var - 1e-9);
    const p = result.methods.find((m) => m.method === "parametric")!.byConfidence[0];
    expect(p.horizon.var).toBeCloseTo(p.oneDay.var * Math.sqrt(10), 6);
  });

  it("the last point of the VaR history is today's figure", () => {
    const last = result.varHistory.points.at(-1)!;
    const p = result.methods.find((m) => m.method === result.primaryMethod)!.byConfidence;
    expect(result.varHistory.points).toHaveLength(60);
    expect(last.asOf).toBe(result.asOf);
    expect(last.var1d[0]).toBeCloseTo(p[0].oneDay.var, 6);
    expect(last.es1d[1]).toBeCloseTo(p[1].oneDay.es, 6);
  });

  it("backtests 250 days and builds capital from the 60-day history and the stressed VaR", () => {
    expect(result.backtest.days).toBe(250);
    expect(result.backtest.exceptionList.length).toBe(result.backtest.exceptions);
    const horizon = result.varHistory.points.map((p) => p.varHorizon[0]);
    expect(result.capital.varAverage).toBeCloseTo(sum(horizon) / 60, 6);
    expect(result.capital.varLast).toBeCloseTo(horizon[59], 6);
    expect(result.capital.stressedVarLast).toBeCloseTo(result.stressed.byConfidence[0].horizon.var, 6);
    expect(result.capital.capital).toBeCloseTo(result.capital.varTerm + result.capital.stressedVarTerm, 6);
    expect(result.capital.multiplier).toBeCloseTo(3 + result.backtest.plusFactor, 12);
  });

  it("finds the stress window inside the stressed stretch of the synthetic history", () => {
    expect(result.stressed.window.chosenBy).toBe("search");
    expect(result.stressed.window.days).toBe(250);
    const start = book.returns.dates.indexOf(result.stressed.window.start);
    expect(start).toBeGreaterThan(900 * 0.35 - 250);
    expect(start).toBeLessThan(900 * 0.55);
    expect(result.stressed.byConfidence[0].oneDay.var).toBeGreaterThan(result.methods[0].byConfidence[0].oneDay.var);
  });

  it("history forecasts for parametric EWMA equal the matrix EWMA run on a shorter sample (roll-forward is exact)", () => {
    const cut = 880;
    const shorter: MonthEndInput = {
      ...base,
      returns: { dates: book.returns.dates.slice(0, cut), factors: Object.fromEntries(Object.entries(book.returns.factors).map(([k, v]) => [k, Array.from(v).slice(0, cut)])) },
      method: { methods: ["parametric"], covariance: "ewma", backtestDays: 100 },
    };
    const r = runMonthEnd(shorter);
    const point = result.varHistory.points.find((p) => p.asOf === book.returns.dates[cut - 1])!;
    expect(point.var1d[0]).toBeCloseTo(r.methods[0].byConfidence[0].oneDay.var, 6);
  });

  it("lists a position without price history and leaves it out, never silently", () => {
    const r = runMonthEnd({ ...base, positions: [...base.positions, { instrument: "NOHIST", marketValue: 5e5, assetClass: "equity" }], method: { methods: ["parametric"] } });
    expect(r.excludedPositions.map((p) => p.instrument)).toEqual(["NOHIST"]);
    expect(r.warnings.map((w) => w.code)).toContain("position-excluded");
    expect(r.factors.excluded.map((f) => f.factor)).toContain("NOHIST");
    expect(r.methods[0].byConfidence[0].oneDay.var).toBeCloseTo(result.methods[0].byConfidence[0].oneDay.var, 6);
  });

  it("uses an analyst's stress window with its dates", () => {
    const r = runMonthEnd({ ...base, method: { methods: ["historical"], stressWindow: { start: book.returns.dates[100], end: book.returns.dates[349] } } });
    expect(r.stressed.window).toEqual({ start: book.returns.dates[100], end: book.returns.dates[349], days: 250, chosenBy: "analyst" });
  });

  it("garch-ccc: correlation checked, term-structure ten-day figures, history ends at today's figure", () => {
    const r = runMonthEnd({ ...base, method: { methods: ["parametric", "filtered"], covariance: "garch-ccc", scaling: "term" } });
    expect(r.covarianceCheck.matrix).toBe("correlation");
    expect(r.covarianceCheck.check.status).toBe("positive-definite");
    expect(r.volatilityModels).toHaveLength(r.factors.used.length);
    const p = r.methods[0].byConfidence[0];
    expect(p.horizon.var).not.toBeCloseTo(p.oneDay.var * Math.sqrt(10), 2);
    expect(r.varHistory.points.at(-1)!.varHorizon[0]).toBeCloseTo(p.horizon.var, 6);
    expect(sum(p.contributions.map((c) => c.componentVarHorizon))).toBeCloseTo(p.horizon.var, 4);
  });

  it("historical and filtered as primary: the history's last point is today's figure", () => {
    for (const primary of ["historical", "filtered"] as const) {
      const r = runMonthEnd({ ...base, method: { methods: [primary], historicalWindow: 250 } });
      const today = r.methods[0].byConfidence;
      const last = r.varHistory.points.at(-1)!;
      expect(last.var1d[0]).toBeCloseTo(today[0].oneDay.var, 6);
      expect(last.es1d[1]).toBeCloseTo(today[1].oneDay.es, 6);
      expect(last.varHorizon[0]).toBeCloseTo(today[0].horizon.var, 6);
    }
  });

  it("overlapping ten-day returns for historical simulation", () => {
    const r = runMonthEnd({ ...base, method: { methods: ["historical"], scaling: "overlap", historicalWindow: 250 } });
    expect(r.methods[0].scalingStatement).toMatch(/overlapping/);
    expect(r.varHistory.points.at(-1)!.varHorizon[0]).toBeCloseTo(r.methods[0].byConfidence[0].horizon.var, 6);
  });

  it("a factor that starts late shortens the working sample and says so; one too short is excluded and listed", () => {
    const late = Array.from(book.returns.factors.INST0001, (x, t) => (t < 100 ? NaN : x));
    const tooShort = Array.from(book.returns.factors.INST0002, (x, t) => (t < 850 ? NaN : x));
    const r = runMonthEnd({
      ...base,
      returns: { dates: book.returns.dates, factors: { ...book.returns.factors, INST0001: late, INST0002: tooShort } },
      method: { methods: ["parametric"], covariance: "equal" },
    });
    expect(r.sample.days).toBe(800);
    expect(r.warnings.find((w) => w.code === "short-history")?.message).toMatch(/INST0001/);
    expect(r.factors.excluded).toEqual([{ factor: "INST0002", reason: "only 50 days of returns up to the last date; the method needs 250" }]);
    expect(r.excludedPositions.every((p) => p.instrument === "INST0002")).toBe(true);
    expect(r.excludedPositions.length).toBeGreaterThan(0);
  });

  it("Student-t parametric VaR scales the normal figure by the ratio of the multipliers", () => {
    const n = runMonthEnd({ ...base, method: { methods: ["parametric"] } }).methods[0].byConfidence[0];
    const t = runMonthEnd({ ...base, method: { methods: ["parametric"], distribution: "t", nu: 5 } }).methods[0].byConfidence[0];
    expect(t.oneDay.var / n.oneDay.var).toBeCloseTo(varMultiplier(0.99, { distribution: "t", nu: 5 }) / varMultiplier(0.99), 10);
    expect(t.oneDay.es).toBeGreaterThan(n.oneDay.es);
  });

  it("refuses impossible input with a clear message", () => {
    expect(() => runMonthEnd({ ...base, method: { confidences: [1.2] } })).toThrow("runMonthEnd requires 0 < confidence < 1");
    expect(() => runMonthEnd({ ...base, positions: [] })).toThrow(/at least one position/);
    expect(() => runMonthEnd({ ...base, method: { scaling: "term", covariance: "ewma" } })).toThrow(/garch-ccc/);
    expect(() => prepareRun({ ...base, returns: { dates: ["2024-01-02"], factors: { A: [0.1, 0.2] } } })).toThrow(/aligned/);
  });
});
