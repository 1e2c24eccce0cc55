/**
 * Covariance = D·R·D from per-factor volatility processes (issue 13): each factor's process chosen by factor, by
 * asset class or by default; the correlation R from a chosen estimator (equal weights over a window, EWMA with its
 * own λ, or the constant correlation of standardised residuals); R repaired to the nearest correlation matrix
 * (Higham 2002) when it is not positive semi-definite. Also the refit schedule of the out-of-sample VaR history and
 * the day-by-day correlation it needs. Pure.
 */
import { estimatesParameters, fitProcess, filterFit, horizonVariance, minimumReturns, processLimitations, resolveSpec, specLabel, specStartUp } from "../process/registry";
import type { BacktestRefit, CorrelationSpec, FitOptions, ProcessFit, ResolvedCorrelation, ResolvedFactorModel, VolatilityChoice, VolatilitySpec } from "../process/types";
import { equalWeightCovariance, ewmaCovariance, standardisedCorrelation } from "./covariance";
import { covarianceToCorrelation, zeroMatrix, type SymmetricMatrix } from "./matrix";
import { checkPsd } from "./psd";
import { nearestCorrelation } from "./nearest-correlation";

/** A factor's chosen process and where the choice came from. */
export interface FactorSpec {
  factor: string;
  assetClass: string | null;
  spec: VolatilitySpec;
  source: "factor" | "asset-class" | "default";
}

/** The process of each factor: byFactor, then byAssetClass, then default; every spec checked and resolved. */
export function resolveFactorSpecs(factors: readonly string[], classOf: (factor: string) => string | null, choice: VolatilityChoice): FactorSpec[] {
  return factors.map((factor) => {
    const assetClass = classOf(factor);
    const own = choice.byFactor?.[factor];
    const byClass = assetClass !== null ? choice.byAssetClass?.[assetClass] : undefined;
    const spec = own ?? byClass ?? choice.default;
    const source = own ? "factor" : byClass ? "asset-class" : "default";
    let resolved: VolatilitySpec;
    try {
      resolved = resolveSpec(spec);
    } catch (error) {
      throw new RangeError(`${where(factor, assetClass)}: ${(error as Error).message}`);
    }
    return { factor, assetClass, spec: resolved, source };
  });
}

/** "factor X (asset class Y)" for messages. */
export function where(factor: string, assetClass: string | null): string {
  return `factor ${factor}${assetClass ? ` (asset class ${assetClass})` : ""}`;
}

/** Returns a factor's spec needs: its process's minimum. */
export function neededReturns(spec: VolatilitySpec): number {
  return minimumReturns(spec);
}

/**
 * Fit one factor's process, refusing a fit that failed with no fallback.
 * @throws {RangeError} naming the factor, its asset class and the reason
 */
export function fitFactor(returns: ArrayLike<number>, fs: FactorSpec, options: FitOptions & { asOf?: string } = {}): ProcessFit {
  let fit: ProcessFit;
  const when = options.asOf ? ` on the data up to ${options.asOf}` : "";
  try {
    fit = fitProcess(returns, fs.spec, options);
  } catch (error) {
    throw new RangeError(`${where(fs.factor, fs.assetClass)}: ${specLabel(fs.spec)} cannot be fitted${when}: ${(error as Error).message}`);
  }
  // a Student-t fit whose ν runs off towards infinity (the errors are normal) stops at the line search with a
  // vanishing gradient: the estimates are usable and its warnings say so; any other failure to converge is refused
  const normalLimit = (fit.params.nu ?? 0) > 200 && Number(fit.fit.diagnostics.gradientNorm) < 1e-5;
  if (!fit.fallback && !normalLimit && fit.fit.warnings.some((w) => w.code === "not-converged")) {
    throw new RangeError(`${where(fs.factor, fs.assetClass)}: ${specLabel(fs.spec)} did not converge${when} and the method states no fallback`);
  }
  if (!(fit.nextVariance > 0)) throw new RangeError(`${where(fs.factor, fs.assetClass)}: ${fit.label} gives no positive variance${when} (the returns are constant)`);
  return fit;
}

/** First day from which every factor's variance path is defined (a moving average needs a full window). */
export function firstDefinedDay(specs: readonly FactorSpec[]): number {
  let d = 0;
  for (const s of specs) if (s.spec.kind === "ma") d = Math.max(d, s.spec.window);
  return d;
}

/** The correlation spec with defaults, checked. @throws {RangeError} */
export function resolveCorrelation(spec: CorrelationSpec | undefined, lambda: number): CorrelationSpec {
  const s: CorrelationSpec = spec ?? { kind: "ewma", lambda };
  if (s.kind === "equal") {
    if (!(Number.isInteger(s.window) && s.window >= 2)) throw new RangeError(`correlation: the equal-weight window must be a whole number of at least 2 days, not ${s.window}`);
    return { kind: "equal", window: s.window };
  }
  if (s.kind === "ewma") {
    if (!(s.lambda > 0 && s.lambda < 1)) throw new RangeError(`correlation: the EWMA λ must be between 0 and 1, not ${s.lambda}`);
    const startupDays = s.startupDays ?? 30;
    if (!(Number.isInteger(startupDays) && startupDays >= 1)) throw new RangeError("correlation: the EWMA start-up must be a whole number of days");
    return { kind: "ewma", lambda: s.lambda, startupDays };
  }
  if (s.kind === "ccc") return { kind: "ccc" };
  throw new RangeError(`correlation: unknown estimator "${(s as { kind: string }).kind}" (equal, ewma or ccc)`);
}

/** Plain label and statement of a correlation estimator. */
export function describeCorrelation(spec: CorrelationSpec, L: number): { label: string; statement: string } {
  if (spec.kind === "equal") {
    const w = Math.min(spec.window, L);
    return { label: `equal weights over ${w} days`, statement: `Correlation: zero-mean correlation of the factor returns with equal weights over the last ${w} days.` };
  }
  if (spec.kind === "ewma") {
    return {
      label: `EWMA, λ = ${spec.lambda}`,
      statement: `Correlation: the EWMA covariance of the factor returns (λ = ${spec.lambda}, zero mean, started from the equal-weight covariance of the first ${spec.startupDays ?? 30} days) scaled to a unit diagonal.`,
    };
  }
  return { label: "constant correlation of standardised residuals", statement: "Correlation: constant correlation of each factor's returns divided by its own conditional volatility (standardised residuals), over the whole sample." };
}

/** Today's correlation from a spec over returns[0..end) (variances: each factor's conditional variance path). */
export function correlationOf(spec: CorrelationSpec, returns: readonly Float64Array[], variances: readonly ArrayLike<number>[], end: number, firstDefined: number): SymmetricMatrix {
  if (spec.kind === "equal") {
    const w = Math.min(spec.window, end);
    return covarianceToCorrelation(equalWeightCovariance(returns, { start: end - w, end })).correlation;
  }
  if (spec.kind === "ewma") {
    const sliced = end === returns[0].length ? returns : returns.map((r) => r.subarray(0, end));
    return covarianceToCorrelation(ewmaCovariance(sliced, spec.lambda, { startupDays: Math.min(spec.startupDays ?? 30, end) })).correlation;
  }
  return standardisedCorrelation(returns, variances, firstDefined, end);
}

/** R checked and, when indefinite, replaced by the nearest correlation matrix. */
export function repairCorrelation(r: SymmetricMatrix): { matrix: SymmetricMatrix; check: ResolvedCorrelation["check"]; repair: ResolvedCorrelation["repair"] } {
  const check = checkPsd(r).status;
  if (check !== "indefinite") return { matrix: r, check, repair: null };
  const near = nearestCorrelation(r);
  return {
    matrix: near.matrix,
    check,
    repair: { method: near.method, frobeniusDistance: near.frobeniusDistance, iterations: near.iterations, negativeEigenvaluesBefore: near.negativeEigenvaluesBefore, minEigenvalueBefore: near.minEigenvalueBefore },
  };
}

/** The resolved record of one factor for the result. */
export function resolvedFactor(fs: FactorSpec, fit: ProcessFit, horizonVar: number): ResolvedFactorModel {
  return {
    factor: fs.factor,
    assetClass: fs.assetClass,
    source: fs.source,
    spec: fs.spec,
    process: fit.process,
    label: fit.label,
    params: Object.fromEntries(Object.entries(fit.params).filter(([, v]) => Number.isFinite(v))),
    parameterNames: fit.parameterNames,
    startUp: fit.spec.kind === "ma" ? specStartUp(fit.spec) : fit.startUp,
    fallback: fit.fallback,
    variance: fit.nextVariance,
    horizonVariance: horizonVar,
    longRunVariance: fit.fit.longRunVariance,
    logLikelihood: fit.fit.logLikelihood,
    warnings: fit.fit.warnings,
    limitations: processLimitations(fit),
  };
}

/** The refit schedule: refit days τ₀ = L, τ₁ = L − N, … down to the first forecast day `from`. */
export interface RefitBlock {
  /** fitted on returns[0..tau) */
  tau: number;
  /** forecast days s in [start, end) use this fit */
  start: number;
  end: number;
}

export function refitBlocks(L: number, from: number, refit: BacktestRefit): RefitBlock[] {
  if (refit.mode === "full-sample") return [{ tau: L, start: from, end: L + 1 }];
  const N = refit.everyDays;
  const blocks: RefitBlock[] = [{ tau: L, start: L, end: L + 1 }];
  let tau = L;
  while (tau > from) {
    const next = tau - N;
    blocks.push({ tau: next, start: Math.max(next, from), end: tau });
    tau = next;
  }
  return blocks;
}

/** The refit rule, stated, and its limitation. */
export function describeRefit(refit: BacktestRefit): { statement: string; limitation: string | null } {
  if (refit.mode === "full-sample") {
    return {
      statement: "Backtest and VaR history: model parameters fitted once on the whole sample and reused for every past day's forecast, as the method chooses.",
      limitation: "The backtest is in-sample for the model parameters: they were fitted on data that includes the days being tested, so the exception count can look better than the model would have done at the time.",
    };
  }
  return {
    statement: `Backtest and VaR history: out of sample. Each day's VaR uses only data up to the day before; model parameters are re-estimated every ${refit.everyDays} business days counting back from the as-of date, each fit on the data before its refit day and started from the next later fit; between refits the filter runs on with the parameters held.`,
    limitation: null,
  };
}

/** Per-factor fits of one refit block and the variance paths they give over the whole sample. */
export interface BlockFits {
  fits: ProcessFit[];
  /** paths[i][t] for t = 0..L (t = L the forecast after the last day) */
  paths: Float64Array[];
}

/**
 * The fits of every block, latest first, each warm-started from the one after it. The block at τ = L is today's fits.
 * `onBlock` receives each block's fits and paths (the path arrays are reused: copy what you keep).
 */
export function forEachBlock(
  returns: readonly Float64Array[],
  specs: readonly FactorSpec[],
  today: readonly ProcessFit[],
  blocks: readonly RefitBlock[],
  dates: readonly string[],
  onBlock: (block: RefitBlock, fits: BlockFits) => void,
): void {
  const k = returns.length;
  const L = returns[0]?.length ?? 0;
  const paths = Array.from({ length: k }, () => new Float64Array(L + 1));
  let previous = today;
  for (const block of blocks) {
    let fits: ProcessFit[];
    if (block.tau === L) fits = [...today];
    else {
      fits = specs.map((fs, i) => {
        // nothing to estimate (a moving average, a fixed λ): the same parameters, the start-up from the earlier data
        if (!estimatesParameters(fs.spec)) return today[i];
        const same = previous[i].used.kind === fs.spec.kind;
        return fitFactor(returns[i].subarray(0, block.tau), fs, { warmStart: same ? previous[i].params : undefined, warmInverseHessian: same ? previous[i].fit.optimizerInverseHessian : undefined, lean: true, asOf: dates[block.tau - 1] });
      });
    }
    for (let i = 0; i < k; i++) filterFit(fits[i], returns[i], block.tau, paths[i]);
    onBlock(block, { fits, paths });
    previous = fits;
  }
}

/** H-day variance of factor i at day s under a fit (the term structure summed, or H × one-day). */
export function factorHorizonVariance(fit: ProcessFit, next: number, returns: ArrayLike<number>, s: number, H: number, term: boolean): number {
  return term ? horizonVariance(fit, next, returns, s, H) : H * next;
}

/**
 * Day-by-day correlation quadratic forms for a recursive estimator (equal or EWMA on raw returns): for each day s
 * in [from, to), R_s from data up to s − 1; `visit(s, cov)` sees the covariance Σ_s (R_s = Σ_s scaled to unit diagonal),
 * valid in its lower triangle only (the upper one is not kept up to date).
 */
export function forEachDailyCovariance(spec: Extract<CorrelationSpec, { kind: "equal" | "ewma" }>, returns: readonly Float64Array[], from: number, to: number, visit: (s: number, cov: Float64Array) => void): void {
  const k = returns.length;
  if (from >= to) return;
  let cov: SymmetricMatrix;
  if (spec.kind === "ewma") cov = ewmaCovariance(returns.map((r) => r.subarray(0, from)), spec.lambda, { startupDays: Math.min(spec.startupDays ?? 30, from) });
  else {
    const w = spec.window;
    if (from < w) throw new RangeError(`correlation: the equal-weight window of ${w} days needs ${w} days before the first VaR history day`);
    cov = equalWeightCovariance(returns, { start: from - w, end: from });
  }
  const v = cov.values;
  const x = new Float64Array(k);
  const y = new Float64Array(k);
  for (let s = from; s < to; s++) {
    visit(s, v);
    if (s + 1 >= to) break;
    for (let i = 0; i < k; i++) x[i] = returns[i][s];
    if (spec.kind === "ewma") {
      const lam = spec.lambda;
      const a = 1 - lam;
      for (let i = 0; i < k; i++) {
        const xi = a * x[i];
        const row = i * k;
        for (let j = 0; j <= i; j++) v[row + j] = lam * v[row + j] + xi * x[j];
      }
    } else {
      const w = spec.window;
      for (let i = 0; i < k; i++) y[i] = returns[i][s - w];
      for (let i = 0; i < k; i++) {
        const xi = x[i] / w;
        const yi = y[i] / w;
        const row = i * k;
        for (let j = 0; j <= i; j++) v[row + j] += xi * x[j] - yi * y[j];
      }
    }
  }
}

/**
 * wᵀ R w with R = Σ scaled to a unit diagonal, reading only the lower triangle of Σ (a factor with zero variance
 * has correlation 0 with the others).
 */
export function correlationForm(cov: Float64Array, w: Float64Array, k: number, scratch: Float64Array): number {
  let zeroVar = 0;
  for (let i = 0; i < k; i++) {
    const d = cov[i * k + i];
    if (d > 0) scratch[i] = w[i] / Math.sqrt(d);
    else { scratch[i] = 0; zeroVar += w[i] * w[i]; }
  }
  return symmetricForm(cov, scratch, k) + zeroVar;
}

/** wᵀ R w for an explicit correlation matrix (full storage). */
export function matrixForm(r: SymmetricMatrix, w: Float64Array): number {
  return symmetricForm(r.values, w, r.size);
}

/** xᵀ V x for a symmetric k × k matrix in full row-major storage, reading its lower triangle (zero entries of x skipped). */
function symmetricForm(v: Float64Array, x: Float64Array, k: number): number {
  let s = 0;
  for (let i = 0; i < k; i++) {
    const xi = x[i];
    if (xi === 0) continue;
    const row = i * k;
    let t = 0;
    for (let j = 0; j < i; j++) t += v[row + j] * x[j];
    s += xi * (2 * t + v[row + i] * xi);
  }
  return s;
}

export { zeroMatrix };
