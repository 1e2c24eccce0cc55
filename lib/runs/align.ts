/**
 * Stored closes → the engine's aligned daily log returns. The closes of the run's factors sit on the union of their
 * dates. A date on which a factor inside its own history (between its first and last close) has no close is left
 * out for every factor, so the next return spans the gap for all of them alike (no price is invented or carried).
 * Before a factor's first close and after its last, it simply has no return (NaN), and the engine sees how many
 * returns it has up to the last date. Pure.
 */
import type { FactorReturns } from "@/lib/risk";
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

/** Align stored closes into log returns. */
export function alignReturns(prices: RunInputs["prices"]): Alignment {
  const ids = Object.keys(prices.factors).sort();
  const n = prices.dates.length;
  const first = new Map<string, number>();
  const last = new Map<string, number>();
  for (const id of ids) {
    const closes = prices.factors[id].closes;
    let f = -1;
    let l = -1;
    for (let t = 0; t < n; t++) {
      const c = closes[t];
      if (c !== null && c !== undefined && c > 0) {
        if (f < 0) f = t;
        l = t;
      }
    }
    first.set(id, f);
    last.set(id, l);
  }
  const keep: number[] = [];
  const droppedDates: Alignment["droppedDates"] = [];
  for (let t = 0; t < n; t++) {
    const missing: string[] = [];
    for (const id of ids) {
      const f = first.get(id)!;
      const l = last.get(id)!;
      const c = prices.factors[id].closes[t];
      if (f >= 0 && t >= f && t <= l && !(c !== null && c !== undefined && c > 0)) missing.push(id);
    }
    if (missing.length) droppedDates.push({ date: prices.dates[t], missing });
    else keep.push(t);
  }
  const dates = keep.slice(1).map((t) => prices.dates[t]);
  const factors: Record<string, Float64Array> = {};
  const usableReturns: Record<string, number> = {};
  for (const id of ids) {
    const closes = prices.factors[id].closes;
    const r = new Float64Array(Math.max(0, keep.length - 1));
    for (let i = 1; i < keep.length; i++) {
      const a = closes[keep[i - 1]];
      const b = closes[keep[i]];
      r[i - 1] = a !== null && a !== undefined && b !== null && b !== undefined && a > 0 && b > 0 ? Math.log(b / a) : NaN;
    }
    factors[id] = r;
    let run = 0;
    for (let t = r.length - 1; t >= 0 && Number.isFinite(r[t]); t--) run++;
    usableReturns[id] = run;
  }
  return { returns: { dates, factors }, droppedDates, usableReturns, rule: ALIGNMENT_RULE };
}

/** A factor's usable returns (its unbroken run up to the last date) with their dates. */
export function usableSeries(alignment: Alignment, factor: string): { dates: string[]; returns: Float64Array } {
  const r = alignment.returns.factors[factor] as Float64Array | undefined;
  if (!r) return { dates: [], returns: new Float64Array(0) };
  const n = alignment.usableReturns[factor];
  return { dates: alignment.returns.dates.slice(r.length - n), returns: r.subarray(r.length - n) };
}
