/**
 * The method statement's evidence: per asset class, an equal-weight daily log-return series built from the firm's
 * stored closes, and the engine's estimator comparison run on it. Pure; the data layer supplies the prices.
 */
import { compareEstimators, type CompareResult } from "@/lib/risk/compare";
import type { CandidateEvidence } from "@/lib/risk/process/types";
import { ENGINE_VERSION } from "@/lib/risk/version";
import { ASSET_CLASS_LABELS, type AssetClass } from "@/lib/uploads/asset-classes";

/** The comparison needs an estimation window of 100 returns and an evaluation window of a quarter: 134 returns. */
export const MIN_COMPARE_RETURNS = 134;

/** The evidence for one asset class. */
export interface ClassEvidence {
  assetClass: string;
  label: string;
  /** instruments whose closes built the series */
  instruments: string[];
  /** instruments of the class left out, and why */
  excluded: { code: string; reason: string }[];
  /** first and last close used (the returns run from the day after `from` to `to`) */
  from: string | null;
  to: string | null;
  returns: number;
  comparison: CompareResult | null;
  /** why no comparison could be made, when none was */
  error: string | null;
}

/** The evidence attached to a method statement version. */
export interface MethodEvidence {
  /** when it was computed (the app's clock) */
  computedAt: string;
  /** prices up to this date were used */
  asOf: string;
  periodId: string | null;
  periodEnd: string | null;
  /** where the asset classes came from: the period's confirmed positions, or the firm's instruments */
  source: "positions" | "instruments";
  /** the least number of returns an instrument needed to be included */
  minReturns: number;
  engineVersion: string;
  classes: ClassEvidence[];
  /** the book-level backtest of this version and each candidate on the firm's latest book (absent on older evidence) */
  book?: BookEvidence | null;
}

/**
 * The candidate-method evidence on the firm's own book: the 250-day out-of-sample backtest of this version's method,
 * the approved version's (when this is a later draft) and the standard candidates, side by side.
 */
export interface BookEvidence {
  periodId: string | null;
  /** positions of this period; closes up to the earlier of its end and today */
  periodEnd: string | null;
  /** the version whose method is the "this method" row */
  version: number;
  /** the approved version compared beside it, when there is one and it is another version */
  approvedVersion: number | null;
  candidates: CandidateEvidence | null;
  /** why no evidence could be computed, when none was */
  error: string | null;
}

export type PriceSeries = Map<string, { dates: string[]; closes: number[] }>;

/** The equal-weight log-return series of some instruments, on the dates all of them have a close. */
export function equalWeightReturns(
  series: PriceSeries,
  codes: readonly string[],
  minReturns: number,
): { instruments: string[]; excluded: ClassEvidence["excluded"]; dates: string[]; returns: number[] } {
  const excluded: ClassEvidence["excluded"] = [];
  const used: string[] = [];
  for (const code of [...new Set(codes)].sort()) {
    const s = series.get(code);
    if (!s || s.closes.length === 0) excluded.push({ code, reason: "no stored prices" });
    else if (s.closes.some((c) => !(c > 0))) excluded.push({ code, reason: "a stored close at or below zero" });
    else if (s.closes.length - 1 < minReturns) excluded.push({ code, reason: `${s.closes.length - 1} returns, fewer than the ${minReturns} needed` });
    else used.push(code);
  }
  if (used.length === 0) return { instruments: [], excluded, dates: [], returns: [] };
  // Dates every used instrument has a close on.
  const counts = new Map<string, number>();
  for (const code of used) for (const d of series.get(code)!.dates) counts.set(d, (counts.get(d) ?? 0) + 1);
  const dates = [...counts.entries()].filter(([, n]) => n === used.length).map(([d]) => d).sort();
  const closeOn = used.map((code) => {
    const s = series.get(code)!;
    const m = new Map<string, number>();
    s.dates.forEach((d, i) => m.set(d, s.closes[i]));
    return m;
  });
  const returns: number[] = [];
  for (let t = 1; t < dates.length; t++) {
    let sum = 0;
    for (const m of closeOn) sum += Math.log(m.get(dates[t])! / m.get(dates[t - 1])!);
    returns.push(sum / used.length);
  }
  return { instruments: used, excluded, dates, returns };
}

/** Build the evidence of every asset class from the stored prices. */
export function buildEvidence(input: {
  series: PriceSeries;
  classes: Map<string, string[]>;
  minReturns: number;
  computedAt: string;
  asOf: string;
  periodId: string | null;
  periodEnd: string | null;
  source: MethodEvidence["source"];
}): MethodEvidence {
  const minReturns = Math.max(input.minReturns, MIN_COMPARE_RETURNS);
  const classes: ClassEvidence[] = [];
  for (const [assetClass, codes] of [...input.classes.entries()].sort(([a], [b]) => a.localeCompare(b))) {
    const label = ASSET_CLASS_LABELS[assetClass as AssetClass] ?? assetClass;
    const { instruments, excluded, dates, returns } = equalWeightReturns(input.series, codes, minReturns);
    const base = { assetClass, label, instruments, excluded, from: dates[0] ?? null, to: dates.at(-1) ?? null, returns: returns.length };
    if (instruments.length === 0) {
      classes.push({ ...base, comparison: null, error: `No instrument of this class has ${minReturns} daily returns of stored history.` });
      continue;
    }
    if (returns.length < minReturns) {
      classes.push({ ...base, comparison: null, error: `The instruments share only ${returns.length} dates of returns; ${minReturns} are needed.` });
      continue;
    }
    try {
      classes.push({ ...base, comparison: compareEstimators(returns), error: null });
    } catch (error) {
      classes.push({ ...base, comparison: null, error: (error as Error).message });
    }
  }
  return {
    computedAt: input.computedAt,
    asOf: input.asOf,
    periodId: input.periodId,
    periodEnd: input.periodEnd,
    source: input.source,
    minReturns,
    engineVersion: ENGINE_VERSION,
    classes,
  };
}
