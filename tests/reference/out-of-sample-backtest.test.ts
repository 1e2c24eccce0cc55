import { describe, expect, it } from "vitest";
import { runMonthEnd } from "@/lib/risk/portfolio/run-month-end";
import { fitGarch11, garch11Variance } from "@/lib/risk/estimators/garch11";
import { ewmaCovariance } from "@/lib/risk/portfolio/covariance";
import { covarianceToCorrelation } from "@/lib/risk/portfolio/matrix";
import { bookInput, syntheticBook } from "@/tests/unit/risk/portfolio/synthetic-book";

// The out-of-sample backtest of a GARCH(1,1) book against a plain loop written from the stated rule (issue 13):
// parameters re-estimated every N business days counting back from the as-of date, each fit on the data before its
// refit day and warm-started from the next later fit (its parameters and its optimiser's inverse Hessian); each day's variance is the GARCH recursion run on the returns
// before that day with the refit's parameters (start-up: the mean of the squared returns before the refit day); the
// correlation is EWMA λ = 0.94 of the returns before that day; VaR = z·σ_p. Common practice, no outside source: this
// checks the engine does what its statement says.

describe("out-of-sample GARCH backtest = a plain loop that refits on the stated schedule", () => {
  it("three GARCH(1,1) factors, EWMA correlation, refits every 21 days", () => {
    const book = syntheticBook(3, 520, 9, 17);
    const N = 21;
    const r = runMonthEnd(
      bookInput(book, { methods: ["parametric"], confidences: [0.99], horizonDays: 1, backtestDays: 60, historyDays: 60, stressWindowDays: 100,
        volatility: { default: { kind: "garch" } }, correlation: { kind: "ewma", lambda: 0.94 }, backtestRefit: { mode: "rolling", everyDays: N } }),
    );
    const ids = r.factors.used;
    const L = r.sample.days;
    const returns = ids.map((id) => Float64Array.from(book.returns.factors[id] as ArrayLike<number>).subarray(book.returns.dates.length - L));
    const exposures = ids.map((id) => r.methods[0].byConfidence[0].byFactor.find((f) => f.factor === id)!.exposure);
    // the fits, latest first: τ = L (a plain fit), L − 21, … each warm-started from the next later one
    const from = L - 60;
    const fits = new Map<number, { omega: number; alpha: number; beta: number }[]>();
    // (the warm start is the later fit's parameters and its optimiser's inverse Hessian)
    let later = ids.map((_, i) => fitGarch11(returns[i]));
    fits.set(L, later.map(({ params: p }) => ({ omega: p.omega, alpha: p.alpha, beta: p.beta })));
    for (let tau = L - N; tau > from - N; tau -= N) {
      const now = ids.map((_, i) => fitGarch11(returns[i].subarray(0, tau), { warmStart: later[i].params, warmInverseHessian: later[i].optimizerInverseHessian, lean: true }));
      fits.set(tau, now.map(({ params: p }) => ({ omega: p.omega, alpha: p.alpha, beta: p.beta })));
      later = now;
    }
    const z = 2.3263478740408408; // Φ⁻¹(0.99), standard normal tables (e.g. Abramowitz & Stegun 1964, ch. 26)
    expect(r.backtestSeries!.dates).toHaveLength(60);
    for (let n = 0; n < 60; n++) {
      const s = from + n;
      const tau = L - N * Math.ceil((L - s) / N);
      const params = fits.get(tau)!;
      const w = ids.map((_, i) => {
        const p = params[i];
        let b = 0;
        for (let t = 0; t < tau; t++) b += returns[i][t] * returns[i][t];
        b /= tau;
        const h = garch11Variance(returns[i].subarray(0, s), p, p.omega + (p.alpha + p.beta) * b).currentVariance;
        return exposures[i] * Math.sqrt(h);
      });
      const R = covarianceToCorrelation(ewmaCovariance(returns.map((x) => x.subarray(0, s)), 0.94, { startupDays: 30 })).correlation;
      let v = 0;
      for (let i = 0; i < ids.length; i++) for (let j = 0; j < ids.length; j++) v += w[i] * w[j] * R.values[i * ids.length + j];
      const expected = z * Math.sqrt(v);
      expect(Math.abs(r.backtestSeries!.var[n] - expected) / expected).toBeLessThan(1e-9);
      expect(r.backtestSeries!.dates[n]).toBe(book.returns.dates[book.returns.dates.length - L + s]);
    }
    expect(r.model!.backtest.refit).toEqual({ mode: "rolling", everyDays: N });
    expect(r.model!.backtest.limitation).toBeNull();
  });

  it("full-sample is an explicit choice and states its limitation", () => {
    const book = syntheticBook(2, 400, 4, 3);
    const r = runMonthEnd(bookInput(book, { methods: ["parametric"], backtestDays: 60, stressWindowDays: 100, volatility: { default: { kind: "garch" } }, backtestRefit: { mode: "full-sample" } }));
    expect(r.model!.backtest.limitation).toMatch(/in-sample/);
    expect(r.limitations.join(" ")).toMatch(/in-sample/);
  });
});
