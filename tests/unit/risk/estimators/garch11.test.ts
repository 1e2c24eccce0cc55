import { describe, expect, it } from "vitest";
import { fitGarch11, garch11Variance, mulberry32, normalSampler, simulateGarch11, studentTSampler } from "@/lib/risk";
import { garch11LogLikelihood, type Garch11Problem } from "@/lib/risk/estimators/garch11-likelihood";
import { backcastWeights } from "@/lib/risk/estimators/initial-variance";

/** The slow, obvious loop: the benchmark conventions written out with plain arrays and no tricks. */
function plainGarchLogLikelihood(x: number[], mu: number, omega: number, alpha: number, beta: number): { ll: number; h: number[] } {
  const e = x.map((v) => v - mu);
  const meanSquare = e.reduce((s, v) => s + v * v, 0) / e.length;
  const h: number[] = [];
  let ll = 0;
  for (let t = 0; t < e.length; t++) {
    const prevE2 = t === 0 ? meanSquare : e[t - 1] ** 2; // e₀² = Σe²/T
    const prevH = t === 0 ? meanSquare : h[t - 1]; // h₀ = Σe²/T
    h.push(omega + alpha * prevE2 + beta * prevH);
    ll += -0.5 * (Math.log(2 * Math.PI) + Math.log(h[t]) + (e[t] * e[t]) / h[t]);
  }
  return { ll, h };
}

/** Plain Student-t (unit variance) log density, written from the formula. */
function plainStdT(e: number, h: number, nu: number): number {
  const lg = (z: number) => { // ln Γ by Stirling with shift, accurate enough for a cross-check at 1e-9
    let s = 0; while (z < 20) { s -= Math.log(z); z += 1; }
    return s + (z - 0.5) * Math.log(z) - z + 0.5 * Math.log(2 * Math.PI) + 1 / (12 * z) - 1 / (360 * z ** 3) + 1 / (1260 * z ** 5);
  };
  return lg((nu + 1) / 2) - lg(nu / 2) - 0.5 * Math.log(Math.PI * (nu - 2) * h) - ((nu + 1) / 2) * Math.log(1 + (e * e) / ((nu - 2) * h));
}

const draw = normalSampler(mulberry32(2024));
const sim = Array.from(simulateGarch11(draw, { omega: 0.02, alpha: 0.08, beta: 0.9, mu: 0.05 }, 1500));

describe("GARCH(1,1) likelihood against a plain loop (second oracle)", () => {
  const problem: Garch11Problem = { x: Float64Array.from(sim), fitMean: true, studentT: false, targeting: false, init: { kind: "backcast", weights: backcastWeights("sample", sim.length)! } };

  it("the fast likelihood and the variance kernel match the plain loop", () => {
    for (const [mu, omega, alpha, beta] of [[0.05, 0.02, 0.08, 0.9], [0, 0.1, 0.2, 0.5], [-0.1, 0.01, 0.01, 0.98]]) {
      const plain = plainGarchLogLikelihood(sim, mu, omega, alpha, beta);
      expect(garch11LogLikelihood(problem, [mu, omega, alpha, beta])).toBeCloseTo(plain.ll, 8);
      const e = sim.map((v) => v - mu);
      const fast = garch11Variance(e, { omega, alpha, beta }, plain.h[0]);
      for (let t = 0; t < e.length; t++) expect(fast.variance[t]).toBeCloseTo(plain.h[t], 12);
    }
  });

  it("the Student-t likelihood matches a plain loop", () => {
    const p: Garch11Problem = { ...problem, studentT: true };
    const [mu, omega, alpha, beta, nu] = [0.03, 0.02, 0.09, 0.88, 6.5];
    const { h } = plainGarchLogLikelihood(sim, mu, omega, alpha, beta);
    const plain = sim.reduce((s, x, t) => s + plainStdT(x - mu, h[t], nu), 0);
    expect(garch11LogLikelihood(p, [mu, omega, alpha, beta, nu])).toBeCloseTo(plain, 7);
  });

  it("the analytic gradient matches central differences, for every option combination", () => {
    for (const fitMean of [true, false]) for (const studentT of [false, true]) for (const targeting of [false, true]) for (const init of ["sample", "backcast", "unconditional"] as const) {
      const p: Garch11Problem = { x: Float64Array.from(sim), fitMean, studentT, targeting, init: init === "unconditional" ? { kind: "unconditional" } : { kind: "backcast", weights: backcastWeights(init, sim.length)! } };
      const theta = [...(fitMean ? [0.04] : []), ...(targeting ? [] : [0.03]), 0.1, 0.85, ...(studentT ? [7] : [])];
      const g = new Float64Array(theta.length);
      garch11LogLikelihood(p, theta, g);
      for (let i = 0; i < theta.length; i++) {
        const step = 1e-6 * Math.max(1, Math.abs(theta[i]));
        const up = theta.slice(); up[i] += step;
        const dn = theta.slice(); dn[i] -= step;
        const numeric = (garch11LogLikelihood(p, up) - garch11LogLikelihood(p, dn)) / (2 * step);
        expect(Math.abs(g[i] - numeric), `${fitMean} ${studentT} ${targeting} ${init} param ${i}`).toBeLessThan(1e-4 * Math.max(1, Math.abs(numeric)));
      }
    }
  });
});

describe("fitGarch11", () => {
  it("recovers the parameters of a long simulated series (seeded)", () => {
    const long = simulateGarch11(normalSampler(mulberry32(99)), { omega: 0.02, alpha: 0.08, beta: 0.9 }, 8000);
    const fit = fitGarch11(long);
    expect(fit.params.alpha).toBeGreaterThan(0.06);
    expect(fit.params.alpha).toBeLessThan(0.1);
    expect(fit.params.beta).toBeGreaterThan(0.87);
    expect(fit.params.beta).toBeLessThan(0.93);
    expect(fit.diagnostics.converged).toBe(true);
  });

  it("scales with the units: decimals give μ and ω scaled and α, β, log-likelihood shifted exactly", () => {
    const pct = fitGarch11(sim, { mean: "fit" });
    const dec = fitGarch11(sim.map((v) => v / 100), { mean: "fit" });
    expect(dec.params.alpha).toBeCloseTo(pct.params.alpha, 6);
    expect(dec.params.beta).toBeCloseTo(pct.params.beta, 6);
    expect(dec.params.omega * 1e4).toBeCloseTo(pct.params.omega, 7);
    expect(dec.params.mu * 100).toBeCloseTo(pct.params.mu, 7);
    expect(dec.logLikelihood!).toBeCloseTo(pct.logLikelihood! + sim.length * Math.log(100), 5);
  });

  it("fits Student-t errors with ν near the simulated value", () => {
    const x = simulateGarch11(studentTSampler(mulberry32(5), 5), { omega: 0.02, alpha: 0.1, beta: 0.85 }, 6000);
    const fit = fitGarch11(x, { distribution: "t" });
    expect(fit.params.nu).toBeGreaterThan(4);
    expect(fit.params.nu).toBeLessThan(6.5);
    expect(fit.standardErrors!.nu).toBeGreaterThan(0);
  });

  it("variance targeting sets ω = (1−α−β)·mean(e²) and frees no ω", () => {
    const fit = fitGarch11(sim, { mean: "fit", targeting: true });
    const e = sim.map((v) => v - fit.params.mu);
    const v = e.reduce((s, x) => s + x * x, 0) / e.length;
    expect(fit.params.omega).toBeCloseTo((1 - fit.params.alpha - fit.params.beta) * v, 12);
    expect(fit.standardErrors!.omega).toBeUndefined();
    expect(fit.longRunVariance).toBeCloseTo(v, 12);
  });

  it("reports robust standard errors and the current variance as the next day's forecast", () => {
    const fit = fitGarch11(sim);
    expect(Object.keys(fit.robustStandardErrors!)).toEqual(["omega", "alpha", "beta"]);
    const last = sim[sim.length - 1];
    expect(fit.currentVariance).toBeCloseTo(fit.params.omega + fit.params.alpha * last * last + fit.params.beta * fit.variance[sim.length - 1], 14);
  });

  it("says plainly when the fit is near-integrated, and uses the EWMA fallback only when the caller chose it", () => {
    // an integrated process: EWMA-like variance with no reversion
    const d = normalSampler(mulberry32(11));
    const x: number[] = [];
    let h = 1;
    for (let t = 0; t < 3000; t++) { const e = Math.sqrt(h) * d(); x.push(e); h = 0.95 * h + 0.05 * e * e; }
    const plain = fitGarch11(x);
    expect(plain.kind).toBe("garch");
    const warning = plain.warnings.find((w) => w.code === "near-integrated");
    expect(warning?.message).toMatch(/no fallback/);
    const fb = fitGarch11(x, { fallback: "ewma" });
    expect(fb.kind).toBe("ewma");
    expect(fb.params.lambda).toBe(0.94);
    expect(fb.fallbackFrom?.kind).toBe("garch");
    expect(fb.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(["near-integrated", "fallback-used"]));
  });

  it("warns on short history and heavy tails", () => {
    const x = Array.from(simulateGarch11(studentTSampler(mulberry32(3), 4), { omega: 0.05, alpha: 0.1, beta: 0.8 }, 300));
    const codes = fitGarch11(x).warnings.map((w) => w.code);
    expect(codes).toContain("short-history");
    expect(codes).toContain("heavy-tails");
  });

  it("refuses too few returns in simple-statistics' wording, and impossible options", () => {
    expect(() => fitGarch11(sim.slice(0, 99))).toThrow("fitGarch11 requires at least 100 returns");
    expect(() => fitGarch11([...sim.slice(0, 200), NaN])).toThrow(/finite/);
    expect(() => fitGarch11(Array(200).fill(0.01), { mean: "fit" })).toThrow(/not all equal/);
    expect(() => fitGarch11(sim, { init: -1 })).toThrow(RangeError);
    expect(() => garch11Variance([0.1], { omega: -1, alpha: 0.1, beta: 0.8 }, 1)).toThrow(RangeError);
  });

  it("is deterministic", () => {
    expect(fitGarch11(sim, { mean: "fit" }).params).toEqual(fitGarch11(sim, { mean: "fit" }).params);
  });
});
