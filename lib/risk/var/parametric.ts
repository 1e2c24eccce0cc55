/**
 * Parametric (variance–covariance) VaR and expected shortfall for a P&L with standard deviation σ:
 * normal, VaR = z_p·σ − μ and ES = σ·φ(z_p)/(1−p) − μ; or Student-t with ν > 2 degrees of freedom scaled to
 * unit variance, VaR = σ·√((ν−2)/ν)·t_ν⁻¹(p) − μ and ES = σ·√((ν−2)/ν)·f_ν(t)(ν+t²)/((ν−1)(1−p)) − μ.
 * VaR and ES are positive losses.
 */
import { normalPdf, normalQuantile, studentTPdf, studentTQuantile } from "./distributions";

export type ParametricDistribution = "normal" | "t";

export interface ParametricOptions {
  distribution?: ParametricDistribution;
  /** degrees of freedom for "t", > 2 */
  nu?: number;
  /** expected P&L over the horizon (0 by default: zero-mean convention) */
  mean?: number;
}

function checkArgs(name: string, sigma: number, confidence: number, options: ParametricOptions): void {
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`${name} requires 0 < confidence < 1`);
  if (!(sigma >= 0 && Number.isFinite(sigma))) throw new RangeError(`${name} requires a finite sigma >= 0`);
  if ((options.distribution ?? "normal") === "t" && !((options.nu ?? NaN) > 2)) throw new RangeError(`${name} requires nu > 2 for the t distribution`);
}

/** The VaR multiple of σ: z_p for the normal, the unit-variance t quantile otherwise. */
export function varMultiplier(confidence: number, options: ParametricOptions = {}): number {
  checkArgs("varMultiplier", 1, confidence, options);
  if ((options.distribution ?? "normal") === "normal") return normalQuantile(confidence);
  const nu = options.nu as number;
  return Math.sqrt((nu - 2) / nu) * studentTQuantile(confidence, nu);
}

/** The ES multiple of σ: φ(z_p)/(1−p) for the normal, the unit-variance t expression otherwise. */
export function esMultiplier(confidence: number, options: ParametricOptions = {}): number {
  checkArgs("esMultiplier", 1, confidence, options);
  if ((options.distribution ?? "normal") === "normal") return normalPdf(normalQuantile(confidence)) / (1 - confidence);
  const nu = options.nu as number;
  const t = studentTQuantile(confidence, nu);
  return (Math.sqrt((nu - 2) / nu) * studentTPdf(t, nu) * (nu + t * t)) / ((nu - 1) * (1 - confidence));
}

/**
 * Parametric VaR (a positive loss) of a P&L with standard deviation sigma.
 * @throws {RangeError} "parametricVar requires 0 < confidence < 1", or on a negative sigma
 * @example parametricVar(20, 0.99); // ≈ 46.53 (Hull's 10-day σ = 20 example)
 */
export function parametricVar(sigma: number, confidence: number, options: ParametricOptions = {}): number {
  checkArgs("parametricVar", sigma, confidence, options);
  return sigma * varMultiplier(confidence, options) - (options.mean ?? 0);
}

/**
 * Parametric expected shortfall (a positive loss): the mean loss beyond the VaR.
 * @throws {RangeError} "parametricEs requires 0 < confidence < 1", or on a negative sigma
 * @example parametricEs(20, 0.99); // ≈ 53.30
 */
export function parametricEs(sigma: number, confidence: number, options: ParametricOptions = {}): number {
  checkArgs("parametricEs", sigma, confidence, options);
  return sigma * esMultiplier(confidence, options) - (options.mean ?? 0);
}
