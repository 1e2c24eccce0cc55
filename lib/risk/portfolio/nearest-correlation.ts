/**
 * The nearest correlation matrix in the Frobenius norm: Higham (2002), "Computing the nearest correlation
 * matrix — a problem from finance", IMA Journal of Numerical Analysis 22, 329–343, Algorithm 3.3: alternating
 * projections onto the positive semi-definite cone and onto the unit-diagonal matrices, with Dykstra's
 * correction on the first. The eigendecompositions are ml-matrix's symmetric EigenvalueDecomposition.
 */
import { EigenvalueDecomposition, Matrix } from "ml-matrix";
import { zeroMatrix, type SymmetricMatrix } from "./matrix";

export interface NearestCorrelationOptions {
  /** stop when the relative changes of both iterates and their gap fall below this (default 1e-12) */
  tolerance?: number;
  /** at most this many iterations (default 500) */
  maxIterations?: number;
}

export interface NearestCorrelation {
  matrix: SymmetricMatrix;
  /** ‖result − input‖_F */
  frobeniusDistance: number;
  iterations: number;
  converged: boolean;
  /** eigenvalues of the input below zero, and the smallest */
  negativeEigenvaluesBefore: number;
  minEigenvalueBefore: number;
  /** smallest eigenvalue of the result (≥ 0 up to the tolerance) */
  minEigenvalueAfter: number;
  method: string;
}

function eig(values: Float64Array, n: number): { lambdas: number[]; vectors: number[][] } {
  const rows: number[][] = [];
  for (let i = 0; i < n; i++) rows.push(Array.from(values.subarray(i * n, (i + 1) * n)));
  const e = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true });
  return { lambdas: e.realEigenvalues, vectors: e.eigenvectorMatrix.to2DArray() };
}

/** Projection onto the PSD cone: negative eigenvalues set to zero (Higham 1988). */
function projectPsd(values: Float64Array, n: number, out: Float64Array): number {
  const { lambdas, vectors } = eig(values, n);
  let min = Infinity;
  for (const x of lambdas) min = Math.min(min, x);
  if (min >= 0) {
    out.set(values);
    return min;
  }
  const keep: number[] = [];
  for (let k = 0; k < n; k++) if (lambdas[k] > 0) keep.push(k);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = 0;
      for (const k of keep) s += vectors[i][k] * lambdas[k] * vectors[j][k];
      out[i * n + j] = s;
      out[j * n + i] = s;
    }
  }
  return min;
}

function frobenius(a: Float64Array, b?: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) { const d = b ? a[i] - b[i] : a[i]; s += d * d; }
  return Math.sqrt(s);
}

/**
 * The nearest correlation matrix to a symmetric matrix with unit diagonal (e.g. a correlation estimate that is
 * not positive semi-definite). A PSD input comes back unchanged with distance 0.
 * @throws {RangeError} if the matrix is not symmetric or has non-finite values
 */
export function nearestCorrelation(a: SymmetricMatrix, options: NearestCorrelationOptions = {}): NearestCorrelation {
  const n = a.size;
  const tol = options.tolerance ?? 1e-12;
  const maxIterations = options.maxIterations ?? 500;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      const x = a.values[i * n + j];
      const y = a.values[j * n + i];
      if (!Number.isFinite(x) || !Number.isFinite(y)) throw new RangeError("nearestCorrelation requires finite values");
      if (Math.abs(x - y) > 1e-12 * Math.max(1, Math.abs(x))) throw new RangeError("nearestCorrelation requires a symmetric matrix");
    }
  }
  const before = eig(a.values, n);
  let minBefore = Infinity;
  let negative = 0;
  for (const x of before.lambdas) { minBefore = Math.min(minBefore, x); if (x < 0) negative++; }
  const method = "nearest correlation matrix in the Frobenius norm (Higham 2002, alternating projections with Dykstra's correction)";
  if (negative === 0) {
    const m = zeroMatrix(n);
    m.values.set(a.values);
    return { matrix: m, frobeniusDistance: 0, iterations: 0, converged: true, negativeEigenvaluesBefore: 0, minEigenvalueBefore: minBefore, minEigenvalueAfter: minBefore, method };
  }
  const size = n * n;
  let y = Float64Array.from(a.values);
  const ds = new Float64Array(size);
  const r = new Float64Array(size);
  let x = new Float64Array(size);
  let xPrev = new Float64Array(size);
  let yPrev = Float64Array.from(y);
  let iterations = 0;
  let converged = false;
  while (iterations < maxIterations) {
    iterations++;
    for (let i = 0; i < size; i++) r[i] = y[i] - ds[i];
    [xPrev, x] = [x, xPrev];
    projectPsd(r, n, x);
    for (let i = 0; i < size; i++) ds[i] = x[i] - r[i];
    [yPrev, y] = [y, yPrev];
    y.set(x);
    for (let i = 0; i < n; i++) y[i * n + i] = 1;
    const ny = frobenius(y) || 1;
    const nx = frobenius(x) || 1;
    if (frobenius(x, xPrev) / nx < tol && frobenius(y, yPrev) / ny < tol && frobenius(y, x) / ny < tol) {
      converged = true;
      break;
    }
  }
  const m = zeroMatrix(n);
  m.values.set(y);
  const after = eig(y, n);
  return {
    matrix: m,
    frobeniusDistance: frobenius(y, a.values),
    iterations,
    converged,
    negativeEigenvaluesBefore: negative,
    minEigenvalueBefore: minBefore,
    minEigenvalueAfter: Math.min(...after.lambdas),
    method,
  };
}
