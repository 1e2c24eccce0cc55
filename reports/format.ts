/**
 * Number and date formats of the filing packs. One place, so the Word pack, the workbook's text cells and the tests
 * agree on how a figure reads. Amounts: whole units of the reporting currency with thousands separators; rates and
 * volatilities in per cent; dates as "30 Nov 2026" (the pages' house format). A negative number uses the minus
 * sign U+2212, so no number rendered as text begins with a hyphen.
 */
import { format, parseISO } from "date-fns";

const MINUS = "\u2212";

function grouped(value: number, decimals: number): string {
  const fixed = Math.abs(value).toFixed(decimals);
  const [whole, frac] = fixed.split(".");
  const withCommas = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  const body = frac ? `${withCommas}.${frac}` : withCommas;
  // a value that rounds to zero is written without a sign
  return value < 0 && Number(fixed) !== 0 ? `${MINUS}${body}` : body;
}

/** An amount in the reporting currency, whole units: 1234567.6 → "1,234,568"; −5 → "−5". */
export function formatAmount(value: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`formatAmount requires a finite number (got ${value})`);
  return grouped(value, 0);
}

/** A plain number with a fixed number of decimals and thousands separators: (3.456, 2) → "3.46". */
export function formatNumber(value: number, decimals: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`formatNumber requires a finite number (got ${value})`);
  return grouped(value, decimals);
}

/** A decimal as per cent: (0.01234, 2) → "1.23 %". */
export function formatPercent(value: number, decimals = 2): string {
  return `${formatNumber(value * 100, decimals)} %`;
}

/** A confidence level: 0.99 → "99 %", 0.975 → "97.5 %". */
export function formatConfidence(confidence: number): string {
  const pct = Math.round(confidence * 1e6) / 1e4;
  return `${pct} %`;
}

/** A p-value with four decimals, or "< 0.0001". */
export function formatPValue(p: number): string {
  if (!Number.isFinite(p)) throw new RangeError(`formatPValue requires a finite number (got ${p})`);
  return p < 0.0001 ? "< 0.0001" : p.toFixed(4);
}

/** An ISO date as "30 Nov 2026". */
export function formatDate(iso: string): string {
  return format(parseISO(iso.slice(0, 10)), "d MMM yyyy");
}

/** A month label: "2026-11-30" → "November 2026". */
export function formatMonth(iso: string): string {
  return format(parseISO(iso.slice(0, 10)), "MMMM yyyy");
}

/** An ISO timestamp as "2026-12-03 14:05 UTC" (stored times are UTC). */
export function formatTimestamp(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

/** Excel's serial day number of an ISO date (days since 1899-12-30), independent of the machine's time zone. */
export function excelSerialDate(iso: string): number {
  const m = /^(\d{4})-(\d{2})-(\d{2})/.exec(iso);
  if (!m) throw new RangeError(`excelSerialDate requires a yyyy-mm-dd date (got "${iso}")`);
  return (Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) - Date.UTC(1899, 11, 30)) / 86_400_000;
}

/** Excel's serial number of an ISO timestamp (fraction of a day for the time, UTC). */
export function excelSerialTimestamp(iso: string): number {
  const t = Date.parse(iso);
  if (Number.isNaN(t)) throw new RangeError(`excelSerialTimestamp requires an ISO timestamp (got "${iso}")`);
  return (t - Date.UTC(1899, 11, 30)) / 86_400_000;
}
