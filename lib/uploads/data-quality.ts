/**
 * The data-quality report of a period: the period's positions checked against the firm's price history.
 * Pure: every input is passed in. Each item has a severity and is carried into the run and the filing pack.
 */
import { isWeekend, parseISO, addDays, format } from "date-fns";
import { countOf } from "@/lib/text/count";
import { defaultFxFactorId } from "@/lib/risk/portfolio/exposures";

export type QualitySeverity = "error" | "warning" | "info";

export type QualityCheck =
  | "no-history"
  | "short-history"
  | "gap"
  | "stale"
  | "non-positive"
  | "duplicate-date"
  | "extreme-return"
  | "missing-fx"
  | "market-value-mismatch"
  | "history-ends-early"
  | "standardised-attribute";

export const CHECK_LABELS: Record<QualityCheck, string> = {
  "no-history": "No price history",
  "short-history": "Shorter history than the method needs",
  gap: "Gap in the price history",
  stale: "Stale price",
  "non-positive": "Price of zero or below",
  "duplicate-date": "Duplicate date",
  "extreme-return": "Extreme return to confirm",
  "missing-fx": "Currency without an exchange-rate series",
  "market-value-mismatch": "Market value disagrees with quantity × price",
  "history-ends-early": "Price history ends before the period end",
  "standardised-attribute": "Position lacks what the filed standardised figure needs",
};

export interface QualityItem {
  check: QualityCheck;
  severity: QualitySeverity;
  instrument: string;
  message: string;
  /** dates the item concerns, for drill-down */
  dates?: string[];
  /** for an item that asks a person to confirm it: who confirmed it, when, and why (lib/data/quality-confirmations.ts) */
  confirmation?: { by: string; at: string; reason: string };
}

/** Checks whose items ask a person to confirm them; a confirmation is recorded with who, when and why. */
export const CONFIRMABLE_CHECKS: readonly QualityCheck[] = ["extreme-return"];

export interface QualityPosition {
  instrument: string;
  currency: string;
  quantity: number;
  price: number;
  marketValue: number;
}

export interface QualityOptions {
  reportingCurrency: string;
  periodEnd: string;
  /** returns a method needs (250 by default) */
  minReturns?: number;
  /** longest tolerated run of missing business days */
  maxGapBusinessDays?: number;
  /** unchanged closes in a row that count as stale */
  staleDays?: number;
  /** robust z-score above which a return is listed for a person to confirm */
  extremeZ?: number;
  /** relative tolerance of the market value cross-check */
  valueTolerance?: number;
  holidays?: ReadonlySet<string>;
  /** items found elsewhere (the standardised attributes a filed figure needs), listed with the rest */
  extraItems?: readonly QualityItem[];
}

export interface QualityReport {
  items: QualityItem[];
  counts: Record<QualitySeverity, number>;
  byCheck: { check: QualityCheck; label: string; severity: QualitySeverity; count: number }[];
  settings: Required<Omit<QualityOptions, "holidays" | "reportingCurrency" | "periodEnd" | "extraItems">>;
}

/** Business days strictly between two yyyy-mm-dd dates. */
function businessDaysStrictlyBetween(from: string, to: string, holidays: ReadonlySet<string>): number {
  let count = 0;
  for (let d = addDays(parseISO(from), 1); format(d, "yyyy-MM-dd") < to; d = addDays(d, 1)) {
    const iso = format(d, "yyyy-MM-dd");
    if (!isWeekend(d) && !holidays.has(iso)) count++;
  }
  return count;
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Check one instrument's series; returns its items. */
export function checkSeries(instrument: string, dates: readonly string[], closes: readonly number[], options: QualityOptions): QualityItem[] {
  const minReturns = options.minReturns ?? 250;
  const maxGap = options.maxGapBusinessDays ?? 5;
  const staleDays = options.staleDays ?? 5;
  const extremeZ = options.extremeZ ?? 8;
  const holidays = options.holidays ?? new Set<string>();
  const items: QualityItem[] = [];
  if (dates.length === 0) return [{ check: "no-history", severity: "error", instrument, message: `${instrument} has no price history.` }];

  const duplicates = dates.filter((d, i) => i > 0 && d === dates[i - 1]);
  if (duplicates.length) items.push({ check: "duplicate-date", severity: "error", instrument, message: `${instrument} has ${countOf(duplicates.length, "duplicate date")}.`, dates: duplicates });
  const nonPositive = dates.filter((_d, i) => !(closes[i] > 0));
  if (nonPositive.length) items.push({ check: "non-positive", severity: "error", instrument, message: `${instrument} has ${countOf(nonPositive.length, "price")} of zero or below.`, dates: nonPositive });

  if (dates.length - 1 < minReturns) {
    items.push({ check: "short-history", severity: "warning", instrument, message: `${instrument} has ${Math.max(0, dates.length - 1)} returns; the method needs ${minReturns}.` });
  }
  const last = dates[dates.length - 1];
  const lag = businessDaysStrictlyBetween(last, options.periodEnd, holidays) + (last < options.periodEnd && !isWeekend(parseISO(options.periodEnd)) && !holidays.has(options.periodEnd) ? 1 : 0);
  if (last < options.periodEnd && lag > 1) {
    items.push({ check: "history-ends-early", severity: "warning", instrument, message: `${instrument}'s last price is on ${last}, ${lag} business days before the period end ${options.periodEnd}.`, dates: [last] });
  }

  for (let i = 1; i < dates.length; i++) {
    const missing = businessDaysStrictlyBetween(dates[i - 1], dates[i], holidays);
    if (missing > maxGap) {
      items.push({ check: "gap", severity: "warning", instrument, message: `${instrument} has no price for ${missing} business days between ${dates[i - 1]} and ${dates[i]}.`, dates: [dates[i - 1], dates[i]] });
    }
  }

  let runStart = 0;
  for (let i = 1; i <= closes.length; i++) {
    if (i < closes.length && closes[i] === closes[i - 1]) continue;
    const length = i - runStart;
    if (length >= staleDays) {
      items.push({
        check: "stale",
        severity: "warning",
        instrument,
        message: `${instrument}'s price stays at ${closes[runStart]} for ${length} days in a row (${dates[runStart]} to ${dates[i - 1]}).`,
        dates: [dates[runStart], dates[i - 1]],
      });
    }
    runStart = i;
  }

  const returns: number[] = [];
  for (let i = 1; i < closes.length; i++) if (closes[i] > 0 && closes[i - 1] > 0) returns.push(Math.log(closes[i] / closes[i - 1]));
  if (returns.length >= 20) {
    const center = median(returns);
    // Median absolute deviation scaled by 1.4826 estimates the standard deviation of a normal (a robust scale).
    const scale = 1.4826 * median(returns.map((r) => Math.abs(r - center)));
    if (scale > 0) {
      const flagged: string[] = [];
      for (let i = 1; i < closes.length; i++) {
        if (!(closes[i] > 0 && closes[i - 1] > 0)) continue;
        const r = Math.log(closes[i] / closes[i - 1]);
        if (Math.abs(r - center) / scale > extremeZ) flagged.push(`${dates[i]} (${(100 * (Math.exp(r) - 1)).toFixed(1)} %)`);
      }
      if (flagged.length) {
        items.push({
          check: "extreme-return",
          severity: "warning",
          instrument,
          message: `${instrument} has ${countOf(flagged.length, "daily move")} beyond ${extremeZ} robust standard deviations; confirm they are real: ${flagged.slice(0, 5).join(", ")}${flagged.length > 5 ? ", …" : ""}.`,
          dates: flagged.map((f) => f.slice(0, 10)),
        });
      }
    }
  }
  return items;
}

/** The period's report: every position's instrument and currency checked against the price history. */
export function dataQualityReport(
  positionsInPeriod: readonly QualityPosition[],
  series: ReadonlyMap<string, { dates: readonly string[]; closes: readonly number[] }>,
  options: QualityOptions,
): QualityReport {
  const items: QualityItem[] = [];
  const seen = new Set<string>();
  const tolerance = options.valueTolerance ?? 0.005;
  for (const p of positionsInPeriod) {
    if (!seen.has(p.instrument)) {
      seen.add(p.instrument);
      const s = series.get(p.instrument);
      items.push(...checkSeries(p.instrument, s?.dates ?? [], s?.closes ?? [], options));
    }
    if (p.currency !== options.reportingCurrency) {
      const pair = defaultFxFactorId(p.currency, options.reportingCurrency);
      if (!seen.has(pair)) {
        seen.add(pair);
        const fx = series.get(pair);
        if (!fx || fx.dates.length === 0) {
          items.push({ check: "missing-fx", severity: "error", instrument: p.instrument, message: `${p.instrument} is in ${p.currency}, but there is no ${pair} exchange-rate series: its currency risk cannot be measured.` });
        } else items.push(...checkSeries(pair, fx.dates, fx.closes, options));
      } else if (!series.get(pair)?.dates.length) {
        items.push({ check: "missing-fx", severity: "error", instrument: p.instrument, message: `${p.instrument} is in ${p.currency}, but there is no ${pair} exchange-rate series: its currency risk cannot be measured.` });
      }
    }
    const fxSeries = p.currency === options.reportingCurrency ? null : series.get(defaultFxFactorId(p.currency, options.reportingCurrency));
    const rateIndex = fxSeries ? fxSeries.dates.findLastIndex((d) => d <= options.periodEnd) : -1;
    const rate = p.currency === options.reportingCurrency ? 1 : rateIndex >= 0 ? fxSeries!.closes[rateIndex] : null;
    if (rate !== null) {
      const computed = p.quantity * p.price * rate;
      if (Math.abs(computed - p.marketValue) > Math.max(1, tolerance * Math.abs(computed))) {
        items.push({
          check: "market-value-mismatch",
          severity: "warning",
          instrument: p.instrument,
          message: `${p.instrument}: market value ${p.marketValue.toFixed(2)} differs from quantity × price${rate !== 1 ? " × rate" : ""} = ${computed.toFixed(2)}.`,
        });
      }
    }
  }
  items.push(...(options.extraItems ?? []));
  const order: Record<QualitySeverity, number> = { error: 0, warning: 1, info: 2 };
  items.sort((a, b) => order[a.severity] - order[b.severity] || a.check.localeCompare(b.check) || a.instrument.localeCompare(b.instrument));
  const counts = { error: 0, warning: 0, info: 0 };
  const byCheckMap = new Map<QualityCheck, { check: QualityCheck; label: string; severity: QualitySeverity; count: number }>();
  for (const item of items) {
    counts[item.severity]++;
    const entry = byCheckMap.get(item.check) ?? { check: item.check, label: CHECK_LABELS[item.check], severity: item.severity, count: 0 };
    entry.count++;
    byCheckMap.set(item.check, entry);
  }
  return {
    items,
    counts,
    byCheck: [...byCheckMap.values()],
    settings: {
      minReturns: options.minReturns ?? 250,
      maxGapBusinessDays: options.maxGapBusinessDays ?? 5,
      staleDays: options.staleDays ?? 5,
      extremeZ: options.extremeZ ?? 8,
      valueTolerance: tolerance,
    },
  };
}
