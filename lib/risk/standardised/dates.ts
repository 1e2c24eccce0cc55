/** Residual maturities from dates: whole calendar months are exact twelfths of a year, the rest pro rata. */

type Ymd = [number, number, number];

function isLeap(y: number): boolean {
  return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
}

const DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

function daysInMonth(y: number, mo: number): number {
  return mo === 2 && isLeap(y) ? 29 : DAYS[mo - 1];
}

/** Days since 1970-01-01 of a civil date (proleptic Gregorian), without Date objects. */
function serial([y0, m, d]: Ymd): number {
  const y = m <= 2 ? y0 - 1 : y0;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const doy = Math.floor((153 * (m + (m > 2 ? -3 : 9)) + 2) / 5) + d - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

/**
 * Parse a yyyy-mm-dd date into [year, month (1–12), day], or null when it is not a real calendar date.
 * @example parseIsoDate("2026-11-30") // → [2026, 11, 30]
 */
export function parseIsoDate(text: string): Ymd | null {
  if (text.length !== 10 || text[4] !== "-" || text[7] !== "-") return null;
  const y = Number(text.slice(0, 4));
  const mo = Number(text.slice(5, 7));
  const d = Number(text.slice(8, 10));
  if (!Number.isInteger(y) || !Number.isInteger(mo) || !Number.isInteger(d) || y < 1000) return null;
  if (!/^\d{4}-\d{2}-\d{2}$/.test(text)) return null;
  if (mo < 1 || mo > 12 || d < 1 || d > daysInMonth(y, mo)) return null;
  return [y, mo, d];
}

/** Add whole months, holding the day (or the month's last day when it is shorter, and month-end to month-end). */
function addMonths([y, mo, d]: Ymd, n: number): Ymd {
  const total = y * 12 + (mo - 1) + n;
  const ny = Math.floor(total / 12);
  const nmo = total - ny * 12 + 1;
  const dim = daysInMonth(ny, nmo);
  return [ny, nmo, d === daysInMonth(y, mo) ? dim : Math.min(d, dim)];
}

/**
 * Years from `asOf` to `date`: whole calendar months count as n/12 exactly (so six months is 0.5 and falls in the
 * "up to 6 months" band), the remaining days as a fraction of the following month. Negative when `date` is earlier.
 * @example yearsBetween("2026-11-30", "2027-05-31") // → 0.5 (month-end to month-end)
 */
export function yearsBetween(asOf: string, date: string): number {
  const a = parseIsoDate(asOf);
  const b = parseIsoDate(date);
  if (!a || !b) throw new Error(`not a yyyy-mm-dd date: ${!a ? asOf : date}`);
  const sb = serial(b);
  if (sb < serial(a)) return -yearsBetween(date, asOf);
  let months = (b[0] - a[0]) * 12 + (b[1] - a[1]);
  while (months > 0 && serial(addMonths(a, months)) > sb) months--;
  const base = serial(addMonths(a, months));
  const next = serial(addMonths(a, months + 1));
  return (months + (sb - base) / (next - base)) / 12;
}
