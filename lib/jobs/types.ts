/** The contract between the worker (lib/jobs/worker.ts) and a job kind's handler (lib/jobs/kinds/*.ts). */
import type { Database } from "@/db/client";
import type { Job } from "@/db/schema";

export interface JobContext {
  job: Job;
  db: Database;
  /** the lease owner (this worker) */
  owner: string;
  /** record stage and progress 0..1 on the job; extends the lease. False when the lease was lost. */
  progress(stage: string, fraction: number): Promise<boolean>;
  /** extend the lease now (call it between long synchronous steps). False when the lease was lost. */
  heartbeat(): Promise<boolean>;
  /** aborted when the lease was lost or the worker must stop: stop early, store nothing more */
  signal: AbortSignal;
}

export interface JobKind {
  /** Do the job; the value is stored as the job's result. Must be idempotent: a retried or released job runs again. */
  handle(context: JobContext): Promise<unknown>;
  /** delay before attempt n + 1 after attempt n failed (when the job was enqueued with maxAttempts > 1) */
  backoffMs?(attempt: number): number;
  /** the job was given up (lease expired with no attempts left, or failed for good): mark what it was working on */
  onGivenUp?(job: Job, db: Database, reason: string): Promise<void>;
  /** enqueue one of these on a schedule: the worker keeps one queued, due `everyMs` after the last one finished */
  schedule?: { everyMs(): number; maxAttempts?: number };
}
