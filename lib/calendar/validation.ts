/** Calendar inputs: the reminder schedule, the holiday list and a holiday CSV. One zod schema each, used by forms and handlers. */
import { CONTROL_CHARACTER_MESSAGE, isCleanLine } from "@/lib/validation/text";
import { z } from "zod";
import Papa from "papaparse";
import { isValid, parseISO, format } from "date-fns";

/** A real calendar date written yyyy-mm-dd, between 2000 and 2100. */
export function dateProblem(value: string): string | null {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(value)) return `"${value}" is not a date written yyyy-mm-dd (e.g. 2026-12-24).`;
  const parsed = parseISO(value);
  if (!isValid(parsed) || format(parsed, "yyyy-MM-dd") !== value) return `"${value}" is not a real calendar date.`;
  if (value < "2000-01-01" || value > "2100-12-31") return `"${value}" is outside the years 2000 to 2100.`;
  return null;
}

const dateField = z.string().trim().superRefine((value, ctx) => {
  const problem = dateProblem(value);
  if (problem) ctx.addIssue({ code: "custom", message: problem });
});

export const holidaySchema = z.object({
  date: dateField,
  name: z.string().trim().max(80, "A holiday name has at most 80 characters.").refine(isCleanLine, CONTROL_CHARACTER_MESSAGE).default(""),
});

export const holidayListSchema = z
  .object({ holidays: z.array(holidaySchema).max(1000, "At most 1,000 holidays.") })
  .superRefine((value, ctx) => {
    const seen = new Map<string, number>();
    value.holidays.forEach((h, i) => {
      const first = seen.get(h.date);
      if (first !== undefined) ctx.addIssue({ code: "custom", path: ["holidays", i, "date"], message: `${h.date} is listed twice (rows ${first + 1} and ${i + 1}).` });
      else seen.set(h.date, i);
    });
  });
export type HolidayListInput = z.infer<typeof holidayListSchema>;

export const holidayCsvSchema = z.object({
  csv: z.string().min(1, "The file is empty.").max(200_000, "The file is larger than 200 kB; a holiday list is much smaller."),
  /** "add" merges into the list; "replace" makes the file the whole list */
  mode: z.enum(["add", "replace"], { message: "Choose add or replace." }).default("add"),
});
export type HolidayCsvInput = z.infer<typeof holidayCsvSchema>;

const offsetField = z.coerce
  .number({ message: "Enter a whole number of business days." })
  .int("Enter a whole number of business days.")
  .min(1, "Between 1 and 60.")
  .max(60, "Between 1 and 60.");

export const reminderSettingsSchema = z.object({
  reminderOffsets: z
    .array(offsetField)
    .max(10, "At most 10 reminders before a deadline.")
    .refine((offsets) => new Set(offsets).size === offsets.length, "Each number of days once."),
  remindOverdue: z.boolean(),
  autoOpenPeriods: z.boolean(),
});
export type ReminderSettingsInput = z.infer<typeof reminderSettingsSchema>;

/** "10, 5, 2, 1" → [10, 5, 2, 1] for the form; anything unreadable stays as written so that zod names it. */
export function parseOffsetList(text: string): unknown[] {
  return text
    .split(/[,\s]+/)
    .map((part) => part.trim())
    .filter(Boolean)
    .map((part) => (/^-?\d+$/.test(part) ? Number(part) : part));
}

export const reminderPreferenceSchema = z.object({ remindersEnabled: z.boolean({ message: "Send true or false." }) });

export const cronRequestSchema = z
  .object({
    /** test-only: the day to act as "today"; refused unless BALLAST_ALLOW_CLOCK=1 */
    asOf: dateField.optional(),
  })
  .default({});

export interface CsvRowError {
  row: number;
  field: "date" | "name" | "row";
  message: string;
}

/**
 * Read a holiday CSV: one holiday per row, `date,name` (name optional), an optional header row, yyyy-mm-dd dates.
 * Every problem is reported with its row number (the file's own line count, header included); any problem means
 * no holidays at all.
 */
export function parseHolidayCsv(text: string): { holidays: { date: string; name: string }[]; errors: CsvRowError[] } {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ""), { skipEmptyLines: "greedy" });
  const rows = parsed.data;
  const errors: CsvRowError[] = [];
  const holidays: { date: string; name: string }[] = [];
  const firstRowOf = new Map<string, number>();
  rows.forEach((cells, index) => {
    const row = index + 1;
    const date = (cells[0] ?? "").trim();
    const name = (cells[1] ?? "").trim();
    if (index === 0 && /^date$/i.test(date)) return;
    if (cells.length > 2 && cells.slice(2).some((c) => c.trim() !== "")) {
      errors.push({ row, field: "row", message: `Row ${row}: expected two columns (date, name), found ${cells.length}.` });
      return;
    }
    const problem = dateProblem(date);
    if (problem) {
      errors.push({ row, field: "date", message: `Row ${row}: ${problem}` });
      return;
    }
    if (name.length > 80) {
      errors.push({ row, field: "name", message: `Row ${row}: the name has ${name.length} characters; at most 80.` });
      return;
    }
    const first = firstRowOf.get(date);
    if (first !== undefined) {
      errors.push({ row, field: "date", message: `Row ${row}: ${date} is already on row ${first}.` });
      return;
    }
    firstRowOf.set(date, row);
    holidays.push({ date, name });
  });
  for (const error of parsed.errors) {
    if (error.type === "Quotes") errors.push({ row: (error.row ?? 0) + 1, field: "row", message: `Row ${(error.row ?? 0) + 1}: ${error.message}.` });
  }
  if (holidays.length === 0 && errors.length === 0) errors.push({ row: 1, field: "row", message: "The file lists no holidays." });
  return { holidays, errors: errors.sort((a, b) => a.row - b.row) };
}
