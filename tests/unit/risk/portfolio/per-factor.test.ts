import { describe, expect, it } from "vitest";
import { runMonthEnd, portfolioVar, type MonthEndInput } from "@/lib/risk/portfolio/run-month-end";
import { standardCandidates } from "@/lib/risk/portfolio/candidates";
import { candidateEvidence } from "@/lib/risk/portfolio/candidate-evidence";
import { refitBlocks } from "@/lib/risk/portfolio/per-factor";
import { bookInput, syntheticBook } from "./synthetic-book";

const book = syntheticBook(9, 700, 36, 21);
const base = (method: MonthEndInput["method"]): MonthEndInput => bookInput(book, method);

describe("per-factor processes in the month-end run", () => {
  it("GARCH(1,1)-t for equities and EWMA 0.97 for FX: the figures move and the model says exactly that", () => {
    const today = runMonthEnd(base({ methods: ["parametric"] }));
    const chosen = runMonthEnd(base({
      methods: ["parametric"],
      volatility: { default: { kind: "ewma", lambda: 0.94 }, byAssetClass: { equity: { kind: "garch", distribution: "t" }, fx: { kind: "ewma", lambda: 0.97 } } },
      correlation: { kind: "ewma", lambda: 0.94 },
    }));
    expect(chosen.methods[0].byConfidence[0].oneDay.var).not.toBe(today.methods[0].byConfidence[0].oneDay.var);
    const m = chosen.model!;
    const fx = m.factors.find((f) => f.factor === "EURUSD")!;
    expect(fx).toMatchObject({ assetClass: "fx", source: "asset-class", process: "ewma", label: "EWMA, λ = 0.97, zero mean" });
    const eq = m.factors.filter((f) => f.assetClass === "equity");
    expect(eq.length).toBeGreaterThan(0);
    for (const f of eq) expect(f.label).toMatch(/^GARCH\(1,1\), Student-t errors \(ν = [\d.]+\), zero mean$/);
    for (const f of m.factors.filter((x) => x.assetClass === "bond")) expect(f.source).toBe("default");
    expect(m.statements[0]).toMatch(/GARCH\(1,1\), Student-t errors, zero mean .* for \d+ factor(?:s|\(s\))? \(equity/);
    expect(m.statements[0]).toMatch(/EWMA, λ = 0\.97, zero mean .* for 1 factor(?:\(s\))? \(fx: EURUSD\)/);
    expect(m.correlation.label).toBe("EWMA, λ = 0.94");
    expect(m.backtest.refit).toEqual({ mode: "rolling", everyDays: 21 });
    // the one-day variance of each factor is the diagonal of the covariance behind the VaR
    const p = portfolioVar(base({ methods: ["parametric"], volatility: { default: { kind: "ewma", lambda: 0.94 }, byAssetClass: { equity: { kind: "garch", distribution: "t" }, fx: { kind: "ewma", lambda: 0.97 } } } }));
    expect(p.model.factors.map((f) => f.variance)).toEqual(m.factors.map((f) => f.variance));
    // stored pieces: the correlation with unit diagonal, the backtest series
    const c = chosen.correlation!;
    expect(c.factors).toEqual(chosen.factors.used);
    c.matrix.forEach((row, i) => expect(row[i]).toBeCloseTo(1, 12));
    expect(chosen.backtestSeries!.dates).toHaveLength(chosen.backtest.days);
    expect(chosen.backtestSeries!.exception.filter(Boolean)).toHaveLength(chosen.backtest.exceptions);
  });

  it("term structure: GARCH horizon variance sums the reverting forecast, EWMA stays flat", () => {
    const r = runMonthEnd(base({ methods: ["parametric"], horizonDays: 10, scaling: "term", volatility: { default: { kind: "ewma", lambda: 0.94 }, byAssetClass: { equity: { kind: "garch" } } } }));
    for (const f of r.model!.factors) {
      if (f.process === "ewma") expect(f.horizonVariance).toBeCloseTo(10 * f.variance, 18);
      else expect(f.horizonVariance).not.toBeCloseTo(10 * f.variance, 12);
    }
    expect(r.model!.horizon.rule).toBe("term");
    expect(r.model!.horizon.statement).toMatch(/^10-day parametric figures: each factor's own variance forecast summed/);
  });

  it("no \"ten-day\" wording when the horizon is another number", () => {
    const r = runMonthEnd(base({ methods: ["parametric", "historical"], horizonDays: 5, volatility: { default: { kind: "ewma", lambda: 0.94 } } }));
    const { capitalProfile, ...choices } = r.choices; // the capital profile's own horizon is 10 days
    expect(capitalProfile).toMatch(/10-day/);
    const text = JSON.stringify([r.model, r.limitations, choices, r.stressed.statement, r.methods.map((m) => m.scalingStatement), r.backtest.statement, r.varHistory.statement]);
    expect(text).not.toMatch(/ten-day|ten days|10-day/i);
    expect(text).toMatch(/5-day/);
  });

  it("filtered historical simulation rescales each factor with its own process", () => {
    const a = runMonthEnd(base({ methods: ["filtered"], historicalWindow: 300, volatility: { default: { kind: "ewma", lambda: 0.94 } } }));
    const b = runMonthEnd(base({ methods: ["filtered"], historicalWindow: 300, volatility: { default: { kind: "ewma", lambda: 0.94 }, byAssetClass: { equity: { kind: "garch" } } } }));
    expect(a.methods[0].byConfidence[0].oneDay.var).not.toBe(b.methods[0].byConfidence[0].oneDay.var);
    expect(a.choices.filteringVolatility).toBe("each factor's own process");
    // the history's last point is today's figure
    expect(b.varHistory.points.at(-1)!.var1d[0]).toBe(b.methods[0].byConfidence[0].oneDay.var);
  });

  it("the refit schedule counts back from the as-of date", () => {
    expect(refitBlocks(100, 50, { mode: "rolling", everyDays: 21 })).toEqual([
      { tau: 100, start: 100, end: 101 }, { tau: 79, start: 79, end: 100 }, { tau: 58, start: 58, end: 79 }, { tau: 37, start: 50, end: 58 },
    ]);
    expect(refitBlocks(100, 50, { mode: "full-sample" })).toEqual([{ tau: 100, start: 50, end: 101 }]);
  });

  it("a process that cannot be computed is refused naming the factor, its asset class and the reason", () => {
    const short = syntheticBook(3, 170, 6, 2);
    const input: MonthEndInput = bookInput(short, { methods: ["parametric"], backtestDays: 60, historyDays: 60, stressWindowDays: 50, volatility: { default: { kind: "ewma", lambda: 0.94 }, byAssetClass: { equity: { kind: "arch", order: 8 } } } });
    // ARCH(8) needs 180 returns: the equity factor is left out, with the reason and its class
    const r = runMonthEnd(input);
    const ex = r.factors.excluded.find((e) => e.factor === "INST0000")!;
    expect(ex.reason).toMatch(/the method needs 180 \(its volatility process, asset class equity\)/);
    expect(() => runMonthEnd({ ...input, method: { ...input.method, volatility: { default: { kind: "ewma", lambda: 1.5 } } } })).toThrow(/factor .*: EWMA: λ must be between 0 and 1/);
  });

  it("candidate evidence: the run's own method and the standard candidates side by side", () => {
    const r = runMonthEnd(base({ methods: ["parametric"], volatility: { default: { kind: "garch" } }, candidates: { include: "standard", archOrder: 3 } }));
    const ev = r.candidates!;
    expect(ev.rows.map((x) => x.id)).toEqual(["this-method", ...standardCandidates(3).map((c) => c.id)]);
    expect(ev.days).toBe(r.backtest.days);
    const own = ev.rows[0];
    expect(own.exceptions).toBe(r.backtest.exceptions);
    expect(own.kupiecPValue).toBe(r.backtest.kupiec.pValue);
    for (const row of ev.rows) {
      expect(row.error).toBeNull();
      expect(row.var).toHaveLength(ev.days);
      expect(row.meanVar!).toBeGreaterThan(0);
      expect(["green", "yellow", "red"]).toContain(row.zone);
    }
    // a given configuration computed as a run would
    const given = candidateEvidence(base({ methods: ["parametric"] }), { candidates: [], given: [{ id: "draft", label: "Draft", basis: "method", method: { volatility: { default: { kind: "garch" } } } }] });
    expect(given.rows[1].id).toBe("draft");
    expect(given.rows[1].exceptions).toBe(r.backtest.exceptions);
    expect(given.rows[1].var).toEqual(r.backtestSeries!.var);
  });
});

describe("a given candidate with one covariance model beside a per-factor method", () => {
  it("keeps that model's own refit rule (the legacy GARCH-CCC is fitted once)", () => {
    const ev = candidateEvidence(base({ methods: ["parametric"], volatility: { default: { kind: "ewma", lambda: 0.94 } }, backtestRefit: { mode: "rolling", everyDays: 21 } }), {
      candidates: [],
      given: [{ id: "old", label: "Approved version 1", basis: "method", method: { volatility: undefined, correlation: undefined, covariance: "garch-ccc", lambda: 0.94 } }],
    });
    expect(ev.rows[1].error).toBeNull();
    expect(ev.rows[1].exceptions).not.toBeNull();
  });
});
