/** Confirming a data-quality item: which finding, and why it is real. */
import { z } from "zod";
import { CHECK_LABELS, type QualityCheck } from "@/lib/uploads/data-quality";

const checks = Object.keys(CHECK_LABELS) as [QualityCheck, ...QualityCheck[]];

export const qualityConfirmSchema = z.object({
  check: z.enum(checks, { message: "Unknown check." }),
  instrument: z.string().trim().min(1, "Name the instrument.").max(100, "At most 100 characters."),
  dates: z.array(z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Dates as yyyy-mm-dd.")).max(500, "At most 500 dates."),
  reason: z.string().trim().min(10, "Say why the finding is real, e.g. what happened that day (at least 10 characters).").max(1000, "At most 1,000 characters."),
});
export type QualityConfirmInput = z.infer<typeof qualityConfirmSchema>;
