import { z } from "zod";
import { isValid, parseISO, format, endOfMonth } from "date-fns";

/** Opening a reporting period: the month it covers, as yyyy-mm. */
export const openPeriodSchema = z.object({
  month: z
    .string()
    .regex(/^\d{4}-(0[1-9]|1[0-2])$/, "Use a month as yyyy-mm, e.g. 2026-11.")
    .refine((m) => isValid(parseISO(`${m}-01`)), "That month does not exist."),
});
export type OpenPeriodInput = z.infer<typeof openPeriodSchema>;

/** The last day of a yyyy-mm month. */
export function periodEndOf(month: string): string {
  return format(endOfMonth(parseISO(`${month}-01`)), "yyyy-MM-dd");
}
