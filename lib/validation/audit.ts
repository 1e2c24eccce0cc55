import { z } from "zod";

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date as yyyy-mm-dd.");

/** Filters of the audit trail list (query string of GET /api/audit). */
export const auditQuerySchema = z
  .object({
    action: z.string().max(80).optional(),
    entityType: z.string().max(80).optional(),
    from: isoDate.optional(),
    to: isoDate.optional(),
    q: z.string().max(120, "Search at most 120 characters.").optional(),
    page: z.coerce.number().int().min(1, "page starts at 1").default(1),
    pageSize: z.coerce.number().int().min(1).max(200, "pageSize at most 200").default(50),
  })
  .refine((v) => !v.from || !v.to || v.from <= v.to, { message: "from must not be after to", path: ["from"] });
export type AuditQuery = z.infer<typeof auditQuerySchema>;
