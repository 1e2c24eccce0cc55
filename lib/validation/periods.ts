import { z } from "zod";
import { isValid, parseISO, format, endOfMonth } from "date-fns";

/** The widest range of years a reporting period may fall in (openPeriod narrows it to the firm's history and today). */
export const PERIOD_YEAR_MIN = 2000;
export const PERIOD_YEAR_MAX = 2099;
/** How many years back from today a period may still be opened (late catch-up of a firm's earlier months). */
export const PERIOD_HISTORY_YEARS = 10;

/** The earliest month (yyyy-mm) a period may be opened for, given today (yyyy-mm-dd). */
export function earliestPeriodMonth(todayDate: string): string {
  const year = Math.max(PERIOD_YEAR_MIN, Number(todayDate.slice(0, 4)) - PERIOD_HISTORY_YEARS);
  return `${year}-${todayDate.slice(5, 7)}`;
}

/** Withdrawing a period opened by mistake (only while nothing has entered it): why, for the audit trail. */
export const withdrawPeriodSchema = z.object({
  reason: z
    .string({ message: "Say why the period is withdrawn." })
    .trim()
    .min(3, "Say why the period is withdrawn (at least 3 characters).")
    .max(500, "At most 500 characters.")
    .refine((v) => !/[\p{Cc}\p{Cf}]/u.test(v.replace(/[\n\t]/g, "")), "Control or direction-changing characters are not allowed."),
});
export type WithdrawPeriodInput = z.infer<typeof withdrawPeriodSchema>;

/** Opening a reporting period: the month it covers, as yyyy-mm. */
export const openPeriodSchema = z.object({
  month: z
    .string()
    .regex(/^\d{4}-(0[1-9]|1[0-2])$/, "Use a month as yyyy-mm, e.g. 2026-11.")
    .refine((m) => isValid(parseISO(`${m}-01`)), "That month does not exist.")
    .refine((m) => m >= `${PERIOD_YEAR_MIN}-01` && m <= `${PERIOD_YEAR_MAX}-12`, `Use a month between ${PERIOD_YEAR_MIN} and ${PERIOD_YEAR_MAX}.`),
});
export type OpenPeriodInput = z.infer<typeof openPeriodSchema>;

/** The last day of a yyyy-mm month. */
export function periodEndOf(month: string): string {
  return format(endOfMonth(parseISO(`${month}-01`)), "yyyy-MM-dd");
}
