/** Calendar dates at the edge: yyyy-mm-dd, a day that exists, within a stated range of years. */
import { z } from "zod";

/** Whether a yyyy-mm-dd string names a day that exists (2026-02-30 and 9999-99-99 do not). */
export function isRealDate(value: string): boolean {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(value);
  if (!match) return false;
  const [y, m, d] = [Number(match[1]), Number(match[2]), Number(match[3])];
  const at = new Date(0);
  at.setUTCFullYear(y, m - 1, d);
  return at.getUTCFullYear() === y && at.getUTCMonth() === m - 1 && at.getUTCDate() === d;
}

/** A zod field for a real date between the first day of `fromYear` and the last of `toYear`. */
export function realDate(fromYear: number, toYear: number) {
  return z
    .string({ message: "Use a date as yyyy-mm-dd." })
    .regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date as yyyy-mm-dd.")
    .refine(isRealDate, "That date does not exist.")
    .refine((v) => v >= `${fromYear}-01-01` && v <= `${toYear}-12-31`, `Use a date between ${fromYear} and ${toYear}.`);
}
