/**
 * Historical-simulation VaR and ES over a window of P&L scenarios.
 * Quantile convention (stated in every output): VaR is the R type-7 (linear interpolation) quantile of the
 * losses L = −P&L at the confidence level, h = (n−1)·p on the ascending losses — the convention of
 * simple-statistics' quantileSorted and numpy's default. ES is the tail mean with a fractional last weight
 * (Acerbi–Tasche): with k = n·(1−p), ES = [sum of the ⌊k⌋ largest losses + (k−⌊k⌋)·the next one] / k.
 */

export const HISTORICAL_QUANTILE_CONVENTION =
  "VaR: R type-7 quantile of losses (linear interpolation, h = (n−1)·p, as simple-statistics quantileSorted); ES: mean of the n·(1−p) largest losses with a fractional last weight";

/** Scenario indices and weights whose weighted loss is the VaR or the ES; used for Euler allocation. */
export interface TailWeights {
  /** indices into the scenario list */
  indices: Int32Array;
  weights: Float64Array;
}

export interface HistoricalTail {
  var: number;
  es: number;
  varWeights: TailWeights;
  esWeights: TailWeights;
  scenarios: number;
}

function check(name: string, n: number, confidence: number): void {
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`${name} requires 0 < confidence < 1`);
  if (n < 2) throw new RangeError(`${name} requires at least 2 scenarios`);
}

/**
 * Historical VaR and ES of a set of P&L scenarios, with the weights that reproduce them from the scenarios.
 * @param pnl scenario P&L (a loss negative)
 * @throws {RangeError} "historicalTail requires 0 < confidence < 1", or fewer than 2 scenarios, or a non-finite value
 */
export function historicalTail(pnl: ArrayLike<number>, confidence: number): HistoricalTail {
  const n = pnl.length;
  check("historicalTail", n, confidence);
  const order = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(pnl[i])) throw new RangeError(`historicalTail requires finite P&L (scenario ${i})`);
    order[i] = i;
  }
  // ascending losses = descending P&L
  order.sort((a, b) => pnl[b] - pnl[a]);
  const h = (n - 1) * confidence;
  const lo = Math.floor(h);
  const frac = h - lo;
  let varWeights: TailWeights;
  if (frac === 0 || lo + 1 >= n) varWeights = { indices: Int32Array.of(order[lo]), weights: Float64Array.of(1) };
  else varWeights = { indices: Int32Array.of(order[lo], order[lo + 1]), weights: Float64Array.of(1 - frac, frac) };
  const k = n * (1 - confidence);
  const whole = Math.floor(k + 1e-9);
  const rest = k - whole > 1e-9 ? k - whole : 0;
  const count = whole + (rest > 0 ? 1 : 0);
  const esIdx = new Int32Array(count);
  const esW = new Float64Array(count);
  for (let j = 0; j < count; j++) {
    esIdx[j] = order[n - 1 - j];
    esW[j] = (j < whole ? 1 : rest) / k;
  }
  const weighted = (w: TailWeights) => {
    let s = 0;
    for (let j = 0; j < w.indices.length; j++) s -= w.weights[j] * pnl[w.indices[j]];
    return s;
  };
  const esWeights = { indices: esIdx, weights: esW };
  return { var: weighted(varWeights), es: weighted(esWeights), varWeights, esWeights, scenarios: n };
}

/**
 * Historical VaR (a positive loss) by the type-7 quantile of losses.
 * @example historicalVar([-3, -1, 0, 1, 2], 0.75); // 1 (losses 3, 1, 0, −1, −2 → type-7 0.75 quantile = 1)
 */
export function historicalVar(pnl: ArrayLike<number>, confidence: number): number {
  return historicalTail(pnl, confidence).var;
}

/** Historical expected shortfall (a positive loss): the fractional tail mean of the largest losses. */
export function historicalEs(pnl: ArrayLike<number>, confidence: number): number {
  return historicalTail(pnl, confidence).es;
}

/** The losses of pnl[start, end) in ascending order, written into scratch when it is long enough (else a new array). */
export function sortedWindowLosses(pnl: ArrayLike<number>, start: number, end: number, scratch?: Float64Array): Float64Array {
  const n = end - start;
  const losses = scratch && scratch.length >= n ? scratch.subarray(0, n) : new Float64Array(n);
  for (let i = 0; i < n; i++) losses[i] = -pnl[start + i];
  losses.sort();
  return losses;
}

/** Type-7 quantile of losses for a window of a series, without the weights (faster, for rolling use). */
export function lossQuantile(pnl: ArrayLike<number>, start: number, end: number, confidence: number, scratch?: Float64Array): number {
  const n = end - start;
  check("lossQuantile", n, confidence);
  return type7OfSorted(sortedWindowLosses(pnl, start, end, scratch), confidence);
}

/** Historical VaR and ES together for a window [start, end) of a P&L series (sorting once). */
export function lossQuantileAndEs(pnl: ArrayLike<number>, start: number, end: number, confidence: number, scratch?: Float64Array): { var: number; es: number } {
  const n = end - start;
  check("lossQuantileAndEs", n, confidence);
  return tailOfSortedLosses(sortedWindowLosses(pnl, start, end, scratch), confidence);
}

/** The type-7 quantile of ascending losses at `confidence` (the one quantile kernel of the historical figures). */
export function type7OfSorted(losses: ArrayLike<number>, confidence: number): number {
  const n = losses.length;
  const h = (n - 1) * confidence;
  const lo = Math.floor(h);
  const frac = h - lo;
  return frac === 0 || lo + 1 >= n ? losses[lo] : losses[lo] + frac * (losses[lo + 1] - losses[lo]);
}

/** VaR (type-7) and ES (fractional tail mean of the n·(1 − confidence) largest losses) from ascending losses. */
export function tailOfSortedLosses(losses: ArrayLike<number>, confidence: number): { var: number; es: number } {
  const n = losses.length;
  const k = n * (1 - confidence);
  const whole = Math.floor(k + 1e-9);
  const rest = k - whole > 1e-9 ? k - whole : 0;
  let s = 0;
  for (let j = 0; j < whole; j++) s += losses[n - 1 - j];
  if (rest > 0) s += rest * losses[n - 1 - whole];
  return { var: type7OfSorted(losses, confidence), es: s / k };
}
