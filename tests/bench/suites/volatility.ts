/**
 * Volatility engine benchmarks (one JSON line each):
 *   garch11-fit-dem2gbp  median ms of one DEM/GBP GARCH(1,1) fit (constant mean, normal), after warm-up
 *   garch11-fit-50x1000  median total ms of fifty 1,000-observation GARCH(1,1) fits on seeded simulated series
 *   ewma-ma-1000x2500    median ms of EWMA (λ = 0.94) and a 20-day moving average over 1,000 series × 2,500 days
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { emit, median } from "../emit";
import { ewmaVariance, fitGarch11, movingAverageVariance, mulberry32, normalSampler, simulateGarch11 } from "../../../lib/risk";

const now = () => performance.now();

// 1. DEM/GBP
const dem = readFileSync(path.join(__dirname, "../../reference/fixtures/dem2gbp.csv"), "utf8").trim().split(/\r?\n/).slice(1).map(Number);
for (let i = 0; i < 100; i++) fitGarch11(dem, { mean: "fit" });
const demTimes: number[] = [];
let demFit = fitGarch11(dem, { mean: "fit" });
for (let i = 0; i < 300; i++) { const t0 = now(); demFit = fitGarch11(dem, { mean: "fit" }); demTimes.push(now() - t0); }
emit({
  name: "garch11-fit-dem2gbp", value: +median(demTimes).toFixed(4), unit: "ms", runs: demTimes.length, target: 1.5,
  logLikelihood: demFit.logLikelihood, evaluations: demFit.diagnostics.evaluations, note: "includes Hessian and sandwich standard errors",
});

// 2. fifty simulated series of 1,000
const rng = mulberry32(20240501);
const draw = normalSampler(rng);
const series = Array.from({ length: 50 }, (_, i) => simulateGarch11(draw, { omega: 0.02 + 0.001 * (i % 5), alpha: 0.05 + 0.01 * (i % 6), beta: 0.88 + 0.005 * (i % 4) }, 1000));
for (let r = 0; r < 3; r++) for (const s of series) fitGarch11(s, { mean: "fit" });
const batchTimes: number[] = [];
let evaluations = 0;
for (let r = 0; r < 9; r++) {
  const t0 = now();
  evaluations = 0;
  for (const s of series) evaluations += Number(fitGarch11(s, { mean: "fit" }).diagnostics.evaluations);
  batchTimes.push(now() - t0);
}
emit({ name: "garch11-fit-50x1000", value: +median(batchTimes).toFixed(3), unit: "ms", runs: batchTimes.length, target: 35, evaluationsPerFit: evaluations / 50 });

// 3. EWMA and MA over 1,000 series × 2,500 days
const big = Array.from({ length: 1000 }, () => { const a = new Float64Array(2500); for (let t = 0; t < 2500; t++) a[t] = 0.01 * draw(); return a; });
const filter = (): number => {
  let check = 0;
  for (const s of big) {
    let v0 = 0;
    for (let t = 0; t < s.length; t++) v0 += s[t] * s[t];
    check += ewmaVariance(s, 0.94, v0 / s.length).currentVariance;
    check += movingAverageVariance(s, { window: 20, divisor: "m", mean: "zero" }).currentVariance;
  }
  return check;
};
for (let r = 0; r < 3; r++) filter();
const filterTimes: number[] = [];
for (let r = 0; r < 9; r++) { const t0 = now(); filter(); filterTimes.push(now() - t0); }
emit({ name: "ewma-ma-1000x2500", value: +median(filterTimes).toFixed(3), unit: "ms", runs: filterTimes.length, target: 100, note: "full variance paths, EWMA started at the sample mean square, MA window 20" });
