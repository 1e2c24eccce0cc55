import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import { fitGarch11 } from "@/lib/risk";
import { FIXTURES, readSeries, relErr } from "./volatility-fixtures";

// Issue 13 (12): standard errors come from a central-difference Hessian of the analytic gradient, whose error is of
// the order of the step squared, so they no longer drift with the step as a forward difference did (0.1–0.2 % on a
// badly conditioned Student-t fit). Checked three ways: step-insensitivity (common practice, no source); R's fGarch
// (committed fixture fgarch-reference.json, see fgarch-oracle.test.ts); the DEM/GBP standard errors of Fiorentini,
// Calzolari & Panattoni (1996), "Analytic derivatives and the computation of GARCH estimates", J. Applied
// Econometrics 11, the benchmark of McCullough & Renfro (1999), FROM MEMORY (so a loose 5 % check only).
const reference = JSON.parse(readFileSync(path.join(FIXTURES, "fgarch-reference.json"), "utf8")) as Record<string, { file: string; distribution: "normal" | "t"; mean: "fit" | "zero"; standardErrors: Record<string, number> }>;

describe("GARCH(1,1) standard errors by central differences", () => {
  for (const name of ["sim-t", "sim-normal", "dem2gbp-normal"]) {
    it(`${name}: second-order in the step, the default step within 1e−6 of a finer one, within 2 % of fGarch`, () => {
      const e = reference[name];
      const x = readSeries(e.file);
      const se = (h?: number) => fitGarch11(x, { mean: e.mean, distribution: e.distribution, ...(h ? { hessianStep: h } : {}) }).standardErrors!;
      const coarse = se(1e-4), fine = se(1e-6), used = se();
      const gap = (a: Record<string, number>) => Math.max(...Object.keys(e.standardErrors).map((p) => relErr(a[p], fine[p])));
      // a central difference's error shrinks with the step squared: 10× smaller step, about 100× smaller error
      // (a forward difference would give about 10×); the default relative step is 1e−5
      const ratio = gap(coarse) / gap(used);
      expect(ratio).toBeGreaterThan(30);
      expect(ratio).toBeLessThan(300);
      expect(gap(used)).toBeLessThan(1e-6);
      for (const p of Object.keys(e.standardErrors)) expect(relErr(used[p], e.standardErrors[p]), `${p} fGarch`).toBeLessThan(0.02); // fGarch fixture
    });
  }

  it("DEM/GBP: the published standard errors (from memory, 5 %)", () => {
    const se = fitGarch11(readSeries("dem2gbp.csv"), { mean: "fit" }).standardErrors!;
    // μ 0.00846, ω 0.00285, α 0.0265, β 0.0336: Fiorentini, Calzolari & Panattoni (1996), from memory
    expect(relErr(se.mu, 0.00846)).toBeLessThan(0.05);
    expect(relErr(se.omega, 0.00285)).toBeLessThan(0.05);
    expect(relErr(se.alpha, 0.0265)).toBeLessThan(0.05);
    expect(relErr(se.beta, 0.0336)).toBeLessThan(0.05);
  });
});
