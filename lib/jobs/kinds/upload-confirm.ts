/**
 * "upload-confirm": store a confirmed upload's rows in short transactions and make them count in one last short
 * one (lib/data/uploads/confirm.ts applyConfirm), reporting how many rows are stored. Payload
 * `{ uploadId, userId, userName, warningsAcknowledged }`; enqueued by requestConfirm (lib/data/uploads.ts) in the
 * transaction that marks the upload "confirming". Safe to run again (maxAttempts 3): a retry clears what an
 * interrupted attempt staged; an upload already confirmed returns its stored result. Given up: the upload waits again.
 */
import "server-only";
import type { Job } from "@/db/schema";
import type { Database } from "@/db/client";
import { readPayload, uploadConfirmPayloadSchema } from "../payload";
import type { JobKind } from "../types";

export const uploadConfirmJob: JobKind = {
  async handle(context) {
    const { applyConfirm } = await import("@/lib/data/uploads");
    const payload = readPayload(context.job, uploadConfirmPayloadSchema);
    if (!context.job.firmId) throw new Error("An upload job needs a firm.");
    return applyConfirm(context.job.firmId, payload.uploadId, {
      from: "confirming",
      by: { userId: payload.userId, name: payload.userName },
      warningsAcknowledged: payload.warningsAcknowledged,
      progress: context.progress,
      signal: context.signal,
    });
  },
  backoffMs: (attempt) => 2_000 * attempt,
  async onGivenUp(job: Job, _db: Database, reason: string) {
    const { confirmGivenUp } = await import("@/lib/data/uploads");
    if (!job.firmId) return;
    await confirmGivenUp(job.firmId, readPayload(job, uploadConfirmPayloadSchema).uploadId, `Confirming did not finish: ${reason} Nothing of the file counts yet; confirm again.`);
  },
};
