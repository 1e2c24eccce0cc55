/**
 * Covariance of factor returns: equal weights over a window, EWMA, or GARCH(1,1) volatilities with a
 * constant correlation estimated from standardised residuals (CCC). Returns come factor by factor, each an
 * aligned array of daily decimal returns, oldest first.
 */
import { zeroMatrix, type SymmetricMatrix } from "./matrix";

export type CovarianceMean = "zero" | "sample";

export interface EqualWeightOptions {
  /** first index of the window (inclusive); default: end − window */
  start?: number;
  /** end of the window (exclusive); default: the series length */
  end?: number;
  /** "zero" (the daily-VaR convention, divisor n) or "sample" (sample means, divisor n − 1); default "zero" */
  mean?: CovarianceMean;
}

function checkFactors(name: string, returns: readonly ArrayLike<number>[]): number {
  if (returns.length === 0) throw new RangeError(`${name} requires at least one factor`);
  const t = returns[0].length;
  for (const r of returns) if (r.length !== t) throw new RangeError(`${name} requires aligned factors of equal length`);
  return t;
}

/**
 * Equal-weight covariance over [start, end): zero mean with divisor n, or sample mean with divisor n − 1.
 * @throws {RangeError} on unaligned factors or a window of fewer than 2 days
 */
export function equalWeightCovariance(returns: readonly ArrayLike<number>[], options: EqualWeightOptions = {}): SymmetricMatrix {
  const t = checkFactors("equalWeightCovariance", returns);
  const end = options.end ?? t;
  const start = options.start ?? 0;
  const n = end - start;
  if (!(start >= 0 && end <= t && n >= 2)) throw new RangeError("equalWeightCovariance requires a window of at least 2 days inside the data");
  const k = returns.length;
  const centred: Float64Array[] = returns.map((r) => {
    const out = new Float64Array(n);
    let mean = 0;
    if (options.mean === "sample") {
      for (let i = start; i < end; i++) mean += r[i];
      mean /= n;
    }
    for (let i = 0; i < n; i++) out[i] = r[start + i] - mean;
    return out;
  });
  const divisor = options.mean === "sample" ? n - 1 : n;
  return crossProduct(centred, divisor, k);
}

function crossProduct(rows: Float64Array[], divisor: number, k: number): SymmetricMatrix {
  const m = zeroMatrix(k);
  const n = rows[0].length;
  const out = m.values;
  const put = (i: number, j: number, s: number): void => {
    const v = s / divisor;
    out[i * k + j] = v;
    out[j * k + i] = v;
  };
  for (let i = 0; i < k; i++) {
    const a = rows[i];
    let j = 0;
    // four columns at a time: each sum still runs over d in order, so every element is the same to the last bit
    for (; j + 3 <= i; j += 4) {
      const b0 = rows[j], b1 = rows[j + 1], b2 = rows[j + 2], b3 = rows[j + 3];
      let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
      for (let d = 0; d < n; d++) {
        const x = a[d];
        s0 += x * b0[d]; s1 += x * b1[d]; s2 += x * b2[d]; s3 += x * b3[d];
      }
      put(i, j, s0); put(i, j + 1, s1); put(i, j + 2, s2); put(i, j + 3, s3);
    }
    for (; j <= i; j++) {
      const b = rows[j];
      let s = 0;
      for (let d = 0; d < n; d++) s += a[d] * b[d];
      put(i, j, s);
    }
  }
  return m;
}

export interface EwmaCovarianceOptions {
  /** days whose zero-mean equal-weight covariance starts the recursion; default min(30, T) (stated) */
  startupDays?: number;
}

/**
 * EWMA covariance Σₙ = λΣₙ₋₁ + (1−λ)·rₙ₋₁rₙ₋₁ᵀ, started from the zero-mean covariance of the first k days;
 * returns the forecast for the day after the last return.
 * @throws {RangeError} "ewmaCovariance requires 0 < lambda < 1"
 */
export function ewmaCovariance(returns: readonly ArrayLike<number>[], lambda: number, options: EwmaCovarianceOptions = {}): SymmetricMatrix {
  if (!(lambda > 0 && lambda < 1)) throw new RangeError("ewmaCovariance requires 0 < lambda < 1");
  const t = checkFactors("ewmaCovariance", returns);
  const startup = options.startupDays ?? Math.min(30, t);
  if (!(Number.isInteger(startup) && startup >= 1 && startup <= t)) throw new RangeError(`ewmaCovariance requires 1 <= startupDays <= ${t}`);
  const k = returns.length;
  // Σ_T = λ^T Σ₀ + (1−λ) Σ_{s<T} λ^{T−1−s} r_s r_sᵀ, as one weighted cross product
  const weights = new Float64Array(t);
  for (let s = 0; s < t; s++) weights[s] = (1 - lambda) * Math.pow(lambda, t - 1 - s);
  const startWeight = Math.pow(lambda, t) / startup;
  for (let s = 0; s < startup; s++) weights[s] += startWeight;
  const scaled = returns.map((r) => {
    const out = new Float64Array(t);
    for (let s = 0; s < t; s++) out[s] = r[s] * Math.sqrt(weights[s]);
    return out;
  });
  return crossProduct(scaled, 1, k);
}

/**
 * Constant correlation of standardised residuals zᵢₜ = rᵢₜ/σᵢₜ over [start, end):
 * ρᵢⱼ = Σ zᵢzⱼ / √(Σzᵢ² Σzⱼ²) (zero-mean, as the residuals of a zero-mean model).
 * @param returns factor returns (residuals)
 * @param variances conditional variance of each return, factor by factor
 */
export function standardisedCorrelation(
  returns: readonly ArrayLike<number>[],
  variances: readonly ArrayLike<number>[],
  start = 0,
  end = returns[0]?.length ?? 0,
): SymmetricMatrix {
  checkFactors("standardisedCorrelation", returns);
  if (variances.length !== returns.length) throw new RangeError("standardisedCorrelation requires one variance series per factor");
  const n = end - start;
  if (n < 2) throw new RangeError("standardisedCorrelation requires at least 2 days");
  const k = returns.length;
  const z = returns.map((r, i) => {
    const v = variances[i];
    const out = new Float64Array(n);
    let ss = 0;
    for (let d = 0; d < n; d++) {
      const x = r[start + d] / Math.sqrt(v[start + d]);
      out[d] = x;
      ss += x * x;
    }
    const norm = ss > 0 ? 1 / Math.sqrt(ss) : 0;
    for (let d = 0; d < n; d++) out[d] *= norm;
    return out;
  });
  const m = crossProduct(z, 1, k);
  for (let i = 0; i < k; i++) m.values[i * k + i] = 1;
  return m;
}
