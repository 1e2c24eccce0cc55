/**
 * "upload-read": read, hash and check an uploaded file and store what was read, so the preview pages through it and
 * the confirmation stores it without reading the file again (lib/data/uploads/read.ts readUpload). The rows are
 * checked in a thread of their own (lib/uploads/parse-in-thread.ts) so this worker's lease and progress keep going.
 * Payload `{ uploadId }`; enqueued when the upload service hands a file over and when a person re-reads it with other
 * settings. Safe to run again (maxAttempts 3): an upload no longer "reading" is left as it is.
 */
import "server-only";
import type { Job } from "@/db/schema";
import type { Database } from "@/db/client";
import { readPayload, uploadPayloadSchema } from "../payload";
import type { JobKind } from "../types";

export const uploadReadJob: JobKind = {
  async handle(context) {
    const { readUpload } = await import("@/lib/data/uploads");
    const { parseInThread } = await import("@/lib/uploads/parse-in-thread");
    const { uploadId } = readPayload(context.job, uploadPayloadSchema);
    if (!context.job.firmId) throw new Error("An upload job needs a firm.");
    return readUpload(context.job.firmId, uploadId, { parse: parseInThread, progress: context.progress, signal: context.signal });
  },
  backoffMs: (attempt) => 2_000 * attempt,
  async onGivenUp(job: Job, db: Database, reason: string) {
    const { markReadFailed } = await import("@/lib/data/uploads");
    if (!job.firmId) return;
    await markReadFailed(db, job.firmId, readPayload(job, uploadPayloadSchema).uploadId, `The file could not be read: ${reason} Read it again, or upload it again.`);
  },
};
