/**
 * A run left "queued" or "running" by a server that stopped is marked failed ("interrupted") the next time
 * anyone reads it, once it has not reported progress for RUN_STALE_AFTER_MS.
 */
import "server-only";
import { and, eq, inArray, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { runs } from "@/db/schema";

/** Ten minutes without a progress report: longer than any stage of a run over the demo data takes. */
export const RUN_STALE_AFTER_MS = 10 * 60 * 1000;

/** Mark the firm's stale queued/running runs (one run, or a period's) as failed: interrupted. */
export async function markIfInterrupted(firmId: string, scope: { runId?: string; periodId?: string }): Promise<number> {
  // wall-clock time, not the pinned clock: staleness is about a process that stopped, not about the business date
  const cutoff = new Date(Date.now() - RUN_STALE_AFTER_MS).toISOString();
  const conditions = [eq(runs.firmId, firmId), inArray(runs.status, ["queued", "running"]), sql`coalesce(${runs.heartbeatAt}, ${runs.startedAt}) < ${cutoff}`];
  if (scope.runId) conditions.push(eq(runs.id, scope.runId));
  if (scope.periodId) conditions.push(eq(runs.periodId, scope.periodId));
  const updated = await getDb()
    .update(runs)
    .set({
      status: "failed",
      stage: "failed",
      error: `Interrupted: the run stopped reporting progress for more than ${RUN_STALE_AFTER_MS / 60000} minutes (the server running it stopped). Start a new run; earlier runs are unchanged.`,
      finishedAt: new Date().toISOString(),
    })
    .where(and(...conditions))
    .returning({ id: runs.id });
  return updated.length;
}
