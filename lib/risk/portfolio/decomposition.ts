/**
 * Euler allocation of parametric VaR: with VaR = q·σₚ and σₚ = √(eᵀΣe), the marginal VaR of factor i is
 * ∂VaR/∂eᵢ = q·(Σe)ᵢ/σₚ and the component VaR eᵢ·∂VaR/∂eᵢ; components sum to the total (VaR is
 * homogeneous of degree one in the exposures). Aggregation to positions, asset classes and currencies sums
 * components, so every level adds up to the total.
 */
import { matVec, type SymmetricMatrix } from "./matrix";
import { varMultiplier, esMultiplier, type ParametricOptions } from "../var/parametric";

export interface EulerDecomposition {
  /** portfolio P&L standard deviation σₚ */
  sigma: number;
  var: number;
  es: number;
  /** ∂VaR/∂eᵢ per factor */
  marginal: Float64Array;
  /** eᵢ·∂VaR/∂eᵢ per factor; sums to var */
  component: Float64Array;
  /** ES components (the same shares: parametric ES is a multiple of σₚ) */
  componentEs: Float64Array;
}

/**
 * Parametric VaR and ES with their Euler decomposition by factor.
 * @param exposures P&L per unit return of each factor
 * @param cov covariance of factor returns over the horizon
 * @throws {RangeError} on a size mismatch or a negative portfolio variance (a matrix that is not PSD)
 */
export function eulerDecomposition(
  exposures: ArrayLike<number>,
  cov: SymmetricMatrix,
  confidence: number,
  options: ParametricOptions = {},
): EulerDecomposition {
  if (exposures.length !== cov.size) throw new RangeError("eulerDecomposition requires one exposure per factor");
  const q = varMultiplier(confidence, options);
  const qEs = esMultiplier(confidence, options);
  const se = matVec(cov, exposures);
  let variance = 0;
  for (let i = 0; i < cov.size; i++) variance += exposures[i] * se[i];
  if (variance < -1e-12 * Math.abs(variance)) throw new RangeError("eulerDecomposition found a negative portfolio variance: the covariance matrix is not PSD");
  const sigma = Math.sqrt(Math.max(0, variance));
  const n = cov.size;
  const marginal = new Float64Array(n);
  const component = new Float64Array(n);
  const componentEs = new Float64Array(n);
  if (sigma > 0) {
    for (let i = 0; i < n; i++) {
      marginal[i] = (q * se[i]) / sigma;
      component[i] = exposures[i] * marginal[i];
      componentEs[i] = (exposures[i] * qEs * se[i]) / sigma;
    }
  }
  return { sigma, var: q * sigma, es: qEs * sigma, marginal, component, componentEs };
}

/** One position's exposures: factor indices and the P&L per unit return of each. */
export interface PositionLoadings {
  factorIndices: readonly number[];
  amounts: readonly number[];
}

/** Allocate factor-level marginal figures to positions: Σ amount × marginal over the position's factors. */
export function allocateToPositions(loadings: readonly PositionLoadings[], marginal: ArrayLike<number>): Float64Array {
  const out = new Float64Array(loadings.length);
  loadings.forEach((l, j) => {
    let s = 0;
    for (let k = 0; k < l.factorIndices.length; k++) s += l.amounts[k] * marginal[l.factorIndices[k]];
    out[j] = s;
  });
  return out;
}

/** Sum values by a group label (e.g. asset class or currency), keeping first-seen order. */
export function sumByGroup(values: ArrayLike<number>, groups: readonly string[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (let i = 0; i < groups.length; i++) out[groups[i]] = (out[groups[i]] ?? 0) + values[i];
  return out;
}
