/** A job's stored payload read back through its kind's zod schema (a payload that does not fit fails the job, saying why). */
import { z } from "zod";

/** The payload of a job, parsed. @throws naming the job, its kind and the first field that does not fit */
export function readPayload<S extends z.ZodType>(job: { id: string; kind: string; payload: unknown }, schema: S): z.infer<S> {
  const parsed = schema.safeParse(job.payload);
  if (parsed.success) return parsed.data;
  const issue = parsed.error.issues[0];
  throw new Error(`Job ${job.id} (${job.kind}): its payload is not valid: ${issue ? `${issue.path.join(".") || "payload"}: ${issue.message}` : "unreadable"}.`);
}

/** `{ runId, excludeShortHistory? }`: the run job's payload. */
export const runPayloadSchema = z.object({ runId: z.string().min(1), excludeShortHistory: z.boolean().optional() });
/** `{ periodId }`: the data-quality job's payload. */
export const periodPayloadSchema = z.object({ periodId: z.string().min(1) });
/** `{ filingId }`: the pack-render job's payload. */
export const filingPayloadSchema = z.object({ filingId: z.string().min(1) });
/** `{ uploadId }`: the upload-read job's payload. */
export const uploadPayloadSchema = z.object({ uploadId: z.string().min(1) });
/** `{ uploadId, userId, userName, warningsAcknowledged }`: the upload-confirm job's payload (who confirmed, for the audit record). */
export const uploadConfirmPayloadSchema = z.object({ uploadId: z.string().min(1), userId: z.string().min(1), userName: z.string(), warningsAcknowledged: z.number().int().min(0) });
