/**
 * Shared result types of the risk engine. Everything in lib/risk is pure: typed arrays in, plain objects out.
 * Returns are decimals (0.01 = 1 %), oldest first; variances are per day in squared decimal units.
 */

/** The estimator families Ballast offers. */
export type EstimatorKind = "ma" | "arch" | "ewma" | "garch";

/** One warning raised by the engine about a fit or the data behind it. */
export interface EngineWarning {
  /** stable machine code, e.g. "near-integrated", "short-history", "bound-hit" */
  code: string;
  /** one plain sentence for a person */
  message: string;
}

/** What every volatility estimator returns. */
export interface VolatilityFit {
  kind: EstimatorKind;
  /** named parameters, e.g. { omega, alpha, beta, mu } or { lambda } or { window } */
  params: Record<string, number>;
  /** standard errors by parameter name where the fit defines them */
  standardErrors?: Record<string, number>;
  /** robust (sandwich, quasi-maximum-likelihood) standard errors by parameter name where the fit defines them */
  robustStandardErrors?: Record<string, number>;
  /** conditional variance series: variance[t] is the variance of returns[t] given returns before t */
  variance: Float64Array;
  /** the forecast variance for the day after the last return */
  currentVariance: number;
  /** long-run variance V_L where the model has one, otherwise null */
  longRunVariance: number | null;
  /** log-likelihood where defined, otherwise null */
  logLikelihood: number | null;
  /** the start-up rule that was used, stated */
  initialization: string;
  diagnostics: Record<string, number | string | boolean | null>;
  warnings: EngineWarning[];
  /** plain-words limitations of this estimator and of this fit */
  limitations: string[];
  engineVersion: string;
  /** ARCH only: the last m squared residuals, newest first, which its multi-day forecast needs */
  recentSquaredResiduals?: number[];
  /** the optimiser's final inverse-Hessian approximation in its own coordinates, for warm-starting a refit (GARCH) */
  optimizerInverseHessian?: Float64Array;
  /** set when the requested model failed or was near-integrated and the caller's fallback was used instead */
  fallbackFrom?: {
    kind: EstimatorKind;
    params: Record<string, number>;
    logLikelihood: number | null;
    reason: string;
  };
}
