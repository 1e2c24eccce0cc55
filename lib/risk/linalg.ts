/** Small dense linear algebra for standard errors (row-major Float64Array matrices). */

/** Inverse of an n×n matrix by Gauss–Jordan elimination with partial pivoting; null when singular. */
export function invertMatrix(a: ArrayLike<number>, n: number): Float64Array | null {
  const m = Float64Array.from(a);
  const inv = new Float64Array(n * n);
  for (let i = 0; i < n; i++) inv[i * n + i] = 1;
  let scale = 0;
  for (let i = 0; i < n * n; i++) scale = Math.max(scale, Math.abs(m[i]));
  if (!(scale > 0) || !Number.isFinite(scale)) return null;
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r * n + c]) > Math.abs(m[p * n + c])) p = r;
    const pivot = m[p * n + c];
    if (Math.abs(pivot) <= 1e-14 * scale) return null;
    if (p !== c) for (let k = 0; k < n; k++) {
      let t = m[c * n + k]; m[c * n + k] = m[p * n + k]; m[p * n + k] = t;
      t = inv[c * n + k]; inv[c * n + k] = inv[p * n + k]; inv[p * n + k] = t;
    }
    for (let k = 0; k < n; k++) { m[c * n + k] /= pivot; inv[c * n + k] /= pivot; }
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = m[r * n + c];
      if (f === 0) continue;
      for (let k = 0; k < n; k++) { m[r * n + k] -= f * m[c * n + k]; inv[r * n + k] -= f * inv[c * n + k]; }
    }
  }
  return inv;
}

/** Product of two n×n matrices. */
export function multiplyMatrices(a: ArrayLike<number>, b: ArrayLike<number>, n: number): Float64Array {
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) {
    const v = a[i * n + k];
    if (v === 0) continue;
    for (let j = 0; j < n; j++) out[i * n + j] += v * b[k * n + j];
  }
  return out;
}
