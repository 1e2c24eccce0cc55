/**
 * ARCH(m) by Gaussian maximum likelihood: σ²ₜ = ω + Σᵢ αᵢ·u²ₜ₋ᵢ, zero mean, ω > 0, αᵢ ≥ 0, Σαᵢ < 1.
 */
import { archVariance } from "./arch-variance";
import { backcastWeights, backcastValue, checkInit, describeInit, type InitRule } from "./initial-variance";
import { minimizeMultiStart } from "../optimize/multi-start";
import { invertMatrix } from "../linalg";
import { standardisedMoments, kurtosisWarning, shortHistoryWarning } from "../fit-diagnostics";
import { LIMITATIONS } from "../limitations";
import { ENGINE_VERSION } from "../version";
import type { EngineWarning, VolatilityFit } from "../types";

export { archVariance } from "./arch-variance";

/** Options of fitArch. */
export interface FitArchOptions {
  /** number of lags m, 1 to 30 (default 1) */
  order?: number;
  /** start-up rule for pre-sample squared residuals (default "sample"); "unconditional" and fixed numbers do not apply */
  init?: "sample" | "backcast" | { firstReturns: number };
  /** parameters of an earlier fit (omega, alpha1..alpham, in the returns' units) to start from: one run, cold only if it fails */
  warmStart?: Record<string, number>;
}

/** Largest ARCH order fitArch accepts. */
export const ARCH_MAX_ORDER = 30;

const LN_2PI = Math.log(2 * Math.PI);

/** ARCH(m) Gaussian log-likelihood at (ω, α₁..α_m), writing the gradient when asked. −Infinity outside the domain. */
export function archLogLikelihood(x: ArrayLike<number>, theta: ArrayLike<number>, backcast: number, gradient?: Float64Array | null): number {
  const m = theta.length - 1;
  const omega = theta[0];
  if (!(omega > 0)) return -Infinity;
  for (let i = 1; i <= m; i++) if (!(theta[i] >= 0)) return -Infinity;
  if (gradient) gradient.fill(0);
  let ll = 0;
  for (let t = 0; t < x.length; t++) {
    let h = omega;
    for (let i = 1; i <= m; i++) { const j = t - i; h += theta[i] * (j >= 0 ? x[j] * x[j] : backcast); }
    const e2 = x[t] * x[t];
    ll -= 0.5 * (LN_2PI + Math.log(h) + e2 / h);
    if (gradient) {
      const lh = (0.5 * (e2 / h - 1)) / h;
      gradient[0] += lh;
      for (let i = 1; i <= m; i++) { const j = t - i; gradient[i] += lh * (j >= 0 ? x[j] * x[j] : backcast); }
    }
  }
  return ll;
}

/**
 * Fit ARCH(m) by Gaussian maximum likelihood with analytic gradients and BFGS from several starts.
 * @throws {RangeError} for an order outside 1..30; {Error} with fewer than 100 + 10·m returns
 */
export function fitArch(returns: ArrayLike<number>, options: FitArchOptions = {}): VolatilityFit {
  const m = options.order ?? 1;
  const init: InitRule = options.init ?? "sample";
  if (!(Number.isInteger(m) && m >= 1 && m <= ARCH_MAX_ORDER)) throw new RangeError(`fitArch requires an integer order from 1 to ${ARCH_MAX_ORDER}`);
  checkInit(init, "fitArch");
  if (typeof init === "number" || (init as InitRule) === "unconditional") throw new RangeError("fitArch requires a backcast start-up rule");
  const n = returns.length;
  const minimum = 100 + 10 * m;
  if (n < minimum) throw new Error(`fitArch requires at least ${minimum} returns for order ${m}`);
  for (let i = 0; i < n; i++) if (!Number.isFinite(returns[i])) throw new Error(`fitArch requires finite returns: return ${i} is ${returns[i]}`);
  let ss = 0;
  for (let i = 0; i < n; i++) ss += returns[i] * returns[i];
  const scale = Math.sqrt(ss / n);
  if (!(scale > 0)) throw new Error("fitArch requires returns that are not all zero");
  const xs = Float64Array.from(returns as ArrayLike<number>, (u) => u / scale);
  const weights = backcastWeights(init, n)!;
  const b = backcastValue(xs, weights, 0);
  const k = m + 1;
  const theta = new Float64Array(k);
  const gTheta = new Float64Array(k);
  // z → θ: ω = e^z₀; αᵢ = e^zᵢ / (1 + Σⱼ e^zⱼ), so every αᵢ > 0 and Σαᵢ < 1
  const toNatural = (z: ArrayLike<number>, out: Float64Array): void => {
    out[0] = Math.exp(z[0]);
    let d = 1;
    for (let i = 1; i < k; i++) { out[i] = Math.exp(z[i]); d += out[i]; }
    for (let i = 1; i < k; i++) out[i] /= d;
  };
  const objective = (z: Float64Array, gz: Float64Array): number => {
    toNatural(z, theta);
    const ll = archLogLikelihood(xs, theta, b, gTheta);
    if (!Number.isFinite(ll)) return Infinity;
    gz[0] = (-gTheta[0] * theta[0]) / n;
    let ag = 0;
    for (let i = 1; i < k; i++) ag += theta[i] * gTheta[i];
    for (let i = 1; i < k; i++) gz[i] = (-theta[i] * (gTheta[i] - ag)) / n;
    return -ll / n;
  };
  const starts = [0.5, 0.8, 0.2].map((total) => {
    const z = new Float64Array(k);
    z[0] = Math.log(1 - total);
    const raw = Array.from({ length: m }, (_, i) => m - i);
    const sum = raw.reduce((a, v) => a + v, 0);
    for (let i = 1; i < k; i++) z[i] = Math.log((total * raw[i - 1]) / sum / (1 - total));
    return z;
  });
  const bfgsOptions = { gradientTolerance: 1e-9, maxIterations: 500 };
  let best: ReturnType<typeof minimizeMultiStart> | null = null;
  const warm = options.warmStart;
  if (warm && warm.omega > 0) {
    const alphas = Array.from({ length: m }, (_, i) => warm[`alpha${i + 1}`]);
    const total = alphas.reduce((a, v) => a + v, 0);
    if (alphas.every((a) => a > 0) && total < 1) {
      const z = new Float64Array(k);
      z[0] = Math.log(warm.omega / (scale * scale));
      for (let i = 1; i < k; i++) z[i] = Math.log(alphas[i - 1] / (1 - total));
      try {
        const run = minimizeMultiStart(objective, [z], { ...bfgsOptions, runs: 1 });
        if (run.converged) best = run;
      } catch {
        best = null;
      }
    }
  }
  best ??= minimizeMultiStart(objective, starts, { ...bfgsOptions, runs: 2 });
  // a lag driven to zero in the unconstrained coordinates cannot come back (its gradient there vanishes):
  // if the likelihood still wants it larger, restart with it moved off the bound (at most m times)
  for (let round = 0; round < m; round++) {
    toNatural(best.x, theta);
    archLogLikelihood(xs, theta, b, gTheta);
    let worst = -1;
    for (let i = 1; i < k; i++) if (theta[i] < 1e-4 && gTheta[i] > 1e-3 * n && (worst < 0 || gTheta[i] > gTheta[worst])) worst = i;
    if (worst < 0) break;
    const z = Float64Array.from(best.x);
    const rest = 1 - theta.subarray(1).reduce((s, v) => s + v, 0);
    z[worst] = Math.log(Math.min(0.05, rest / 2) / rest);
    const again = minimizeMultiStart(objective, [z], { ...bfgsOptions, runs: 1 });
    if (again.value < best.value) best = { ...again, totalEvaluations: best.totalEvaluations + again.totalEvaluations };
    else break;
  }
  toNatural(best.x, theta);
  // Hessian by central differences of the analytic gradient, in the scaled units
  const hess = new Float64Array(k * k);
  const gp = new Float64Array(k), gm = new Float64Array(k), tp = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    const step = 1e-5 * Math.max(Math.abs(theta[i]), 0.01);
    tp.set(theta); tp[i] = theta[i] + step; archLogLikelihood(xs, tp, b, gp);
    tp[i] = Math.max(theta[i] - step, 0); const lo = tp[i]; archLogLikelihood(xs, tp, b, gm);
    for (let j = 0; j < k; j++) hess[i * k + j] = -(gp[j] - gm[j]) / (theta[i] + step - lo);
  }
  for (let i = 0; i < k; i++) for (let j = 0; j < i; j++) { const v = 0.5 * (hess[i * k + j] + hess[j * k + i]); hess[i * k + j] = v; hess[j * k + i] = v; }
  const cov = invertMatrix(hess, k);
  const params: Record<string, number> = { omega: theta[0] * scale * scale };
  const standardErrors: Record<string, number> = { omega: cov && cov[0] > 0 ? Math.sqrt(cov[0]) * scale * scale : NaN };
  let persistence = 0;
  for (let i = 1; i < k; i++) {
    params[`alpha${i}`] = theta[i];
    standardErrors[`alpha${i}`] = cov && cov[i * k + i] > 0 ? Math.sqrt(cov[i * k + i]) : NaN;
    persistence += theta[i];
  }
  const alphas = Array.from(theta.subarray(1));
  const backcast = b * scale * scale;
  const path = archVariance(returns, { omega: params.omega, alphas }, backcast);
  const logLikelihood = archLogLikelihood(returns, [params.omega, ...alphas], backcast);
  const moments = standardisedMoments(returns, path.variance);
  const warnings: EngineWarning[] = [];
  const short = shortHistoryWarning(n, 500, `ARCH(${m}) by maximum likelihood`);
  if (short) warnings.push(short);
  const kurt = kurtosisWarning(moments.kurtosis, true);
  if (kurt) warnings.push(kurt);
  const atZero = alphas.map((a, i) => (a < 1e-6 ? `α${i + 1}` : "")).filter(Boolean);
  if (atZero.length) warnings.push({ code: "bound-hit", message: `${atZero.join(", ")} ${atZero.length > 1 ? "are" : "is"} at the lower bound of 0: ${atZero.length > 1 ? "those lags do" : "that lag does"} not move the variance.` });
  if (persistence >= 0.999) warnings.push({ code: "near-integrated", message: `The ARCH weights sum to ${persistence.toFixed(5)}, close to 1: the long-run variance is not reliable.` });
  if (!best.converged) warnings.push({ code: "not-converged", message: `The optimiser stopped without meeting its convergence test (${best.stop}).` });
  const recent: number[] = [];
  for (let i = 0; i < m; i++) { const j = n - 1 - i; recent.push(j >= 0 ? returns[j] * returns[j] : backcast); }
  return {
    kind: "arch",
    params,
    standardErrors,
    variance: path.variance,
    currentVariance: path.currentVariance,
    longRunVariance: persistence < 1 ? params.omega / (1 - persistence) : null,
    logLikelihood,
    initialization: describeInit(init),
    diagnostics: {
      n, order: m, persistence,
      aic: -2 * logLikelihood + 2 * k, bic: -2 * logLikelihood + k * Math.log(n),
      converged: best.converged, stop: best.stop, iterations: best.iterations, evaluations: best.totalEvaluations,
      standardisedSkewness: moments.skewness, standardisedKurtosis: moments.kurtosis,
    },
    warnings,
    limitations: [...LIMITATIONS.arch],
    engineVersion: ENGINE_VERSION,
    recentSquaredResiduals: recent,
  };
}
