/** Request schemas of the run routes, shared by the pages and the handlers. */
import { z } from "zod";

export const startRunSchema = z.object({
  /** run without the factors short of the method's minimum history; they and their positions are listed in the results */
  excludeShortHistory: z.boolean({ message: "Yes or no." }).default(false),
});
export type StartRunInput = z.infer<typeof startRunSchema>;

export const reproduceRunSchema = z.object({
  note: z.string({ message: "A note is text." }).trim().max(500, "At most 500 characters.").optional(),
});

export const useForFilingSchema = z.object({
  confirm: z.literal(true, { message: "Confirm that this run is the one the filing uses." }),
});

/** GET /api/runs/[runId]: `?detail=contributions` adds each position's contributions (stored apart; large on a big book). */
export const runQuerySchema = z.object({
  detail: z.enum(["contributions"], { message: 'The only detail a run adds is "contributions".' }).optional(),
});

export const volatilityQuerySchema = z.object({
  factor: z.string().trim().min(1, "Name a factor.").max(100, "At most 100 characters.").optional(),
});
