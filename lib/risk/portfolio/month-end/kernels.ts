/** The month-end run's numeric kernels: scenario P&L, historical and parametric evaluation, sorting losses. */
import { esMultiplier, varMultiplier, type ParametricOptions } from "../../var/parametric";
import { historicalTail, tailOfSortedLosses } from "../../var/historical";
import { matVec, type SymmetricMatrix } from "../matrix";
import type { VarFigure } from "./types";

/** Scenario returns for historical simulation. */
export interface Scenarios {
  /** factor-major scenario returns */
  x: Float64Array[];
  count: number;
}

/** VaR, ES and their marginal figures per factor. */
export interface Evaluation {
  var: number;
  es: number;
  varMarginal: Float64Array;
  esMarginal: Float64Array;
}


/** How many values at the end are finite: a factor's unbroken history up to the last date. */
export function trailingRun(values: ArrayLike<number>): number {
  let n = 0;
  for (let t = values.length - 1; t >= 0 && Number.isFinite(values[t]); t--) n++;
  return n;
}

/** VaR (type-7) and ES (fractional tail mean) from ascending losses; the convention of historicalTail. */
export function tailOfSorted(losses: Float64Array, confidence: number): VarFigure {
  return tailOfSortedLosses(losses, confidence);
}

/** The book's P&L in each scenario: exposures times factor-major scenario returns. */
export function scenarioPnl(sc: Scenarios, e: ArrayLike<number>): Float64Array {
  const p = new Float64Array(sc.count);
  for (let i = 0; i < sc.x.length; i++) {
    const ei = e[i];
    if (ei === 0) continue;
    const xi = sc.x[i];
    for (let s = 0; s < sc.count; s++) p[s] += ei * xi[s];
  }
  return p;
}

/** Historical VaR and ES of an exposure vector over scenarios, with each factor's marginal (Euler) figures. */
export function evaluateScenarios(sc: Scenarios, e: ArrayLike<number>, confidence: number): Evaluation {
  const tail = historicalTail(scenarioPnl(sc, e), confidence);
  const k = sc.x.length;
  const varMarginal = new Float64Array(k);
  const esMarginal = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    const xi = sc.x[i];
    let a = 0;
    for (let j = 0; j < tail.varWeights.indices.length; j++) a -= tail.varWeights.weights[j] * xi[tail.varWeights.indices[j]];
    let b = 0;
    for (let j = 0; j < tail.esWeights.indices.length; j++) b -= tail.esWeights.weights[j] * xi[tail.esWeights.indices[j]];
    varMarginal[i] = a;
    esMarginal[i] = b;
  }
  return { var: tail.var, es: tail.es, varMarginal, esMarginal };
}

/** Parametric VaR and ES of an exposure vector under a covariance, with marginal figures and the P&L volatility. */
export function evaluateParametric(cov: SymmetricMatrix, e: ArrayLike<number>, confidence: number, options: ParametricOptions): Evaluation & { sigma: number } {
  const q = varMultiplier(confidence, options);
  const qEs = esMultiplier(confidence, options);
  const se = matVec(cov, e);
  let variance = 0;
  for (let i = 0; i < cov.size; i++) variance += e[i] * se[i];
  const sigma = Math.sqrt(Math.max(0, variance));
  const k = cov.size;
  const varMarginal = new Float64Array(k);
  const esMarginal = new Float64Array(k);
  if (sigma > 0) for (let i = 0; i < k; i++) { varMarginal[i] = (q * se[i]) / sigma; esMarginal[i] = (qEs * se[i]) / sigma; }
  return { var: q * sigma, es: qEs * sigma, varMarginal, esMarginal, sigma };
}

/** An evaluation with every figure multiplied by one factor (square-root-of-time scaling). */
export function scaleEvaluation(ev: Evaluation, factor: number): Evaluation {
  return { var: ev.var * factor, es: ev.es * factor, varMarginal: ev.varMarginal.map((x) => x * factor), esMarginal: ev.esMarginal.map((x) => x * factor) };
}

/** The dot product of two vectors of one length. */
export function dot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}
