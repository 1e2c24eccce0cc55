/** Residual maturities from dates: whole calendar months are exact twelfths of a year, the rest pro rata. */

const ISO = /^(\d{4})-(\d{2})-(\d{2})$/;

/**
 * Parse a yyyy-mm-dd date into [year, month (1–12), day], or null when it is not a real calendar date.
 * @example parseIsoDate("2026-11-30") // → [2026, 11, 30]
 */
export function parseIsoDate(text: string): [number, number, number] | null {
  const m = ISO.exec(text.trim());
  if (!m) return null;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const t = new Date(Date.UTC(y, mo - 1, d));
  if (t.getUTCFullYear() !== y || t.getUTCMonth() !== mo - 1 || t.getUTCDate() !== d) return null;
  return [y, mo, d];
}

function daysInMonth(y: number, mo: number): number {
  return new Date(Date.UTC(y, mo, 0)).getUTCDate();
}

/** Add whole months, holding the day (or the month's last day when it is shorter, and month-end to month-end). */
function addMonths([y, mo, d]: [number, number, number], n: number): [number, number, number] {
  const total = y * 12 + (mo - 1) + n;
  const ny = Math.floor(total / 12);
  const nmo = (total % 12) + 1;
  const endOfMonth = d === daysInMonth(y, mo);
  const dim = daysInMonth(ny, nmo);
  return [ny, nmo, endOfMonth ? dim : Math.min(d, dim)];
}

function serial([y, mo, d]: [number, number, number]): number {
  return Date.UTC(y, mo - 1, d) / 86_400_000;
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
  if (serial(b) < serial(a)) return -yearsBetween(date, asOf);
  let months = (b[0] - a[0]) * 12 + (b[1] - a[1]);
  while (months > 0 && serial(addMonths(a, months)) > serial(b)) months--;
  const base = addMonths(a, months);
  const next = addMonths(a, months + 1);
  const rest = (serial(b) - serial(base)) / (serial(next) - serial(base));
  return (months + rest) / 12;
}
