/**
 * Estimator comparison on one series: fit each estimator on an estimation window, then score its
 * one-day-ahead variance forecasts over the following evaluation window (parameters held fixed, the
 * filter run on the data before each day only).
 */
import { filterFit, fitProcess, parameterNames } from "./process/registry";
import type { VolatilitySpec } from "./process/types";
import { ENGINE_VERSION } from "./version";

/** Options of compareEstimators. */
export interface CompareOptions {
  /** returns used to fit (default: all before the evaluation window) */
  estimationDays?: number;
  /** returns scored out of sample (default: the last 250, or a quarter of the data if fewer than 1,000) */
  evaluationDays?: number;
}

/** The scores of one estimator. */
export interface EstimatorScore {
  id: string;
  label: string;
  params: Record<string, number>;
  /** mean of (r² − σ²)² over the evaluation window */
  mse: number;
  /** mean of ln σ² + r²/σ² over the evaluation window (lower is better) */
  qlike: number;
  /** out-of-sample Gaussian log-likelihood of the evaluation returns */
  outOfSampleLogLikelihood: number;
  /** in-sample AIC and BIC where a likelihood is defined, else null */
  aic: number | null;
  bic: number | null;
  /** days the return fell below −2.326348·σ (normal 99 % one-day VaR) */
  varExceptions: number;
  warnings: string[];
}

/** The comparison result, ranked by QLIKE. */
export interface CompareResult {
  n: number;
  estimationDays: number;
  evaluationDays: number;
  /** z of the 99 % one-day VaR used for exception counts (normal quantile for every estimator) */
  varZ: number;
  expectedExceptions: number;
  ranking: EstimatorScore[];
  failed: { id: string; label: string; error: string }[];
  /** one sentence reading the result */
  reading: string;
  notes: string[];
  engineVersion: string;
}

const Z99 = 2.326348; // Φ⁻¹(0.99), standard normal tables
const LN_2PI = Math.log(2 * Math.PI);

interface Candidate {
  id: string;
  label: string;
  minEstimation: number;
  spec: VolatilitySpec;
}

const candidates: Candidate[] = [
  { id: "ma-20", label: "20-day moving average", minEstimation: 20, spec: { kind: "ma", window: 20 } },
  { id: "ma-250", label: "250-day moving average", minEstimation: 250, spec: { kind: "ma", window: 250 } },
  { id: "ewma-0.94", label: "EWMA λ = 0.94", minEstimation: 2, spec: { kind: "ewma", lambda: 0.94 } },
  { id: "ewma-fit", label: "EWMA λ fitted", minEstimation: 50, spec: { kind: "ewma", lambda: 0.94, fit: true } },
  { id: "arch-5", label: "ARCH(5)", minEstimation: 150, spec: { kind: "arch", order: 5 } },
  { id: "garch-normal", label: "GARCH(1,1), normal errors", minEstimation: 100, spec: { kind: "garch" } },
  { id: "garch-t", label: "GARCH(1,1), Student-t errors", minEstimation: 100, spec: { kind: "garch", distribution: "t" } },
];

/** Parameters a spec estimates from the data (none for the moving average and a fixed λ). */
function estimated(spec: VolatilitySpec): number {
  if (spec.kind === "ma" || (spec.kind === "ewma" && !spec.fit)) return 0;
  return parameterNames(spec).length;
}

/**
 * Compare the moving averages, EWMA, ARCH(5) and GARCH(1,1) on one series of returns (zero mean for all).
 * @throws {RangeError} if the windows do not fit the data or the estimation window is under 100 returns
 */
export function compareEstimators(returns: ArrayLike<number>, options: CompareOptions = {}): CompareResult {
  const all = Array.from(returns);
  const n = all.length;
  for (let i = 0; i < n; i++) if (!Number.isFinite(all[i])) throw new RangeError(`compareEstimators requires finite returns: return ${i} is ${all[i]}`);
  const evaluationDays = options.evaluationDays ?? (n >= 1000 ? 250 : Math.floor(n / 4));
  const estimationDays = options.estimationDays ?? n - evaluationDays;
  if (!(Number.isInteger(evaluationDays) && evaluationDays >= 20)) throw new RangeError("compareEstimators requires an evaluation window of at least 20 returns");
  if (!(Number.isInteger(estimationDays) && estimationDays >= 100)) throw new RangeError("compareEstimators requires an estimation window of at least 100 returns");
  if (estimationDays + evaluationDays > n) throw new RangeError(`compareEstimators requires at least ${estimationDays + evaluationDays} returns (estimation ${estimationDays} + evaluation ${evaluationDays}); there are ${n}`);
  const start = n - evaluationDays;
  const est = all.slice(start - estimationDays, start);
  const used = all.slice(start - estimationDays);
  const evalOffset = estimationDays;
  const ranking: EstimatorScore[] = [];
  const failed: CompareResult["failed"] = [];
  const notes: string[] = [];
  for (const c of candidates) {
    if (estimationDays < c.minEstimation) { notes.push(`${c.label} left out: it needs an estimation window of at least ${c.minEstimation} returns.`); continue; }
    try {
      // fit on the estimation window; the filter runs over all the returns with those parameters and the start-up
      // from the estimation window, so each evaluation day's forecast uses the data before it only
      const pf = fitProcess(est, c.spec);
      const fit = pf.fit;
      const variance = filterFit(pf, used, est.length);
      const k = estimated(c.spec);
      let se = 0, ql = 0, ll = 0, exceptions = 0;
      for (let t = evalOffset; t < used.length; t++) {
        const h = variance[t], r = used[t], r2 = r * r;
        se += (r2 - h) * (r2 - h);
        ql += Math.log(h) + r2 / h;
        ll -= 0.5 * (LN_2PI + Math.log(h) + r2 / h);
        if (r < -Z99 * Math.sqrt(h)) exceptions++;
      }
      const llIn = fit.logLikelihood;
      ranking.push({
        id: c.id, label: c.label, params: fit.params,
        mse: se / evaluationDays, qlike: ql / evaluationDays, outOfSampleLogLikelihood: ll,
        aic: llIn === null ? null : -2 * llIn + 2 * k, bic: llIn === null ? null : -2 * llIn + k * Math.log(estimationDays),
        varExceptions: exceptions,
        warnings: fit.warnings.map((w) => w.message),
      });
    } catch (error) {
      failed.push({ id: c.id, label: c.label, error: (error as Error).message });
    }
  }
  ranking.sort((a, b) => a.qlike - b.qlike);
  const expected = 0.01 * evaluationDays;
  const best = ranking[0];
  const byMse = [...ranking].sort((a, b) => a.mse - b.mse)[0];
  const reading = best
    ? `Over the ${evaluationDays}-day evaluation window, ${best.label} gave the best one-day variance forecasts by QLIKE` +
      (ranking[1] ? `, ahead of ${ranking[1].label}` : "") +
      (byMse && byMse.id !== best.id ? ` (by mean squared error ${byMse.label} was best)` : "") +
      `, with ${best.varExceptions} exceptions of the 99 % VaR against ${expected.toFixed(1)} expected.`
    : "No estimator could be fitted on the estimation window.";
  notes.push("QLIKE is the mean of ln σ² + r²/σ²; mean squared error compares σ² with r², a noisy proxy of the true variance, so QLIKE is the primary ranking.");
  notes.push("Exceptions use the normal 99 % quantile 2.326348 for every estimator, zero mean.");
  return { n, estimationDays, evaluationDays, varZ: Z99, expectedExceptions: expected, ranking, failed, reading, notes, engineVersion: ENGINE_VERSION };
}
