/** Figures of a run as pages show them: money in the firm's reporting currency, percentages, plain numbers. */
import { ASSET_CLASS_LABELS, RUN_STAGE_LABELS, VAR_METHOD_LABELS } from "@/lib/domain/labels";
const moneyFormats = new Map<string, Intl.NumberFormat>();

/** Whole units of the reporting currency, e.g. "€1,086,585". */
export function money(value: number | null | undefined, currency: string): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  let f = moneyFormats.get(currency);
  if (!f) {
    f = new Intl.NumberFormat("en-GB", { style: "currency", currency, maximumFractionDigits: 0, minimumFractionDigits: 0 });
    moneyFormats.set(currency, f);
  }
  return f.format(value);
}

/** A decimal as a percentage, e.g. 0.0123 → "1.23 %". */
export function pct(value: number | null | undefined, digits = 2): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  return `${(value * 100).toLocaleString("en-GB", { minimumFractionDigits: digits, maximumFractionDigits: digits })} %`;
}

export function num(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  return value.toLocaleString("en-GB", { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

/** A confidence level, e.g. 0.975 → "97.5 %". */
export function confidence(c: number): string {
  return `${+(c * 100).toFixed(2)} %`;
}

/** Compact money for chart axes, e.g. 1,250,000 → "1.25m". */
export function compactMoney(value: number): string {
  const a = Math.abs(value);
  if (a >= 1e9) return `${+(value / 1e9).toFixed(2)}bn`;
  if (a >= 1e6) return `${+(value / 1e6).toFixed(2)}m`;
  if (a >= 1e3) return `${+(value / 1e3).toFixed(1)}k`;
  return `${+value.toFixed(0)}`;
}

/** Asset classes, VaR methods and stages in words: the one tables of lib/domain/labels.ts (plus "unclassified"). */
export const ASSET_CLASS_WORDS: Record<string, string> = { ...ASSET_CLASS_LABELS, unclassified: "Unclassified" };

export const METHOD_WORDS: Record<string, string> = VAR_METHOD_LABELS;

export const STAGE_WORDS: Record<string, string> = RUN_STAGE_LABELS;
