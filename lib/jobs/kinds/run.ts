/**
 * "run": compute a queued run (lib/data/run-execution.ts: gather and store its inputs, check the method can be computed,
 * compute, store the results), reporting stage and progress on the run row and keeping the job's lease alive.
 * Payload `{ runId, excludeShortHistory }`; enqueued by startRun/reproduceRun (lib/data/runs.ts) in the run's own
 * transaction with maxAttempts 1: a run whose worker stopped is not silently computed again but shown as
 * interrupted, so the person starts it again (the run slot of the period is free at once).
 */
import "server-only";
import type { Job } from "@/db/schema";
import type { Database } from "@/db/client";
import { readPayload, runPayloadSchema } from "../payload";
import type { JobKind } from "../types";

export const runJob: JobKind = {
  async handle(context) {
    const { executeRun } = await import("@/lib/data/run-execution");
    const { computeInThread } = await import("@/lib/runs/compute-in-thread");
    const payload = readPayload(context.job, runPayloadSchema);
    // computed in a thread of its own, so that the worker's heartbeat goes on through a large book's long steps
    const outcome = await executeRun(payload.runId, { excludeShortHistory: payload.excludeShortHistory, heartbeat: context.heartbeat, signal: context.signal, compute: computeInThread });
    return { outcome };
  },
  async onGivenUp(job: Job, db: Database, reason: string) {
    const { markRunInterrupted } = await import("@/lib/data/run-staleness");
    await markRunInterrupted(db, readPayload(job, runPayloadSchema).runId, reason);
  },
};
