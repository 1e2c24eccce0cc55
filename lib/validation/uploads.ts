import { z } from "zod";

export const numberFormatSchema = z.enum(["plain", "comma-thousands", "dot-thousands"], { message: "Choose a number format." });
export const dateFormatSchema = z.enum(["iso", "day-month-year", "month-day-year"], { message: "Choose a date format: iso, day-month-year or month-day-year." });

/** How a pending upload is read: number format and, when the header names differ, a field → column mapping. */
export const uploadOptionsSchema = z.object({
  numberFormat: numberFormatSchema,
  dateFormat: dateFormatSchema.optional(),
  mapping: z.record(z.string().max(40), z.string().max(200, "A column name is at most 200 characters.")).optional(),
});

export const confirmUploadSchema = z.object({
  acknowledgeWarnings: z.boolean({ message: "Say whether the warnings are acknowledged (true or false)." }),
});

export const cancelUploadSchema = z.object({}).strict();

export const uploadListQuery = z.object({
  periodId: z.string().uuid("periodId must be an id").optional(),
  kind: z.enum(["positions", "prices"]).optional(),
});

export const rowsQuery = z.object({
  page: z.coerce.number().int().min(1, "page starts at 1").default(1),
  pageSize: z.coerce.number().int().min(1).max(500, "pageSize at most 500").default(50),
});
