import { describe, expect, it } from "vitest";
import { DRAFT_CAUTION } from "@/app/_components/draft-caution";
import { buildFilingViewModel, type FilingPackInput } from "@/reports/view-model";
import { correlationFromRunInputs, filingInputFromRun } from "@/reports/run-adapter";
import { FORMULA_TEXT, packFixture } from "./fixture";

function sum(values: number[]): number {
  return values.reduce((a, b) => a + b, 0);
}

describe("buildFilingViewModel from a completed run", () => {
  it("carries every headline figure exactly as the run stored it", async () => {
    const { vm, run } = await packFixture();
    const r = run.results!.monthEnd;
    const f = vm.figures;
    expect(f.asOf).toBe(r.asOf);
    expect(f.currency).toBe("EUR");
    expect(f.capital.capital).toBe(r.capital.capital);
    expect(f.capital.varTerm).toBe(r.capital.varTerm);
    expect(f.capital.stressedVarTerm).toBe(r.capital.stressedVarTerm);
    expect(f.capital.multiplier).toBe(r.capital.multiplier);
    expect(f.capital.formula).toBe(r.capital.formula);
    for (const m of r.methods) {
      const t = f.totals.find((x) => x.method === m.method)!;
      expect(t.primary).toBe(m.method === r.primaryMethod);
      m.byConfidence.forEach((c, i) => {
        expect(t.byConfidence[i]).toEqual({ confidence: c.confidence, oneDay: c.oneDay, horizon: c.horizon, diversificationBenefit1d: c.diversificationBenefit, diversificationBenefitHorizon: c.diversificationBenefitHorizon });
      });
    }
    expect(f.stressed.window).toEqual(r.stressed.window);
    expect(f.stressed.byConfidence.map((c) => c.horizon.var)).toEqual(r.stressed.byConfidence.map((c) => c.horizon.var));
    expect(f.varHistory.points.map((p) => p.var1d)).toEqual(r.varHistory.points.map((p) => p.var1d));
  });

  it("keeps the backtest with every exception, its explanation and the day-by-day series", async () => {
    const { vm, run } = await packFixture();
    const bt = run.results!.monthEnd.backtest;
    const series = run.results!.backtestSeries;
    const b = vm.figures.backtest;
    expect(b.exceptions).toBe(bt.exceptions);
    expect(b.zone).toBe(bt.zone);
    expect(b.kupiec.pValue).toBe(bt.kupiec.pValue);
    expect(b.christoffersen?.lrCc).toBe(bt.christoffersen?.lrCc);
    expect(b.exceptionList.map((e) => [e.date, e.pnl, e.var, e.excess])).toEqual(bt.exceptionList.map((e) => [e.date, e.pnl, e.var, e.excess]));
    expect(b.exceptionList[0].explanation).toMatch(/^\+2\.1 %/);
    expect(b.pnlVsVar.map((d) => d.date)).toEqual(series.dates);
    expect(b.pnlVsVar.filter((d) => d.exception).map((d) => d.date)).toEqual(bt.exceptionList.map((e) => e.date));
    // each history point's next-day P&L is the series' P&L of the following date (the forecast is for that day)
    const last = vm.figures.varHistory.points.at(-1)!;
    expect(last.pnlNext).toBeNull();
    const before = vm.figures.varHistory.points.at(-2)!;
    expect(before.pnlNext).toBe(series.pnl.at(-1));
  });

  it("lists positions (the left-out one last), factors with every estimator and the chosen one, and a valid correlation", async () => {
    const { vm } = await packFixture();
    const f = vm.figures;
    const out = f.positions.filter((p) => !p.included);
    expect(out.map((p) => p.instrument)).toEqual([`Main · ${FORMULA_TEXT}`]);
    expect(f.positions.at(-1)!.included).toBe(false);
    // Euler allocation: component VaR adds up to the total (the engine's property, checked in its own tests)
    const total = f.totals.find((t) => t.primary)!.byConfidence[0].oneDay.var;
    expect(sum(f.positions.filter((p) => p.included).map((p) => p.componentVar1d!))).toBeCloseTo(total, 6);
    expect(f.riskFactors.map((r) => r.factor).sort()).toEqual([...f.correlation!.factors].sort());
    for (const r of f.riskFactors) {
      expect(r.estimates.map((e) => e.estimator)).toEqual(["ma", "ewma", "arch", "garch"]);
      expect(r.chosen).toBe("ewma");
      expect(r.chosenLabel).toBe("EWMA, λ = 0.94, zero mean");
      expect(r.chosenVolatility).toBe(r.estimates[1].volatility);
    }
    const m = f.correlation!.matrix;
    m.forEach((row, i) => {
      expect(row[i]).toBe(1);
      row.forEach((v, j) => expect(v).toBe(m[j][i]));
    });
    expect(f.riskFactors.find((r) => r.factor === "USDEUR")!.kind).toBe("exchange rate");
  });

  it("states the method, the limitations from every source, data quality, the run record and the caution", async () => {
    const { vm, runInputs } = await packFixture();
    expect(vm.method.version).toBe(3);
    // generated from the run's resolved model: the fixture's statement is EWMA λ 0.94 for every factor
    expect(vm.method.sentences[0]).toMatch(/^Volatility of each risk factor, as fitted for these figures: EWMA, λ = 0\.94, zero mean for INST\d{4}(, INST\d{4})* and \d+ more \(each factor is listed in the method annex\)\.$/);
    expect(vm.method.models?.map((m) => m.factor).sort()).toEqual([...vm.figures.riskFactors.map((f) => f.factor)].sort());
    expect(new Set(vm.limitations.map((l) => l.source))).toEqual(new Set(["engine", "backtest", "method statement"]));
    expect(vm.dataQuality.items.map((i) => i.check)).toEqual(expect.arrayContaining(["no-history", "stale", "market-value-mismatch"]));
    expect(vm.engine.inputHashes.map((h) => h.name)).toEqual(["capitalProfile", "combined", "method", "positions", "prices"]);
    expect(vm.engine.runId).toBe("run_fixture_0001");
    expect(vm.engine.startedBy).toBe("Priya Castell");
    expect(vm.period.end).toBe(runInputs.periodEnd);
    expect(vm.caution).toBe(DRAFT_CAUTION);
    expect(vm.signOff).toBeNull();
  });
});

describe("buildFilingViewModel refuses pieces that disagree", () => {
  it("a firm reporting in another currency than the run", async () => {
    const { input } = await packFixture();
    expect(() => buildFilingViewModel({ ...input, firm: { ...input.firm, reportingCurrency: "GBP" } })).toThrow("The run is in EUR but the firm reports in GBP.");
  });

  it("an explanation for a day that is not an exception", async () => {
    const { input } = await packFixture();
    const filing = { ...input.filing, exceptionExplanations: { ...input.filing.exceptionExplanations, "2024-12-25": "Holiday." } };
    expect(() => buildFilingViewModel({ ...input, filing })).toThrow("There is an explanation for 2024-12-25, which is not a backtest exception of this run.");
  });

  it("a correlation matrix that is not one row and column per factor, and a signature without a SHA-256", async () => {
    const { input } = await packFixture();
    const bad: FilingPackInput = { ...input, correlation: { factors: ["A", "B"], matrix: [[1, 0]], basis: "x" } };
    expect(() => buildFilingViewModel(bad)).toThrow("The correlation matrix must be 2 × 2");
    expect(() => buildFilingViewModel({ ...input, signature: { signerName: "Helen Marsh", licenceReference: "X", signedAt: "2026-12-03T15:42:00.000Z", contentHash: "abc" } })).toThrow("SHA-256");
  });

  it("reads the correlation and the day-by-day backtest the run stored when the caller passes no correlation", async () => {
    const { run, input, runInputs } = await packFixture();
    const stored = run.results!.monthEnd;
    expect(stored.correlation).toBeDefined();
    const own = filingInputFromRun({ run, method: { rationale: "", limitations: [] }, firm: input.firm, period: input.period, filing: input.filing });
    expect(own.correlation).toEqual(stored.correlation);
    expect(own.backtestSeries!.dates).toEqual(stored.backtestSeries!.dates);
    expect(own.backtestSeries!.var).toEqual(stored.backtestSeries!.var);
    // the stored matrix is the one recomputing from the stored inputs gives (same arithmetic: equal to rounding)
    const again = correlationFromRunInputs(runInputs);
    expect(own.correlation!.factors).toEqual(again.factors);
    own.correlation!.matrix.forEach((row, i) => row.forEach((v, j) => expect(v).toBeCloseTo(again.matrix[i][j], 12)));
    // a run stored before the engine returned them: no stored correlation, the series lib/runs derived
    const { correlation: _c, backtestSeries: _b, ...older } = stored;
    const old = filingInputFromRun({ run: { ...run, results: { ...run.results!, monthEnd: older } }, method: { rationale: "", limitations: [] }, firm: input.firm, period: input.period, filing: input.filing });
    expect(old.correlation).toBeNull();
    expect(old.backtestSeries!.dates).toEqual(run.results!.backtestSeries.dates);
  });

  it("a run without results", async () => {
    const { run, input } = await packFixture();
    expect(() =>
      filingInputFromRun({ run: { ...run, results: null }, method: { rationale: "", limitations: [] }, firm: input.firm, period: input.period, filing: input.filing }),
    ).toThrow("Run run_fixture_0001 has no results: only a completed run can be filed.");
  });
});
