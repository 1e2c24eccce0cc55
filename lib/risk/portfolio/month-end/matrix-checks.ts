/** The month-end run's matrix checks: PSD warnings, the nearest correlation repair, a refit's constant correlation. */
import type { EngineWarning } from "../../types";
import { standardisedCorrelation } from "../covariance";
import type { SymmetricMatrix } from "../matrix";
import { checkPsd, type PsdRepair } from "../psd";
import { nearestCorrelation } from "../nearest-correlation";
import type { PreparedRun } from "./types";

/** The warnings a PSD check and repair give, each sentence true of what was done. */
export function psdWarnings(psd: PreparedRun["psd"], warnings: EngineWarning[]): void {
  if (psd.repair) {
    const how =
      psd.matrix === "correlation"
        ? "it was replaced by the nearest correlation matrix in the Frobenius norm (Higham 2002, alternating projections with Dykstra's correction)"
        : "it was replaced by the nearest positive semi-definite matrix in the Frobenius norm (negative eigenvalues set to zero, Higham 1988)";
    warnings.push({
      code: "matrix-repaired",
      message: `The ${psd.matrix} matrix was not positive semi-definite (${psd.repair.negativeEigenvalues} negative eigenvalue(s), smallest ${psd.repair.minEigenvalueBefore.toExponential(3)}); ${how}, a distance of ${psd.repair.frobeniusChange.toExponential(3)} in the Frobenius norm (${(psd.repair.relativeChange * 100).toFixed(4)} % relative, largest element change ${psd.repair.maxElementChange.toExponential(3)}).`,
    });
  }
  if (psd.check.status === "positive-semidefinite") {
    warnings.push({ code: "matrix-singular", message: `The ${psd.matrix} matrix is positive semi-definite but singular (${psd.check.zeroPivots} zero pivot(s)): some factor combinations have no variance in the sample, typically when there are more factors than days.` });
  }
}

/** The constant correlation of standardised residuals over [first, end), repaired if need be (a refit's R). */
export function cccAt(returns: readonly Float64Array[], paths: readonly Float64Array[], first: number, end: number): SymmetricMatrix {
  const r = standardisedCorrelation(returns, paths, first, end);
  return checkPsd(r).status === "indefinite" ? nearestCorrelation(r).matrix : r;
}

/** The nearest correlation matrix as a PsdRepair record (with the matrix). */
export function nearestCorrelationRepair(r: SymmetricMatrix): PsdRepair {
  const near = nearestCorrelation(r);
  let norm = 0;
  let maxElement = 0;
  for (let i = 0; i < r.values.length; i++) {
    norm += r.values[i] * r.values[i];
    maxElement = Math.max(maxElement, Math.abs(near.matrix.values[i] - r.values[i]));
  }
  return {
    matrix: near.matrix,
    repaired: near.negativeEigenvaluesBefore > 0,
    minEigenvalueBefore: near.minEigenvalueBefore,
    negativeEigenvalues: near.negativeEigenvaluesBefore,
    frobeniusChange: near.frobeniusDistance,
    relativeChange: norm > 0 ? near.frobeniusDistance / Math.sqrt(norm) : 0,
    maxElementChange: maxElement,
    method: `${near.method}; ${near.iterations} iteration(s)${near.converged ? "" : ", stopped at the iteration limit"}`,
  };
}

/** A PSD repair record without its matrix, as the result reports it. */
export function stripMatrix(r: PsdRepair): Omit<PsdRepair, "matrix"> {
  const { matrix: _matrix, ...rest } = r;
  void _matrix;
  return rest;
}
