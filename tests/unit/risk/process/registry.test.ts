import { describe, expect, it } from "vitest";
import { mulberry32, normalSampler, simulateGarch11 } from "@/lib/risk/random";
import { fitGarch11 } from "@/lib/risk/estimators/garch11";
import { fitEwma } from "@/lib/risk/estimators/ewma";
import { fitArch } from "@/lib/risk/estimators/arch";
import { fitMovingAverage } from "@/lib/risk/estimators/moving-average";
import { checkSpec, filterFit, fitProcess, forecastFit, minimumReturns, parameterNames, resolveSpec, specLabel, VOLATILITY_KINDS } from "@/lib/risk/process/registry";
import type { VolatilitySpec } from "@/lib/risk/process/types";

const returns = Array.from(simulateGarch11(normalSampler(mulberry32(4)), { omega: 2e-6, alpha: 0.08, beta: 0.9 }, 800));

describe("the volatility-process registry", () => {
  it("fits each family exactly as its estimator does (same numbers)", () => {
    const cases: [VolatilitySpec, () => { params: Record<string, number>; currentVariance: number }][] = [
      [{ kind: "ma", window: 20 }, () => fitMovingAverage(returns, { window: 20 })],
      [{ kind: "ewma", lambda: 0.94 }, () => fitEwma(returns, { lambda: 0.94 })],
      [{ kind: "ewma", lambda: 0.94, fit: true }, () => fitEwma(returns, { lambda: "fit" })],
      [{ kind: "arch", order: 3 }, () => fitArch(returns, { order: 3 })],
      [{ kind: "garch" }, () => fitGarch11(returns)],
      [{ kind: "garch", distribution: "t", mean: "fit" }, () => fitGarch11(returns, { distribution: "t", mean: "fit" })],
    ];
    for (const [spec, direct] of cases) {
      const a = fitProcess(returns, spec);
      const b = direct();
      expect(a.params, spec.kind).toEqual(b.params);
      expect(a.nextVariance).toBe(b.currentVariance);
    }
  });

  it("the filter with the fit's parameters reproduces the fit's own path", () => {
    for (const spec of [{ kind: "ewma", lambda: 0.97 }, { kind: "garch" }, { kind: "ma", window: 30 }] as VolatilitySpec[]) {
      const fit = fitProcess(returns, spec);
      const path = filterFit(fit, returns);
      expect(path.length).toBe(returns.length + 1);
      expect(path[returns.length]).toBe(fit.nextVariance);
      for (let t = 40; t < returns.length; t++) expect(path[t]).toBe(fit.variance[t]);
    }
  });

  it("the start-up of the filter uses only the returns before initEnd", () => {
    const fit = fitProcess(returns.slice(0, 500), { kind: "ewma", lambda: 0.94 });
    const changed = [...returns];
    for (let t = 600; t < 800; t++) changed[t] *= 3;
    const a = filterFit(fit, returns, 500);
    const b = filterFit(fit, changed, 500);
    for (let t = 0; t <= 600; t++) expect(a[t]).toBe(b[t]);
  });

  it("labels, parameter names, minimum history and forecasts from one place", () => {
    expect(specLabel({ kind: "garch", distribution: "t" })).toBe("GARCH(1,1), Student-t errors, zero mean");
    expect(specLabel({ kind: "ewma", lambda: 0.97 })).toBe("EWMA, λ = 0.97, zero mean");
    expect(specLabel({ kind: "ewma", lambda: 0.95, fit: true }, { lambda: 0.9312 })).toBe("EWMA, λ fitted = 0.9312 (starting value 0.95), zero mean");
    expect(parameterNames({ kind: "arch", order: 2 })).toEqual(["omega", "alpha1", "alpha2"]);
    expect(parameterNames({ kind: "garch", mean: "fit", distribution: "t" })).toEqual(["mu", "omega", "alpha", "beta", "nu"]);
    expect(minimumReturns({ kind: "arch", order: 5 })).toBe(150);
    expect(minimumReturns({ kind: "ma", window: 250 })).toBe(250);
    expect(resolveSpec({ kind: "garch" })).toEqual({ kind: "garch", distribution: "normal", mean: "zero", targeting: false, fallback: "none", init: "sample" });
    const g = fitProcess(returns, { kind: "garch" });
    const f = forecastFit(g, 5);
    expect(f[0]).toBe(g.nextVariance);
    expect(f[1]).toBeCloseTo(g.params.omega + (g.params.alpha + g.params.beta) * g.nextVariance, 18);
    const e = forecastFit(fitProcess(returns, { kind: "ewma", lambda: 0.94 }), 3);
    expect(new Set(e).size).toBe(1);
    expect(VOLATILITY_KINDS).toEqual(["ma", "ewma", "arch", "garch"]);
  });

  it("the λ starting value of a fitted EWMA is used, and reported", () => {
    const a = fitProcess(returns, { kind: "ewma", lambda: 0.8, fit: true });
    expect(a.fit.diagnostics.startingValue).toBe(0.8);
    const b = fitProcess(returns, { kind: "ewma", lambda: 0.94, fit: true });
    expect(a.params.lambda).toBeCloseTo(b.params.lambda, 5); // the same optimum from either start
  });

  it("a GARCH fallback reports the EWMA that produced the numbers, with its own λ", () => {
    const flat = Array.from({ length: 300 }, (_, i) => (i % 2 ? 0.01 : -0.01) * (1 + 0.001 * (i % 7)));
    const fit = fitProcess(flat, { kind: "garch", fallback: "ewma", fallbackLambda: 0.97 });
    if (fit.fallback) {
      expect(fit.process).toBe("ewma");
      expect(fit.used).toMatchObject({ kind: "ewma", lambda: 0.97 });
      expect(fit.label).toMatch(/fallback from GARCH/);
    } else expect(fit.process).toBe("garch");
  });

  it("refuses a malformed spec naming the setting", () => {
    expect(() => checkSpec({ kind: "ewma", lambda: 1.2 })).toThrow(/λ must be between 0 and 1/);
    expect(() => checkSpec({ kind: "arch", order: 0 })).toThrow(/order/);
    expect(() => checkSpec({ kind: "ma", window: 1 })).toThrow(/window/);
    expect(() => checkSpec({ kind: "nope" } as unknown as VolatilitySpec)).toThrow(/unknown volatility process/);
  });

  it("warm-started lean refits reach the cold fit's optimum", () => {
    const cold = fitGarch11(returns.slice(0, 700));
    const warm = fitGarch11(returns.slice(0, 700), { warmStart: fitGarch11(returns).params, lean: true });
    for (const k of ["omega", "alpha", "beta"]) expect(Math.abs(warm.params[k] - cold.params[k]) / cold.params[k]).toBeLessThan(1e-4);
    expect(warm.standardErrors).toBeUndefined();
    expect(Math.abs(warm.logLikelihood! - cold.logLikelihood!)).toBeLessThan(1e-6);
  });
});
