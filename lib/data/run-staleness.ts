/**
 * A run whose worker stopped is marked failed ("Interrupted … start again") as soon as its job's lease runs out
 * (LEASE_MS, 15 s: the worker extends it every few seconds): by the other workers' sweep (the job kind's
 * onGivenUp), and by any read of the run or its period here, whichever comes first. The period's run slot is then
 * free. A queued or running run with no job at all (stored before the queue existed) is interrupted once its own
 * heartbeat is older than the lease.
 */
import "server-only";
import { and, eq, inArray, lt, sql } from "drizzle-orm";
import { getDb, isDatabaseBusy, type Database, type Tx } from "@/db/client";
import { jobs, runs } from "@/db/schema";
import { LEASE_MS, takeOverExpired } from "@/lib/jobs/queue";
import type { runPayloadSchema } from "@/lib/jobs/payload";
import type { z } from "zod";

/** The payload of a "run" job (lib/jobs/kinds/run.ts): the schema in lib/jobs/payload.ts. */
export type RunJobPayload = z.infer<typeof runPayloadSchema>;

/** The dedupe key of a run's job: one active job per run. */
export const runJobKey = (runId: string) => `run:${runId}`;

export const RUN_INTERRUPTED_MESSAGE = `Interrupted: the worker computing this run stopped (no heartbeat for ${LEASE_MS / 1000} seconds). Start the run again; earlier runs are unchanged.`;

/** Mark one queued/running run failed: interrupted. */
export async function markRunInterrupted(db: Database | Tx, runId: string, reason = RUN_INTERRUPTED_MESSAGE): Promise<boolean> {
  const at = new Date().toISOString();
  const rows = await db
    .update(runs)
    .set({ status: "failed", stage: "failed", error: reason.startsWith("Interrupted") ? reason : RUN_INTERRUPTED_MESSAGE, finishedAt: at })
    .where(and(eq(runs.id, runId), inArray(runs.status, ["queued", "running"])))
    .returning({ id: runs.id });
  return rows.length === 1;
}

/** Mark the firm's interrupted queued/running runs (one run, or a period's) as failed: interrupted. */
export async function markIfInterrupted(firmId: string, scope: { runId?: string; periodId?: string }): Promise<number> {
  const db = getDb();
  // wall-clock time, not the pinned clock: a lease is about a process that stopped, not about the business date
  const at = new Date().toISOString();
  const [expired] = await db
    .select({ id: jobs.id })
    .from(jobs)
    .where(and(eq(jobs.state, "running"), lt(jobs.leaseExpiresAt, at), eq(jobs.kind, "run"), eq(jobs.firmId, firmId)))
    .limit(1);
  // Marking is a courtesy of the read (the workers' sweep does it within seconds): a page never fails because another
  // writer holds the database just then.
  if (expired) {
    try {
      await takeOverExpired(db, { kinds: ["run"], firmId });
    } catch (error) {
      if (!isDatabaseBusy(error)) throw error;
      return 0;
    }
  }
  const cutoff = new Date(Date.now() - LEASE_MS).toISOString();
  const key = sql`'run:' || ${runs.id}`;
  const conditions = [
    eq(runs.firmId, firmId),
    inArray(runs.status, ["queued", "running"]),
    sql`(
      (EXISTS (SELECT 1 FROM jobs WHERE jobs.dedupe_key = ${key} AND jobs.state IN ('interrupted', 'failed'))
        AND NOT EXISTS (SELECT 1 FROM jobs WHERE jobs.dedupe_key = ${key} AND jobs.state IN ('queued', 'running')))
      OR (NOT EXISTS (SELECT 1 FROM jobs WHERE jobs.dedupe_key = ${key}) AND coalesce(${runs.heartbeatAt}, ${runs.startedAt}) < ${cutoff})
    )`,
  ];
  if (scope.runId) conditions.push(eq(runs.id, scope.runId));
  if (scope.periodId) conditions.push(eq(runs.periodId, scope.periodId));
  // reads first: the common answer (nothing interrupted) writes nothing
  const found = await db.select({ id: runs.id }).from(runs).where(and(...conditions));
  if (found.length === 0) return 0;
  try {
    const updated = await db
      .update(runs)
      .set({ status: "failed", stage: "failed", error: RUN_INTERRUPTED_MESSAGE, finishedAt: new Date().toISOString() })
      .where(and(...conditions))
      .returning({ id: runs.id });
    return updated.length;
  } catch (error) {
    if (!isDatabaseBusy(error)) throw error;
    return 0;
  }
}
