/**
 * Stored closes → the engine's aligned daily log returns. The closes of the run's factors sit on the union of their
 * dates. A date on which a factor inside its own history (between its first and last close) has no close is left
 * out for every factor, so the next return spans the gap for all of them alike (no price is invented or carried).
 * Before a factor's first close and after its last, it simply has no return (NaN), and the engine sees how many
 * returns it has up to the last date. The rule is the engine's (lib/risk/returns.ts, alignSeries's
 * "drop-inside-history"); this file only adapts the stored closes to it. Pure.
 */
import { alignedLogReturns, alignOnAxis, type FactorReturns } from "@/lib/risk";
import type { RunInputs } from "./types";

export interface Alignment {
  returns: FactorReturns;
  /** dates left out because a factor inside its history had no close there */
  droppedDates: { date: string; missing: string[] }[];
  /** per factor: returns up to the last date without a break (what the minimum history is checked against) */
  usableReturns: Record<string, number>;
  rule: string;
}

export const ALIGNMENT_RULE =
  "Closes as of the period end, aligned on the union of the factors' dates; a date on which a factor inside its own history has no close is left out for every factor (the next return spans the gap); log returns.";

/** Align stored closes into log returns: the engine's "drop-inside-history" rule on the stored date axis. */
export function alignReturns(prices: RunInputs["prices"]): Alignment {
  const ids = Object.keys(prices.factors).sort();
  const n = prices.dates.length;
  // one value per axis date; a close that is absent or not positive is no close
  const series = ids.map((id) => {
    const closes = prices.factors[id].closes;
    return { id, values: Array.from({ length: n }, (_, t) => { const c = closes[t]; return c !== null && c !== undefined && c > 0 ? c : NaN; }) };
  });
  const aligned = alignOnAxis(prices.dates, series, { missing: "drop-inside-history" });
  const { dates, returns: factors, unbroken: usableReturns } = alignedLogReturns(aligned);
  const droppedDates = aligned.report.dropped.map((d) => ({ date: d.date, missing: d.missingIds }));
  return { returns: { dates, factors }, droppedDates, usableReturns, rule: ALIGNMENT_RULE };
}

/** A factor's usable returns (its unbroken run up to the last date) with their dates. */
export function usableSeries(alignment: Alignment, factor: string): { dates: string[]; returns: Float64Array } {
  const r = alignment.returns.factors[factor] as Float64Array | undefined;
  if (!r) return { dates: [], returns: new Float64Array(0) };
  const n = alignment.usableReturns[factor];
  return { dates: alignment.returns.dates.slice(r.length - n), returns: r.subarray(r.length - n) };
}
