/**
 * Explain the change in parametric VaR between two runs (last month, this month) by a stated, ordered
 * decomposition of Σ = D·R·D (volatilities D, correlations R) and the exposures e:
 *   1. positions:    VaR(e₁, D₀, R₀) − VaR(e₀, D₀, R₀)
 *   2. volatilities: VaR(e₁, D₁, R₀) − VaR(e₁, D₀, R₀)
 *   3. correlations: VaR(e₁, D₁, R₁) − VaR(e₁, D₁, R₀)
 * The three steps add up to the whole change exactly; a different order gives different steps (stated).
 */
import { covarianceToCorrelation, quadraticForm, zeroMatrix, type SymmetricMatrix } from "./matrix";
import { prepareRun, type MonthEndInput } from "./run-month-end";
import { varMultiplier, type ParametricOptions } from "../var/parametric";
import type { EngineWarning } from "../types";
import { ENGINE_VERSION } from "../version";
import { countOf, isAre, listSome } from "../../text/count";

/** What a parametric VaR needs: factors, exposures, one-day volatilities and correlations. */
export interface PortfolioState {
  factors: readonly string[];
  exposures: ArrayLike<number>;
  volatilities: ArrayLike<number>;
  correlation: SymmetricMatrix;
}

export interface ExplainStep {
  step: "positions" | "volatilities" | "correlations";
  from: number;
  to: number;
  change: number;
  description: string;
}

export interface VarExplanation {
  confidence: number;
  previousVar: number;
  currentVar: number;
  change: number;
  steps: ExplainStep[];
  order: string;
  newFactors: string[];
  droppedFactors: string[];
  warnings: EngineWarning[];
  engineVersion: string;
}

function onUnion(state: PortfolioState, union: readonly string[], other: PortfolioState): { e: Float64Array; d: Float64Array; r: SymmetricMatrix } {
  const n = union.length;
  const own = new Map(state.factors.map((f, i) => [f, i]));
  const alt = new Map(other.factors.map((f, i) => [f, i]));
  const e = new Float64Array(n);
  const d = new Float64Array(n);
  const r = zeroMatrix(n);
  union.forEach((f, a) => {
    const i = own.get(f);
    const j = alt.get(f) as number;
    e[a] = i !== undefined ? state.exposures[i] : 0;
    d[a] = i !== undefined ? state.volatilities[i] : other.volatilities[j];
  });
  const sO = state.correlation.size;
  const sA = other.correlation.size;
  for (let a = 0; a < n; a++) {
    for (let b = 0; b < n; b++) {
      if (a === b) { r.values[a * n + b] = 1; continue; }
      const ia = own.get(union[a]), ib = own.get(union[b]);
      if (ia !== undefined && ib !== undefined) { r.values[a * n + b] = state.correlation.values[ia * sO + ib]; continue; }
      const ja = alt.get(union[a]), jb = alt.get(union[b]);
      r.values[a * n + b] = ja !== undefined && jb !== undefined ? other.correlation.values[ja * sA + jb] : 0;
    }
  }
  return { e, d, r };
}

function varOf(e: Float64Array, d: Float64Array, r: SymmetricMatrix, q: number): number {
  const w = e.map((x, i) => x * d[i]);
  return q * Math.sqrt(Math.max(0, quadraticForm(r, w)));
}

/**
 * Attribute the change in parametric VaR from `previous` to `current` to positions, volatilities and
 * correlations, in that order. A factor present in one state only borrows the other's volatility and
 * correlations, so its arrival or departure shows in the positions step.
 * @throws {RangeError} "explainVarChange requires 0 < confidence < 1"
 */
export function explainVarChange(previous: PortfolioState, current: PortfolioState, confidence = 0.99, options: ParametricOptions = {}): VarExplanation {
  if (!(confidence > 0 && confidence < 1)) throw new RangeError("explainVarChange requires 0 < confidence < 1");
  const q = varMultiplier(confidence, options);
  const union = [...new Set([...previous.factors, ...current.factors])];
  const p = onUnion(previous, union, current);
  const c = onUnion(current, union, previous);
  const v0 = varOf(p.e, p.d, p.r, q);
  const v1 = varOf(c.e, p.d, p.r, q);
  const v2 = varOf(c.e, c.d, p.r, q);
  const v3 = varOf(c.e, c.d, c.r, q);
  const prevSet = new Set(previous.factors);
  const curSet = new Set(current.factors);
  const newFactors = current.factors.filter((f) => !prevSet.has(f));
  const droppedFactors = previous.factors.filter((f) => !curSet.has(f));
  const warnings: EngineWarning[] = [];
  if (newFactors.length) warnings.push({ code: "new-factors", message: `${countOf(newFactors.length, "factor")} ${isAre(newFactors.length)} new this run; last run's figures use this run's volatilities and correlations for ${newFactors.length === 1 ? "it" : "them"}: ${listSome(newFactors, 10)}.` });
  if (droppedFactors.length) warnings.push({ code: "dropped-factors", message: `${countOf(droppedFactors.length, "factor")} of last run ${isAre(droppedFactors.length)} not in this run: ${listSome(droppedFactors, 10)}.` });
  return {
    confidence,
    previousVar: v0,
    currentVar: v3,
    change: v3 - v0,
    steps: [
      { step: "positions", from: v0, to: v1, change: v1 - v0, description: "this run's exposures with last run's volatilities and correlations" },
      { step: "volatilities", from: v1, to: v2, change: v2 - v1, description: "then this run's volatilities, last run's correlations" },
      { step: "correlations", from: v2, to: v3, change: v3 - v2, description: "then this run's correlations" },
    ],
    order: "positions, then volatilities, then correlations (sequential; another order attributes the cross effects differently)",
    newFactors,
    droppedFactors,
    warnings,
    engineVersion: ENGINE_VERSION,
  };
}

/** The parametric state of a run's inputs, with the run's own covariance choice. */
export function portfolioState(input: MonthEndInput): PortfolioState {
  const prepared = prepareRun({ ...input, method: { ...input.method, methods: ["parametric"], primaryMethod: "parametric" } });
  const { correlation, volatilities } = covarianceToCorrelation(prepared.covariance);
  return { factors: prepared.factorIds, exposures: prepared.exposures, volatilities, correlation };
}

/** Explain the change in one-day parametric VaR between two runs' inputs (last month, this month). */
export function explainRuns(previous: MonthEndInput, current: MonthEndInput, confidence = 0.99): VarExplanation {
  const options: ParametricOptions = { distribution: current.method?.distribution, nu: current.method?.nu };
  return explainVarChange(portfolioState(previous), portfolioState(current), confidence, options);
}
