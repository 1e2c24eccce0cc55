/** A small dense symmetric-matrix type for the portfolio engine: row-major Float64Array, n × n. */

export interface SymmetricMatrix {
  size: number;
  /** row-major values, length size² */
  values: Float64Array;
}

/** A zero n × n matrix. */
export function zeroMatrix(size: number): SymmetricMatrix {
  return { size, values: new Float64Array(size * size) };
}

/** Build a matrix from rows (copied). @throws {RangeError} if the rows are not square */
export function matrixFromRows(rows: readonly (readonly number[])[]): SymmetricMatrix {
  const n = rows.length;
  const m = zeroMatrix(n);
  rows.forEach((row, i) => {
    if (row.length !== n) throw new RangeError("matrixFromRows requires a square matrix");
    for (let j = 0; j < n; j++) m.values[i * n + j] = row[j];
  });
  return m;
}

/** Rows of a matrix as plain arrays (for output). */
export function matrixToRows(m: SymmetricMatrix): number[][] {
  const out: number[][] = [];
  for (let i = 0; i < m.size; i++) out.push(Array.from(m.values.subarray(i * m.size, (i + 1) * m.size)));
  return out;
}

/** M·x. */
export function matVec(m: SymmetricMatrix, x: ArrayLike<number>): Float64Array {
  const n = m.size;
  if (x.length !== n) throw new RangeError("matVec requires a vector of the matrix's size");
  const out = new Float64Array(n);
  const v = m.values;
  for (let i = 0; i < n; i++) {
    let s = 0;
    const row = i * n;
    for (let j = 0; j < n; j++) s += v[row + j] * x[j];
    out[i] = s;
  }
  return out;
}

/** xᵀ·M·x. */
export function quadraticForm(m: SymmetricMatrix, x: ArrayLike<number>): number {
  const mx = matVec(m, x);
  let s = 0;
  for (let i = 0; i < m.size; i++) s += x[i] * mx[i];
  return s;
}

/** The correlation matrix and volatilities of a covariance matrix (zero variance gives zero correlation). */
export function covarianceToCorrelation(cov: SymmetricMatrix): { correlation: SymmetricMatrix; volatilities: Float64Array } {
  const n = cov.size;
  const vols = new Float64Array(n);
  for (let i = 0; i < n; i++) vols[i] = Math.sqrt(Math.max(0, cov.values[i * n + i]));
  const corr = zeroMatrix(n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const d = vols[i] * vols[j];
      corr.values[i * n + j] = i === j ? 1 : d > 0 ? cov.values[i * n + j] / d : 0;
    }
  }
  return { correlation: corr, volatilities: vols };
}

/** D·R·D: a covariance from volatilities and a correlation matrix. */
export function correlationToCovariance(correlation: SymmetricMatrix, volatilities: ArrayLike<number>): SymmetricMatrix {
  const n = correlation.size;
  if (volatilities.length !== n) throw new RangeError("correlationToCovariance requires one volatility per row");
  const cov = zeroMatrix(n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) cov.values[i * n + j] = correlation.values[i * n + j] * volatilities[i] * volatilities[j];
  }
  return cov;
}
