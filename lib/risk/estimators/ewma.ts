/**
 * EWMA variance σ²ₙ = λσ²ₙ₋₁ + (1−λ)u²ₙ₋₁ with λ fixed (0.94 by default) or fitted by Gaussian maximum
 * likelihood; zero mean. Reports the half-life and the effective number of days.
 */
import { ewmaVariance } from "./ewma-variance";
import { backcastWeights, backcastValue, checkInit, describeInit, type InitRule } from "./initial-variance";
import { minimizeMultiStart } from "../optimize/multi-start";
import { standardisedMoments, kurtosisWarning, shortHistoryWarning } from "../fit-diagnostics";
import { LIMITATIONS } from "../limitations";
import { ENGINE_VERSION } from "../version";
import type { EngineWarning, VolatilityFit } from "../types";

export { ewmaVariance } from "./ewma-variance";

/** Options of fitEwma. */
export interface FitEwmaOptions {
  /** a fixed λ in (0, 1) (default 0.94) or "fit" for maximum likelihood */
  lambda?: number | "fit";
  /** start-up rule for the first day's variance (default "sample"); "unconditional" does not apply */
  init?: Exclude<InitRule, "unconditional">;
  /** when λ is fitted: the optimiser's first starting value (the method statement's "λ starting value"); default 0.94 */
  start?: number;
}

/** Fewest returns fitEwma accepts when λ is fitted. */
export const EWMA_FIT_MIN_RETURNS = 50;

const LN_2PI = Math.log(2 * Math.PI);

/** Gaussian log-likelihood of an EWMA filter and its derivative in λ (h₁ = B does not depend on λ). */
export function ewmaLogLikelihood(returns: ArrayLike<number>, lambda: number, initialVariance: number): { logLikelihood: number; derivative: number } {
  let h = initialVariance, dh = 0, ll = 0, dll = 0;
  for (let t = 0; t < returns.length; t++) {
    const u2 = returns[t] * returns[t];
    ll -= 0.5 * (LN_2PI + Math.log(h) + u2 / h);
    dll += (0.5 * (u2 / h - 1) / h) * dh;
    dh = h - u2 + lambda * dh;
    h = lambda * h + (1 - lambda) * u2;
  }
  return { logLikelihood: ll, derivative: dll };
}

/** Start-up variance σ²₁ for EWMA from a rule. */
function ewmaStart(returns: ArrayLike<number>, init: Exclude<InitRule, "unconditional">): number {
  if (typeof init === "number") return init;
  return backcastValue(returns, backcastWeights(init, returns.length)!, 0);
}

/**
 * Fit EWMA with λ fixed or by maximum likelihood.
 * @throws {RangeError} if λ is outside (0, 1); {Error} with too few returns or all returns zero
 */
export function fitEwma(returns: ArrayLike<number>, options: FitEwmaOptions = {}): VolatilityFit {
  const n = returns.length;
  const lambdaOption = options.lambda ?? 0.94;
  const init = options.init ?? "sample";
  checkInit(init, "fitEwma");
  if ((init as InitRule) === "unconditional") throw new RangeError("fitEwma has no unconditional variance to start from");
  const fitted = lambdaOption === "fit";
  if (!fitted && !(typeof lambdaOption === "number" && lambdaOption > 0 && lambdaOption < 1)) throw new RangeError("fitEwma requires 0 < lambda < 1");
  if (n < (fitted ? EWMA_FIT_MIN_RETURNS : 2)) throw new Error(`fitEwma requires at least ${fitted ? EWMA_FIT_MIN_RETURNS : 2} returns`);
  for (let i = 0; i < n; i++) if (!Number.isFinite(returns[i])) throw new Error(`fitEwma requires finite returns: return ${i} is ${returns[i]}`);
  const h1 = ewmaStart(returns, init);
  if (!(h1 > 0)) throw new Error("fitEwma requires returns that are not all zero");

  let lambda: number;
  let standardErrors: Record<string, number> | undefined;
  const diagnostics: VolatilityFit["diagnostics"] = {};
  const warnings: EngineWarning[] = [];
  if (fitted) {
    // λ = 1/(1+e^−z); minimise the mean negative log-likelihood
    const objective = (z: Float64Array, g: Float64Array): number => {
      const lam = 1 / (1 + Math.exp(-z[0]));
      const { logLikelihood, derivative } = ewmaLogLikelihood(returns, lam, h1);
      if (!Number.isFinite(logLikelihood)) return Infinity;
      g[0] = (-derivative * lam * (1 - lam)) / n;
      return -logLikelihood / n;
    };
    const first = options.start ?? 0.94;
    if (!(first > 0 && first < 1)) throw new RangeError("fitEwma requires 0 < start < 1");
    const starts = [first, ...[0.94, 0.97, 0.9, 0.99, 0.8].filter((l) => l !== first)].map((l) => [Math.log(l / (1 - l))]);
    const best = minimizeMultiStart(objective, starts, { runs: 2, gradientTolerance: 1e-10 });
    lambda = 1 / (1 + Math.exp(-best.x[0]));
    const step = 1e-6;
    const d2 = (ewmaLogLikelihood(returns, lambda + step, h1).derivative - ewmaLogLikelihood(returns, lambda - step, h1).derivative) / (2 * step);
    standardErrors = { lambda: d2 < 0 ? Math.sqrt(-1 / d2) : NaN };
    Object.assign(diagnostics, { startingValue: first, converged: best.converged, stop: best.stop, iterations: best.iterations, evaluations: best.totalEvaluations });
    if (!best.converged) warnings.push({ code: "not-converged", message: `The fit of λ stopped without meeting its convergence test (${best.stop}).` });
    if (lambda > 0.9999) warnings.push({ code: "bound-hit", message: `The fitted λ is at its upper bound of 1 (λ = ${lambda.toFixed(6)}): the variance barely moves.` });
  } else lambda = lambdaOption as number;

  const path = ewmaVariance(returns, lambda, h1);
  const { logLikelihood } = ewmaLogLikelihood(returns, lambda, h1);
  const halfLifeDays = Math.log(0.5) / Math.log(lambda);
  const daysFor1PercentWeight = Math.log(0.01) / Math.log(lambda);
  const moments = standardisedMoments(returns, path.variance);
  const short = shortHistoryWarning(n, Math.ceil(daysFor1PercentWeight), `EWMA with λ = ${lambda.toFixed(4)} (so the start-up variance weighs under 1 %)`);
  if (short) warnings.push(short);
  const kurt = kurtosisWarning(moments.kurtosis, true);
  if (kurt) warnings.push(kurt);
  const limitations = [...LIMITATIONS.ewma];
  if (fitted) limitations[0] = "λ was fitted by maximum likelihood on this history; it is a single number for the whole period.";
  return {
    kind: "ewma",
    params: { lambda },
    standardErrors,
    variance: path.variance,
    currentVariance: path.currentVariance,
    longRunVariance: null,
    logLikelihood,
    initialization: describeInit(init),
    diagnostics: {
      n,
      lambdaFitted: fitted,
      halfLifeDays,
      effectiveDays: 1 / (1 - lambda),
      daysFor1PercentWeight,
      standardisedSkewness: moments.skewness,
      standardisedKurtosis: moments.kurtosis,
      ...diagnostics,
    },
    warnings,
    limitations,
    engineVersion: ENGINE_VERSION,
  };
}
