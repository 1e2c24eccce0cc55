import { describe, expect, it } from "vitest";
import { EigenvalueDecomposition, Matrix } from "ml-matrix";
import { nearestCorrelation } from "@/lib/risk/portfolio/nearest-correlation";
import { matrixFromRows, matrixToRows } from "@/lib/risk/portfolio/matrix";
import { mulberry32, normalSampler } from "@/lib/risk/random";

const minEig = (rows: number[][]) => Math.min(...new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true }).realEigenvalues);

describe("nearest correlation matrix (Higham 2002, alternating projections with Dykstra's correction)", () => {
  it("the 3×3 example of Higham (2002): A = [1 1 0; 1 1 1; 0 1 1]", () => {
    // Higham (2002), "Computing the nearest correlation matrix — a problem from finance", IMA J. Numer. Anal. 22,
    // reports X ≈ [1 0.7607 0.1573; 0.7607 1 0.7607; 0.1573 0.7607 1] — these four digits are FROM MEMORY.
    // Independent check worked by hand: A is unchanged by reversing the order of the variables and the nearest
    // correlation matrix is unique, so X = [1 a b; a 1 a; b a 1]; ‖X − A‖²_F = 4(1 − a)² + 2b². X is PSD iff b ≤ 1 and
    // 1 + b ≥ 2a² (the eigenvalues of the symmetric part [1+b, a; 2a, 1]); at the optimum the second binds,
    // b = 2a² − 1, and d/da [4(1 − a)² + 2(2a² − 1)²] = 0 gives 4a³ − a − 1 = 0.
    const r = nearestCorrelation(matrixFromRows([[1, 1, 0], [1, 1, 1], [0, 1, 1]]));
    let a = 0.76;
    for (let i = 0; i < 60; i++) a -= (4 * a ** 3 - a - 1) / (12 * a * a - 1); // Newton on 4a³ − a − 1 = 0
    const b = 2 * a * a - 1;
    const x = matrixToRows(r.matrix);
    expect(x[0][1]).toBeCloseTo(0.7607, 4); // Higham (2002), from memory
    expect(x[0][2]).toBeCloseTo(0.1573, 4); // Higham (2002), from memory
    expect(Math.abs(x[0][1] - a)).toBeLessThan(1e-9); // worked by hand, above
    expect(Math.abs(x[1][2] - a)).toBeLessThan(1e-9); // worked by hand, above
    expect(Math.abs(x[0][2] - b)).toBeLessThan(1e-9); // worked by hand, above
    expect(Math.abs(r.frobeniusDistance - Math.sqrt(4 * (1 - a) ** 2 + 2 * b * b))).toBeLessThan(1e-9); // the distance moved
    expect(r.negativeEigenvaluesBefore).toBe(1); // A has eigenvalues 1 − √2, 1, 1 + √2
    expect(r.minEigenvalueBefore).toBeCloseTo(1 - Math.SQRT2, 12);
  });

  it("on a random indefinite matrix: a correlation matrix, PSD, and no feasible point found is closer (optimality)", () => {
    // Property check, common practice, no source: for the projection X of A onto the convex set of correlation
    // matrices, ⟨A − X, Z − X⟩_F ≤ 0 for every correlation matrix Z (the variational inequality of a projection).
    const n = 6;
    const rng = mulberry32(13);
    const rows = Array.from({ length: n }, () => new Array(n).fill(0));
    for (let i = 0; i < n; i++) {
      rows[i][i] = 1;
      for (let j = 0; j < i; j++) rows[i][j] = rows[j][i] = 2 * rng() - 1;
    }
    expect(minEig(rows)).toBeLessThan(0);
    const r = nearestCorrelation(matrixFromRows(rows));
    const x = matrixToRows(r.matrix);
    expect(r.converged).toBe(true);
    for (let i = 0; i < n; i++) expect(x[i][i]).toBe(1);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(x[i][j]).toBe(x[j][i]);
    expect(minEig(x)).toBeGreaterThan(-1e-10);
    const normal = normalSampler(mulberry32(29));
    for (let trial = 0; trial < 200; trial++) {
      // a random correlation matrix Z = D^(−1/2) G Gᵀ D^(−1/2) from a random n × n factor G
      const g = Array.from({ length: n }, () => Array.from({ length: n }, () => normal()));
      const c = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => g[i].reduce((s, v, k) => s + v * g[j][k], 0)));
      let inner = 0;
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
        const z = c[i][j] / Math.sqrt(c[i][i] * c[j][j]);
        inner += (rows[i][j] - x[i][j]) * (z - x[i][j]);
      }
      expect(inner).toBeLessThan(1e-8);
    }
  });

  it("a positive semi-definite input comes back unchanged, distance 0", () => {
    const r = nearestCorrelation(matrixFromRows([[1, 0.3], [0.3, 1]]));
    expect(matrixToRows(r.matrix)).toEqual([[1, 0.3], [0.3, 1]]);
    expect(r.frobeniusDistance).toBe(0);
  });
});
