/** Diagnostics and warnings derived from an actual fit and its data. */
import type { EngineWarning } from "./types";

/** Skewness and kurtosis (not excess) of the standardised residuals eₜ/σₜ, skipping undefined variances. */
export function standardisedMoments(residuals: ArrayLike<number>, variance: ArrayLike<number>): { skewness: number; kurtosis: number; count: number } {
  let n = 0, s1 = 0;
  for (let t = 0; t < residuals.length; t++) { const h = variance[t]; if (h > 0) { s1 += residuals[t] / Math.sqrt(h); n++; } }
  const m = s1 / n;
  let m2 = 0, m3 = 0, m4 = 0;
  for (let t = 0; t < residuals.length; t++) {
    const h = variance[t];
    if (!(h > 0)) continue;
    const z = residuals[t] / Math.sqrt(h) - m;
    const z2 = z * z;
    m2 += z2; m3 += z2 * z; m4 += z2 * z2;
  }
  m2 /= n; m3 /= n; m4 /= n;
  return { skewness: m3 / Math.pow(m2, 1.5), kurtosis: m4 / (m2 * m2), count: n };
}

/** Kurtosis of standardised residuals above which the engine warns (common practice, no source). */
export const KURTOSIS_WARNING_LEVEL = 4;

/** A warning when standardised residuals have large kurtosis, or none. */
export function kurtosisWarning(kurtosis: number, normalErrors: boolean): EngineWarning | null {
  if (!(kurtosis > KURTOSIS_WARNING_LEVEL)) return null;
  return {
    code: "heavy-tails",
    message: `The standardised residuals have kurtosis ${kurtosis.toFixed(2)} against 3 for a normal distribution: extreme days are more frequent than ${normalErrors ? "the normal errors of this fit assume; consider Student-t errors" : "a normal distribution says"}.`,
  };
}

/** A warning when the history is shorter than an estimator wants, or none. */
export function shortHistoryWarning(n: number, wanted: number, what: string): EngineWarning | null {
  if (n >= wanted) return null;
  return { code: "short-history", message: `Only ${n} returns: ${what} wants at least ${wanted} for stable estimates.` };
}
