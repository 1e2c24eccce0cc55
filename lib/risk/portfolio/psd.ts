/**
 * Positive semi-definiteness: a check by a semi-definite Cholesky factorisation (fast, exact on
 * positive-definite input, tolerant of rank deficiency), and a repair to the nearest positive semi-definite
 * matrix in the Frobenius norm (Higham 1988: clip negative eigenvalues to zero) via ml-matrix's symmetric
 * eigendecomposition, reporting the size of the repair.
 */
import { EigenvalueDecomposition, Matrix } from "ml-matrix";
import { zeroMatrix, type SymmetricMatrix } from "./matrix";

export interface PsdCheck {
  status: "positive-definite" | "positive-semidefinite" | "indefinite";
  /** the number of pivots treated as zero (rank deficiency found) */
  zeroPivots: number;
  /** the relative tolerance used on the pivots */
  tolerance: number;
}

/**
 * Check positive (semi-)definiteness with a Cholesky factorisation whose pivots may be zero within a
 * relative tolerance (default 1e-10 × the largest diagonal element).
 * @throws {RangeError} if the matrix is not symmetric
 */
export function checkPsd(m: SymmetricMatrix, relativeTolerance = 1e-10): PsdCheck {
  const n = m.size;
  const a = m.values;
  let maxDiag = 0;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(a[i * n + i])) throw new RangeError("checkPsd requires finite values");
    maxDiag = Math.max(maxDiag, Math.abs(a[i * n + i]));
    for (let j = 0; j < i; j++) {
      const x = a[i * n + j];
      const y = a[j * n + i];
      if (Math.abs(x - y) > 1e-12 * Math.max(1, Math.abs(x), Math.abs(y))) throw new RangeError("checkPsd requires a symmetric matrix");
    }
  }
  const tol = relativeTolerance * (maxDiag || 1);
  const offTol = Math.sqrt(tol * (maxDiag || 1)) * 1e-2;
  const l = new Float64Array(n * n); // lower factor, row-major
  let zeroPivots = 0;
  for (let j = 0; j < n; j++) {
    const lj = j * n;
    let d = a[lj + j];
    for (let k = 0; k < j; k++) d -= l[lj + k] * l[lj + k];
    if (d < -tol) return { status: "indefinite", zeroPivots, tolerance: relativeTolerance };
    if (d <= tol) {
      // a zero pivot: the rest of the column must vanish too, or the matrix is indefinite
      for (let i = j + 1; i < n; i++) {
        const li = i * n;
        let v = a[li + j];
        for (let k = 0; k < j; k++) v -= l[li + k] * l[lj + k];
        if (Math.abs(v) > offTol) return { status: "indefinite", zeroPivots, tolerance: relativeTolerance };
      }
      zeroPivots++;
      continue; // column j of L stays zero
    }
    const root = Math.sqrt(d);
    l[lj + j] = root;
    for (let i = j + 1; i < n; i++) {
      const li = i * n;
      let v = a[li + j];
      for (let k = 0; k < j; k++) v -= l[li + k] * l[lj + k];
      l[li + j] = v / root;
    }
  }
  return { status: zeroPivots ? "positive-semidefinite" : "positive-definite", zeroPivots, tolerance: relativeTolerance };
}

export interface PsdRepair {
  matrix: SymmetricMatrix;
  repaired: boolean;
  /** smallest eigenvalue before the repair */
  minEigenvalueBefore: number;
  negativeEigenvalues: number;
  /** ‖repaired − original‖_F */
  frobeniusChange: number;
  /** ‖repaired − original‖_F / ‖original‖_F */
  relativeChange: number;
  /** largest change of a single element */
  maxElementChange: number;
  method: string;
}

/**
 * Nearest positive semi-definite matrix: eigenvalues below zero set to zero (nearest in the Frobenius norm);
 * with keepUnitDiagonal (for a correlation matrix) the result is rescaled to a unit diagonal afterwards.
 */
export function repairPsd(m: SymmetricMatrix, options: { keepUnitDiagonal?: boolean } = {}): PsdRepair {
  const n = m.size;
  const rows: number[][] = [];
  for (let i = 0; i < n; i++) rows.push(Array.from(m.values.subarray(i * n, (i + 1) * n)));
  const eig = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true });
  const lambdas = eig.realEigenvalues;
  const vectors = eig.eigenvectorMatrix;
  let minEig = Infinity;
  let negative = 0;
  for (const x of lambdas) {
    minEig = Math.min(minEig, x);
    if (x < 0) negative++;
  }
  const out = zeroMatrix(n);
  if (negative === 0) {
    out.values.set(m.values);
  } else {
    const v = vectors.to2DArray();
    const clipped = lambdas.map((x) => Math.max(0, x));
    for (let i = 0; i < n; i++) {
      for (let j = 0; j <= i; j++) {
        let s = 0;
        for (let k = 0; k < n; k++) s += v[i][k] * clipped[k] * v[j][k];
        out.values[i * n + j] = s;
        out.values[j * n + i] = s;
      }
    }
    if (options.keepUnitDiagonal) {
      const d = new Float64Array(n);
      for (let i = 0; i < n; i++) d[i] = Math.sqrt(out.values[i * n + i]) || 1;
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out.values[i * n + j] /= d[i] * d[j];
    }
  }
  let change = 0;
  let norm = 0;
  let maxElement = 0;
  for (let i = 0; i < n * n; i++) {
    const diff = out.values[i] - m.values[i];
    change += diff * diff;
    norm += m.values[i] * m.values[i];
    maxElement = Math.max(maxElement, Math.abs(diff));
  }
  return {
    matrix: out,
    repaired: negative > 0,
    minEigenvalueBefore: minEig,
    negativeEigenvalues: negative,
    frobeniusChange: Math.sqrt(change),
    relativeChange: norm > 0 ? Math.sqrt(change / norm) : 0,
    maxElementChange: maxElement,
    method: options.keepUnitDiagonal
      ? "negative eigenvalues set to zero (nearest PSD in the Frobenius norm), then rescaled to a unit diagonal"
      : "negative eigenvalues set to zero (nearest PSD in the Frobenius norm)",
  };
}
