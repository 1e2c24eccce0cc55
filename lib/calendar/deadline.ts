/**
 * Filing deadlines by the firm's rule, on business days (weekends and the firm's holidays excluded). Business-day
 * arithmetic works on day numbers in O(1) whatever the length of the range (plus one pass over the holidays); date-fns
 * does the month arithmetic. Dates are plain yyyy-mm-dd strings in the firm's calendar.
 */
import { format, parseISO, setDate, startOfMonth, addMonths, endOfMonth } from "date-fns";

export type DeadlineRule =
  | { kind: "business-days-after"; days: number }
  | { kind: "fixed-day-next-month"; day: number };

const DAY_MS = 86_400_000;

/** Days since 1970-01-01 of a yyyy-mm-dd date (throws on anything else, so no loop runs on a bad date). */
export function dayNumber(date: string): number {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!match) throw new RangeError(`Not a yyyy-mm-dd date: ${JSON.stringify(date).slice(0, 40)}`);
  const [y, m, d] = [Number(match[1]), Number(match[2]), Number(match[3])];
  const at = new Date(0);
  at.setUTCFullYear(y, m - 1, d);
  if (at.getUTCFullYear() !== y || at.getUTCMonth() !== m - 1 || at.getUTCDate() !== d) throw new RangeError(`No such date: ${date}`);
  return Math.floor(at.getTime() / DAY_MS);
}

/** The yyyy-mm-dd date of a day number (inverse of dayNumber). */
export function fromDayNumber(n: number): string {
  const at = new Date(n * DAY_MS);
  const y = String(at.getUTCFullYear()).padStart(4, "0");
  return `${y}-${String(at.getUTCMonth() + 1).padStart(2, "0")}-${String(at.getUTCDate()).padStart(2, "0")}`;
}

/** Day of the week of a day number: 0 = Monday … 6 = Sunday (1970-01-01 was a Thursday). */
function weekday(n: number): number {
  return (((n + 3) % 7) + 7) % 7;
}

/** Monday to Friday days in the day-number range [a, b] (0 when b < a), in O(1). */
function weekdaysIn(a: number, b: number): number {
  if (b < a) return 0;
  const length = b - a + 1;
  const weeks = Math.floor(length / 7);
  let count = weeks * 5;
  const start = weekday(a);
  for (let i = 0; i < length % 7; i++) if ((start + i) % 7 < 5) count++;
  return count;
}

/** The k-th weekday (Monday to Friday) strictly after day n (k ≥ 1), in O(1). */
function addWeekdays(n: number, k: number): number {
  let from = n;
  if (weekday(from) >= 5) from -= weekday(from) - 4; // a weekend counts from its Friday
  const w = weekday(from);
  const total = w + k;
  return from - w + Math.floor(total / 5) * 7 + (total % 5);
}

/** The k-th weekday strictly before day n (k ≥ 1), in O(1). */
function subtractWeekdays(n: number, k: number): number {
  let from = n;
  if (weekday(from) >= 5) from += 7 - weekday(from); // a weekend counts from its Monday
  const back = 4 - weekday(from);
  const total = back + k;
  return from + back - Math.floor(total / 5) * 7 - (total % 5);
}

/** Holidays that fall on a weekday in the day-number range [a, b]. O(holidays). */
function weekdayHolidaysIn(a: number, b: number, holidays: ReadonlySet<string>): number {
  if (b < a) return 0;
  const lo = fromDayNumber(a);
  const hi = fromDayNumber(b);
  let count = 0;
  for (const h of holidays) {
    if (h < lo || h > hi) continue;
    const n = dayNumberOrNull(h);
    if (n !== null && weekday(n) < 5) count++;
  }
  return count;
}

function dayNumberOrNull(date: string): number | null {
  try {
    return dayNumber(date);
  } catch {
    return null;
  }
}

/** Whether a yyyy-mm-dd date is a business day. */
export function isBusinessDay(date: string, holidays: ReadonlySet<string>): boolean {
  return weekday(dayNumber(date)) < 5 && !holidays.has(date);
}

/**
 * The date `n` business days after `date` (n ≥ 0; n = 0 moves a non-business day to the next business day).
 * Weekday arithmetic in O(1), then one more step per holiday crossed: O(holidays × holiday runs), whatever n.
 */
export function addBusinessDaysWithHolidays(date: string, n: number, holidays: ReadonlySet<string>): string {
  let current = dayNumber(date);
  if (n === 0) {
    while (!isBusinessDay(fromDayNumber(current), holidays)) current = addWeekdays(current, 1);
    return fromDayNumber(current);
  }
  let remaining = n;
  while (remaining > 0) {
    const next = addWeekdays(current, remaining);
    remaining = weekdayHolidaysIn(current + 1, next, holidays);
    current = next;
  }
  return fromDayNumber(current);
}

/** Business days in (from, to]; negative (the days in (to, from]) when `to` is before `from`. O(1) plus O(holidays). */
export function businessDaysBetween(from: string, to: string, holidays: ReadonlySet<string>): number {
  const a = dayNumber(from);
  const b = dayNumber(to);
  if (b < a) return -businessDaysBetween(to, from, holidays);
  return weekdaysIn(a + 1, b) - weekdayHolidaysIn(a + 1, b, holidays);
}

/** The filing deadline of the period ending on `periodEnd` under `rule`. */
export function deadlineFor(periodEnd: string, rule: DeadlineRule, holidays: ReadonlySet<string>): string {
  if (rule.kind === "business-days-after") return addBusinessDaysWithHolidays(periodEnd, rule.days, holidays);
  const nextMonth = startOfMonth(addMonths(parseISO(periodEnd), 1));
  const day = Math.min(rule.day, endOfMonth(nextMonth).getDate());
  return addBusinessDaysWithHolidays(format(setDate(nextMonth, day), "yyyy-MM-dd"), 0, holidays);
}

/** The last calendar day of the month that contains `date`. */
export function monthEnd(date: string): string {
  return format(endOfMonth(parseISO(date)), "yyyy-MM-dd");
}

/** The business day `n` business days before `date` (n ≥ 1): the day on which `businessDaysBetween(day, date)` is n. */
export function subtractBusinessDays(date: string, n: number, holidays: ReadonlySet<string>): string {
  let current = dayNumber(date);
  let remaining = n;
  while (remaining > 0) {
    const previous = subtractWeekdays(current, remaining);
    remaining = weekdayHolidaysIn(previous, current - 1, holidays);
    current = previous;
  }
  return fromDayNumber(current);
}

/** The latest month end on or before `date` (the date itself when it is a month end). */
export function latestMonthEnd(date: string): string {
  const end = monthEnd(date);
  if (end === date) return date;
  return format(endOfMonth(addMonths(startOfMonth(parseISO(date)), -1)), "yyyy-MM-dd");
}

/** The next `count` month ends strictly after `date`. */
export function nextMonthEnds(date: string, count: number): string[] {
  const result: string[] = [];
  let cursor = startOfMonth(parseISO(date));
  if (monthEnd(date) === date) cursor = addMonths(cursor, 1);
  while (result.length < count) {
    result.push(format(endOfMonth(cursor), "yyyy-MM-dd"));
    cursor = addMonths(cursor, 1);
  }
  return result;
}
