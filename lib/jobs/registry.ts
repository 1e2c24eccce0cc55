/**
 * Job kinds: name → handler. The worker (`npm run worker`) runs every kind listed here.
 *
 * Adding a kind:
 *   1. lib/jobs/kinds/<kind>.ts exports a `JobKind` (lib/jobs/types.ts): `handle(ctx)` does the work (idempotent:
 *      a released or retried job runs again), reports `ctx.progress(stage, fraction)`, checks `ctx.signal`;
 *      optionally `backoffMs`, `onGivenUp`, `schedule`.
 *   2. Add one line to JOB_KINDS below.
 *   3. Enqueue it where the work is asked for, inside that write's transaction:
 *      `await enqueue(tx, { kind: "<kind>", firmId: actor.firmId, payload: {...}, dedupeKey: "<kind>:<id>", maxAttempts })`
 *      (lib/jobs/queue.ts; maxAttempts > 1 only when running it twice is harmless).
 */
import type { JobKind } from "./types";
import { runJob } from "./kinds/run";
import { remindersJob } from "./kinds/reminders";
import { dataQualityJob } from "./kinds/data-quality";
import { packRenderJob } from "./kinds/pack-render";
import { uploadReadJob } from "./kinds/upload-read";
import { uploadConfirmJob } from "./kinds/upload-confirm";

export const JOB_KINDS: Record<string, JobKind> = {
  run: runJob,
  reminders: remindersJob,
  "data-quality": dataQualityJob,
  "pack-render": packRenderJob,
  "upload-read": uploadReadJob,
  "upload-confirm": uploadConfirmJob,
};

export type { JobKind, JobContext } from "./types";
