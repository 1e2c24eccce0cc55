/**
 * Stressed-window search: the window of a given length in the available history that gives the highest VaR
 * for the current book, by the run's method applied to each window — parametric: z·√(mean of squared
 * portfolio P&L) (the equal-weight, zero-mean covariance of the window applied to today's exposures);
 * historical: the type-7 loss quantile of the window's portfolio P&L. Windows move one day at a time.
 */
import { lossQuantile } from "./historical";
import { normalQuantile } from "./distributions";

export interface StressWindowCandidate {
  /** index of the window's first day (inclusive) */
  start: number;
  /** index after the window's last day */
  end: number;
  var: number;
}

export interface StressWindowSearch {
  best: StressWindowCandidate;
  /** windows examined */
  windows: number;
  /** the one-day VaR of every window, by end index (for a chart) */
  curve: Float64Array;
  rule: string;
}

/**
 * Search every window of `windowDays` consecutive days of a P&L series for the highest one-day VaR.
 * @param pnl the current book's P&L on each past day (static-book P&L), oldest first
 * @throws {RangeError} if the series is shorter than the window or the window is shorter than 2 days
 */
export function searchStressWindow(
  pnl: ArrayLike<number>,
  windowDays: number,
  confidence: number,
  kind: "parametric" | "historical",
): StressWindowSearch {
  if (!(confidence > 0 && confidence < 1)) throw new RangeError("searchStressWindow requires 0 < confidence < 1");
  if (!(Number.isInteger(windowDays) && windowDays >= 2)) throw new RangeError("searchStressWindow requires a window of at least 2 days");
  if (pnl.length < windowDays) throw new RangeError(`searchStressWindow requires at least ${windowDays} days of P&L (got ${pnl.length})`);
  const count = pnl.length - windowDays + 1;
  const curve = new Float64Array(count);
  let best: StressWindowCandidate = { start: 0, end: windowDays, var: -Infinity };
  if (kind === "parametric") {
    const z = normalQuantile(confidence);
    let ss = 0;
    for (let t = 0; t < windowDays; t++) ss += pnl[t] * pnl[t];
    for (let k = 0; k < count; k++) {
      if (k > 0) ss += pnl[k + windowDays - 1] ** 2 - pnl[k - 1] ** 2;
      const v = z * Math.sqrt(Math.max(0, ss) / windowDays);
      curve[k] = v;
      if (v > best.var) best = { start: k, end: k + windowDays, var: v };
    }
  } else {
    const scratch = new Float64Array(windowDays);
    for (let k = 0; k < count; k++) {
      const v = lossQuantile(pnl, k, k + windowDays, confidence, scratch);
      curve[k] = v;
      if (v > best.var) best = { start: k, end: k + windowDays, var: v };
    }
  }
  return {
    best,
    windows: count,
    curve,
    rule:
      kind === "parametric"
        ? `every ${windowDays}-day window, one day apart: normal VaR of today's book with the window's equal-weight, zero-mean covariance; the highest wins`
        : `every ${windowDays}-day window, one day apart: type-7 loss quantile of today's book's P&L over the window; the highest wins`,
  };
}
