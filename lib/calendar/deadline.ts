/**
 * Filing deadlines by the firm's rule, on business days (weekends and the firm's holidays excluded), with
 * date-fns for the calendar arithmetic. Dates are plain yyyy-mm-dd strings in the firm's calendar.
 */
import { addDays, differenceInCalendarDays, format, isWeekend, parseISO, setDate, startOfMonth, addMonths, endOfMonth } from "date-fns";

export type DeadlineRule =
  | { kind: "business-days-after"; days: number }
  | { kind: "fixed-day-next-month"; day: number };

/** Whether a yyyy-mm-dd date is a business day. */
export function isBusinessDay(date: string, holidays: ReadonlySet<string>): boolean {
  return !isWeekend(parseISO(date)) && !holidays.has(date);
}

/** The date `n` business days after `date` (n ≥ 0; n = 0 moves a non-business day to the next business day). */
export function addBusinessDaysWithHolidays(date: string, n: number, holidays: ReadonlySet<string>): string {
  let current = parseISO(date);
  let remaining = n;
  if (n === 0) {
    while (!isBusinessDay(format(current, "yyyy-MM-dd"), holidays)) current = addDays(current, 1);
    return format(current, "yyyy-MM-dd");
  }
  while (remaining > 0) {
    current = addDays(current, 1);
    if (isBusinessDay(format(current, "yyyy-MM-dd"), holidays)) remaining--;
  }
  return format(current, "yyyy-MM-dd");
}

/** Business days in (from, to]; negative (the days in (to, from]) when `to` is before `from`. */
export function businessDaysBetween(from: string, to: string, holidays: ReadonlySet<string>): number {
  if (differenceInCalendarDays(parseISO(to), parseISO(from)) < 0) return -businessDaysBetween(to, from, holidays);
  let count = 0;
  for (let current = addDays(parseISO(from), 1); format(current, "yyyy-MM-dd") <= to; current = addDays(current, 1)) {
    if (isBusinessDay(format(current, "yyyy-MM-dd"), holidays)) count++;
  }
  return count;
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
  let current = parseISO(date);
  let remaining = n;
  while (remaining > 0) {
    current = addDays(current, -1);
    if (isBusinessDay(format(current, "yyyy-MM-dd"), holidays)) remaining--;
  }
  return format(current, "yyyy-MM-dd");
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
