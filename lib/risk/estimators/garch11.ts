/**
 * GARCH(1,1) by maximum likelihood: σ²ₜ = ω + α·e²ₜ₋₁ + β·σ²ₜ₋₁, eₜ = xₜ − μ, with zero or fitted constant
 * mean, normal or Student-t errors, optional variance targeting, constraints ω > 0, α ≥ 0, β ≥ 0, α+β < 1.
 */
import { garch11Variance } from "./garch11-variance";
import { garch11LogLikelihood, garch11ParameterNames, type Garch11Problem, type LikelihoodInit } from "./garch11-likelihood";
import { backcastWeights, backcastValue, checkInit, describeInit, type InitRule } from "./initial-variance";
import { fitEwma } from "./ewma";
import { minimizeMultiStart } from "../optimize/multi-start";
import { minimizeBfgs } from "../optimize/minimize-bfgs";
import { invertMatrix, multiplyMatrices } from "../linalg";
import { standardisedMoments, kurtosisWarning, shortHistoryWarning } from "../fit-diagnostics";
import { LIMITATIONS, NORMAL_TAILS } from "../limitations";
import { ENGINE_VERSION } from "../version";
import type { EngineWarning, VolatilityFit } from "../types";

export { garch11Variance } from "./garch11-variance";
export type { Garch11Params, VariancePath } from "./garch11-variance";

/** Options of fitGarch11. */
export interface FitGarch11Options {
  /** "zero" (default): eₜ = xₜ; "fit": a constant mean μ is estimated with the other parameters */
  mean?: "zero" | "fit";
  /** error distribution (default "normal"); "t" fits the degrees of freedom ν */
  distribution?: "normal" | "t";
  /** variance targeting: ω = (1−α−β)·mean(e²), so ω is not a free parameter (default false) */
  targeting?: boolean;
  /** start-up variance rule (default "sample", the benchmark convention) */
  init?: InitRule;
  /** what to return when the fit fails or is near-integrated (α+β ≥ 0.999): "none" (default) or "ewma" (λ = fallbackLambda) */
  fallback?: "ewma" | "none";
  /** BFGS runs from distinct starting points (default 2) */
  starts?: number;
  /** λ of the EWMA fallback (default 0.94) */
  fallbackLambda?: number;
  /**
   * parameters of an earlier fit to start from (omega, alpha, beta, and mu, nu where free; in the returns' units):
   * one BFGS run from there, and the full multi-start only when it fails to converge
   */
  warmStart?: Record<string, number>;
  /** with warmStart: the earlier fit's `optimizerInverseHessian` (same parameters free), instead of a fresh BHHH start */
  warmInverseHessian?: Float64Array;
  /** skip the standard errors (Hessian and sandwich), for refits inside a backtest */
  lean?: boolean;
  /** relative step of the central-difference Hessian (default 1e-5; for convergence checks) */
  hessianStep?: number;
}

/** Fewest returns fitGarch11 accepts. */
export const GARCH_MIN_RETURNS = 100;
/** Returns below which a GARCH fit is flagged as short history (common practice, no source). */
export const GARCH_WANTED_RETURNS = 500;
/** Persistence α+β from which a fit is called near-integrated. */
export const NEAR_INTEGRATED = 0.999;

const NU_FLOOR = 2;
/**
 * Upper bound of ν: beyond a few hundred degrees of freedom the Student-t is the normal for every practical purpose,
 * and an unbounded ν lets the optimiser run off towards infinity where the log-gamma terms lose their precision.
 */
export const NU_CEILING = 500;
const NU_SPAN = NU_CEILING - NU_FLOOR;

function likelihoodInit(rule: InitRule, n: number, scale2: number): LikelihoodInit {
  if (typeof rule === "number") return { kind: "fixed", value: rule / scale2 };
  if (rule === "unconditional") return { kind: "unconditional" };
  return { kind: "backcast", weights: backcastWeights(rule, n)! };
}

/**
 * Fit GARCH(1,1) by maximum likelihood with analytic gradients and BFGS from several starting points.
 * Returns are fitted in their own units (decimals or percent); parameters come back in the same units.
 * @throws {Error} with fewer than 100 returns, a non-finite return, or all returns equal
 * @example fitGarch11(returns, { mean: "fit" }).params; // { mu, omega, alpha, beta }
 */
export function fitGarch11(returns: ArrayLike<number>, options: FitGarch11Options = {}): VolatilityFit {
  const n = returns.length;
  if (n < GARCH_MIN_RETURNS) throw new Error(`fitGarch11 requires at least ${GARCH_MIN_RETURNS} returns`);
  for (let i = 0; i < n; i++) if (!Number.isFinite(returns[i])) throw new Error(`fitGarch11 requires finite returns: return ${i} is ${returns[i]}`);
  const fitMean = (options.mean ?? "zero") === "fit";
  const studentT = (options.distribution ?? "normal") === "t";
  const targeting = options.targeting ?? false;
  const init = options.init ?? "sample";
  const fallback = options.fallback ?? "none";
  const fallbackLambda = options.fallbackLambda ?? 0.94;
  if (!(fallbackLambda > 0 && fallbackLambda < 1)) throw new RangeError("fitGarch11 requires 0 < fallbackLambda < 1");
  checkInit(init, "fitGarch11");
  if (options.mean && options.mean !== "zero" && options.mean !== "fit") throw new RangeError('fitGarch11 requires mean "zero" or "fit"');
  if (options.distribution && options.distribution !== "normal" && options.distribution !== "t") throw new RangeError('fitGarch11 requires distribution "normal" or "t"');

  // fit on returns scaled to unit variance (exact: μ and ω scale back, α, β, ν do not change)
  let mean = 0;
  for (let i = 0; i < n; i++) mean += returns[i];
  mean /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) { const e = returns[i] - (fitMean ? mean : 0); ss += e * e; }
  const scale = Math.sqrt(ss / n);
  let largest = 0;
  for (let i = 0; i < n; i++) largest = Math.max(largest, Math.abs(returns[i]));
  if (!(scale > 1e-10 * largest)) throw new Error("fitGarch11 requires returns that are not all equal");
  const xs = new Float64Array(n);
  for (let i = 0; i < n; i++) xs[i] = returns[i] / scale;
  const problem: Garch11Problem = { x: xs, fitMean, studentT, targeting, init: likelihoodInit(init, n, scale * scale) };
  const names = garch11ParameterNames(problem);
  const k = names.length;
  const iMu = names.indexOf("mu"), iOm = names.indexOf("omega"), iAl = names.indexOf("alpha"), iBe = names.indexOf("beta"), iNu = names.indexOf("nu");

  // unconstrained coordinates z → natural θ: ω = e^z, (α, β) = (e^a, e^b)/(1+e^a+e^b), ν = 2 + 498/(1+e^−z) (2 < ν < 500)
  const theta = new Float64Array(k);
  const gTheta = new Float64Array(k);
  const toNatural = (z: ArrayLike<number>, out: Float64Array): void => {
    if (iMu >= 0) out[iMu] = z[iMu];
    if (iOm >= 0) out[iOm] = Math.exp(z[iOm]);
    const ea = Math.exp(z[iAl]), eb = Math.exp(z[iBe]), d = 1 + ea + eb;
    out[iAl] = ea / d; out[iBe] = eb / d;
    if (iNu >= 0) out[iNu] = NU_FLOOR + NU_SPAN / (1 + Math.exp(-z[iNu]));
  };
  const toFree = (mu: number, omega: number, alpha: number, beta: number, nu: number): Float64Array => {
    const z = new Float64Array(k);
    if (iMu >= 0) z[iMu] = mu;
    if (iOm >= 0) z[iOm] = Math.log(omega);
    const rest = 1 - alpha - beta;
    z[iAl] = Math.log(alpha / rest); z[iBe] = Math.log(beta / rest);
    if (iNu >= 0) { const v = Math.min(Math.max(nu, NU_FLOOR + 1e-6), NU_CEILING - 1e-6); z[iNu] = Math.log((v - NU_FLOOR) / (NU_CEILING - v)); }
    return z;
  };
  const objective = (z: Float64Array, gz: Float64Array): number => {
    toNatural(z, theta);
    const ll = garch11LogLikelihood(problem, theta, gTheta);
    if (!Number.isFinite(ll)) return Infinity;
    if (iMu >= 0) gz[iMu] = -gTheta[iMu] / n;
    if (iOm >= 0) gz[iOm] = (-gTheta[iOm] * theta[iOm]) / n;
    const a = theta[iAl], b = theta[iBe], ga = gTheta[iAl], gb = gTheta[iBe];
    gz[iAl] = -(ga * a * (1 - a) - gb * a * b) / n;
    gz[iBe] = -(-ga * a * b + gb * b * (1 - b)) / n;
    if (iNu >= 0) gz[iNu] = (-gTheta[iNu] * ((theta[iNu] - NU_FLOOR) * (NU_CEILING - theta[iNu])) / NU_SPAN) / n;
    return -ll / n;
  };

  // starting points: a small grid of (α, β) with ω at the sample variance; the cheapest are ranked by value first
  const mu0 = fitMean ? mean / scale : 0;
  const starts: Float64Array[] = [];
  for (const p of [0.97, 0.9, 0.99]) for (const a of [0.08, 0.15, 0.04]) starts.push(toFree(mu0, 1 - p, a, p - a, 8));
  // each run starts from the outer product of the scores (BHHH) as its Hessian, carried into the z coordinates
  const scoreRows = new Float64Array(n * k);
  const bhhh = (z: Float64Array): Float64Array | null => {
    toNatural(z, theta);
    if (!Number.isFinite(garch11LogLikelihood(problem, theta, gTheta, scoreRows))) return null;
    const jac = new Float64Array(k); // diagonal part of dθ/dz; the (α, β) block is filled below
    if (iMu >= 0) jac[iMu] = 1;
    if (iOm >= 0) jac[iOm] = theta[iOm];
    if (iNu >= 0) jac[iNu] = ((theta[iNu] - NU_FLOOR) * (NU_CEILING - theta[iNu])) / NU_SPAN;
    const a = theta[iAl], b = theta[iBe];
    const hz = new Float64Array(k * k);
    const row = new Float64Array(k);
    for (let t = 0; t < n; t++) {
      const o = t * k;
      for (let i = 0; i < k; i++) row[i] = scoreRows[o + i] * jac[i];
      const sa = scoreRows[o + iAl], sb = scoreRows[o + iBe];
      row[iAl] = sa * a * (1 - a) - sb * a * b;
      row[iBe] = -sa * a * b + sb * b * (1 - b);
      for (let i = 0; i < k; i++) { const ri = row[i]; for (let j = 0; j < k; j++) hz[i * k + j] += ri * row[j]; }
    }
    for (let i = 0; i < k * k; i++) hz[i] /= n;
    return invertMatrix(hz, k);
  };
  // a lean refit inside a backtest stops at a largest gradient of 1e−7 of the mean log-likelihood (1e−9 otherwise):
  // it starts next to its optimum, and the forecasts do not move at that precision
  const bfgs = { gradientTolerance: options.lean ? 1e-7 : 1e-9, maxIterations: 300, initialInverseHessian: bhhh };
  let best: ReturnType<typeof minimizeMultiStart> | null = null;
  const warm = options.warmStart;
  if (warm && warm.alpha > 0 && warm.beta > 0 && warm.alpha + warm.beta < 1 && (targeting || warm.omega > 0) && (!studentT || warm.nu > NU_FLOOR)) {
    const z = toFree(fitMean ? (warm.mu ?? mean) / scale : 0, targeting ? 1 : warm.omega / (scale * scale), warm.alpha, warm.beta, studentT ? warm.nu : 8);
    try {
      // one run from the warm point, without ranking a single start first
      const h0 = options.warmInverseHessian && options.warmInverseHessian.length === k * k ? Float64Array.from(options.warmInverseHessian) : bhhh(z);
      const one = minimizeBfgs(objective, z, { gradientTolerance: bfgs.gradientTolerance, maxIterations: bfgs.maxIterations, initialInverseHessian: h0 });
      if (one.converged) best = { ...one, startsEvaluated: 1, runs: 1, totalEvaluations: one.evaluations, runValues: [one.value] };
    } catch {
      best = null; // a warm start outside the domain of these returns: start cold
    }
  }
  best ??= minimizeMultiStart(objective, starts, { ...bfgs, runs: options.starts ?? 2 });
  toNatural(best.x, theta);

  // standard errors from the Hessian of the log-likelihood: central differences of the analytic gradient
  // (error of the order of the step squared; a one-sided difference only where the lower point leaves the domain)
  const lean = options.lean ?? false;
  let cov: Float64Array | null = null;
  let robust: Float64Array | null = null;
  if (!lean) {
    const hess = new Float64Array(k * k);
    const gp = new Float64Array(k), gm = new Float64Array(k), g0 = new Float64Array(k), tp = new Float64Array(k);
    garch11LogLikelihood(problem, theta, g0, scoreRows);
    const relStep = options.hessianStep ?? 1e-5;
    for (let i = 0; i < k; i++) {
      const step = relStep * Math.max(Math.abs(theta[i]), 0.1);
      tp.set(theta); tp[i] = theta[i] + step; garch11LogLikelihood(problem, tp, gp);
      const lower = theta[i] - step;
      const inside = i === iMu || (i === iNu ? lower > NU_FLOOR : lower > 0);
      let central = false;
      if (inside) {
        tp[i] = lower;
        central = Number.isFinite(garch11LogLikelihood(problem, tp, gm));
      }
      for (let j = 0; j < k; j++) hess[i * k + j] = central ? (gp[j] - gm[j]) / (2 * step) : (gp[j] - g0[j]) / step;
    }
    for (let i = 0; i < k; i++) for (let j = 0; j < i; j++) { const v = 0.5 * (hess[i * k + j] + hess[j * k + i]); hess[i * k + j] = v; hess[j * k + i] = v; }
    const information = hess.map((v) => -v);
    cov = invertMatrix(information, k);
    const opg = new Float64Array(k * k);
    for (let t = 0; t < n; t++) for (let i = 0; i < k; i++) { const si = scoreRows[t * k + i]; for (let j = 0; j < k; j++) opg[i * k + j] += si * scoreRows[t * k + j]; }
    robust = cov ? multiplyMatrices(multiplyMatrices(cov, opg, k), cov, k) : null;
  }
  const unit = (name: string): number => (name === "mu" ? scale : name === "omega" ? scale * scale : 1);
  const standardErrors: Record<string, number> = {};
  const robustStandardErrors: Record<string, number> = {};
  names.forEach((name, i) => {
    standardErrors[name] = cov && cov[i * k + i] > 0 ? Math.sqrt(cov[i * k + i]) * unit(name) : NaN;
    robustStandardErrors[name] = robust && robust[i * k + i] > 0 ? Math.sqrt(robust[i * k + i]) * unit(name) : NaN;
  });

  // back to the caller's units
  const mu = fitMean ? theta[iMu] * scale : 0;
  const alpha = theta[iAl];
  const beta = theta[iBe];
  const persistence = alpha + beta;
  const residuals = new Float64Array(n);
  for (let i = 0; i < n; i++) residuals[i] = returns[i] - mu;
  let omega: number;
  if (targeting) {
    let s2 = 0;
    for (let i = 0; i < n; i++) s2 += residuals[i] * residuals[i];
    omega = (1 - persistence) * (s2 / n);
  } else omega = theta[iOm] * scale * scale;
  const nu = studentT ? theta[iNu] : NaN;
  const params: Record<string, number> = {};
  if (fitMean) params.mu = mu;
  params.omega = omega;
  params.alpha = alpha;
  params.beta = beta;
  if (studentT) params.nu = nu;
  // log-likelihood recomputed in the caller's units
  // in a lean refit, from the scaled fit: ℓ(x) = ℓ(x/s) − n·ln s (the same up to rounding)
  let logLikelihood: number;
  if (lean) logLikelihood = -best.value * n - n * Math.log(scale);
  else {
    const original: Garch11Problem = { x: Float64Array.from(returns as ArrayLike<number>), fitMean, studentT, targeting, init: likelihoodInit(init, n, 1) };
    const naturalOriginal = names.map((name) => (name === "nu" ? nu : params[name]));
    logLikelihood = garch11LogLikelihood(original, naturalOriginal);
  }
  let h1: number;
  if (typeof init === "number") h1 = init;
  else if (init === "unconditional") h1 = omega / (1 - persistence);
  else h1 = omega + persistence * backcastValue(returns, backcastWeights(init, n)!, mu);
  const path = garch11Variance(residuals, { omega, alpha, beta }, h1);
  const longRunVariance = persistence < 1 ? omega / (1 - persistence) : null;
  const halfLifeDays = persistence < 1 && persistence > 0 ? Math.log(0.5) / Math.log(persistence) : null;
  const moments = options.lean ? { skewness: NaN, kurtosis: NaN } : standardisedMoments(residuals, path.variance);
  const gradientNorm = Math.max(...Array.from(best.gradient, Math.abs));

  const warnings: EngineWarning[] = [];
  const short = shortHistoryWarning(n, GARCH_WANTED_RETURNS, "GARCH(1,1) by maximum likelihood");
  if (short) warnings.push(short);
  const kurt = options.lean ? null : kurtosisWarning(moments.kurtosis, !studentT);
  if (kurt) warnings.push(kurt);
  if (alpha < 1e-6) warnings.push({ code: "bound-hit", message: `α is at its lower bound of 0 (α = ${alpha.toExponential(2)}): yesterday's return does not move the variance in this fit.` });
  if (beta < 1e-6) warnings.push({ code: "bound-hit", message: `β is at its lower bound of 0 (β = ${beta.toExponential(2)}): the fit has no memory beyond one day.` });
  if (studentT && nu > 200) warnings.push({ code: "bound-hit", message: `ν is very large (${nu.toFixed(0)}): the Student-t errors are indistinguishable from normal ones (ν is bounded at ${NU_CEILING}).` });
  if (studentT && nu < 2.1) warnings.push({ code: "bound-hit", message: `ν is at its lower bound of 2 (ν = ${nu.toFixed(3)}): the variance of the errors is barely finite.` });
  const failed = !best.converged || !Number.isFinite(logLikelihood);
  if (failed) warnings.push({ code: "not-converged", message: `The GARCH(1,1) fit failed: the optimiser stopped without meeting its convergence test (${best.stop}, largest gradient ${gradientNorm.toExponential(2)}). ${fallback === "ewma" ? `As the caller chose, EWMA (λ = ${fallbackLambda}) is used instead.` : "The caller chose no fallback, so these numbers are the last estimates, not an optimum."}` });
  const nearIntegrated = persistence >= NEAR_INTEGRATED;
  if (nearIntegrated) {
    warnings.push({
      code: "near-integrated",
      message: `The fit is near-integrated: α+β = ${persistence.toFixed(5)} ≥ ${NEAR_INTEGRATED}, so shocks barely die out and the long-run variance is not reliable. ${fallback === "ewma" ? `As the caller chose, EWMA (λ = ${fallbackLambda}) is used instead.` : "The caller chose no fallback, so these are the GARCH estimates as fitted."}`,
    });
  }
  if (!cov && !lean) warnings.push({ code: "singular-hessian", message: "The Hessian of the log-likelihood is singular at the optimum: standard errors are not available." });

  const limitations = [...LIMITATIONS.garch];
  if (!studentT) limitations.push(NORMAL_TAILS);
  const k2 = k;
  const fit: VolatilityFit = {
    kind: "garch",
    params,
    ...(lean ? {} : { standardErrors, robustStandardErrors }),
    variance: path.variance,
    currentVariance: path.currentVariance,
    longRunVariance,
    logLikelihood,
    initialization: describeInit(init),
    diagnostics: {
      n,
      mean: fitMean ? "fit" : "zero",
      distribution: studentT ? "t" : "normal",
      targeting,
      persistence,
      halfLifeDays,
      aic: -2 * logLikelihood + 2 * k2,
      bic: -2 * logLikelihood + k2 * Math.log(n),
      converged: best.converged,
      stop: best.stop,
      iterations: best.iterations,
      evaluations: best.totalEvaluations,
      startsEvaluated: best.startsEvaluated,
      optimiserRuns: best.runs,
      gradientNorm,
      standardisedSkewness: moments.skewness,
      standardisedKurtosis: moments.kurtosis,
    },
    warnings,
    limitations,
    engineVersion: ENGINE_VERSION,
    optimizerInverseHessian: best.inverseHessian,
  };
  if (fallback === "ewma" && (nearIntegrated || failed)) {
    const ewma = fitEwma(returns, { lambda: fallbackLambda, init: init === "unconditional" ? "sample" : init });
    return {
      ...ewma,
      warnings: [...warnings, ...ewma.warnings, { code: "fallback-used", message: `GARCH(1,1) ${failed ? "did not converge" : "was near-integrated"}; EWMA with λ = ${fallbackLambda} was used instead, as the caller chose.` }],
      fallbackFrom: { kind: "garch", params, logLikelihood, reason: failed ? "not-converged" : "near-integrated" },
    };
  }
  return fit;
}
