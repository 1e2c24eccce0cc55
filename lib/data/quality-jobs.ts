/**
 * Enqueueing the "data-quality" job (lib/jobs/kinds/data-quality.ts) from the writes that change what a period's
 * report reads: confirming an upload (lib/data/uploads.ts), confirming a finding (lib/data/quality-confirmations.ts), editing the
 * holidays (lib/data/calendar-settings.ts), a new capital rule profile version (lib/data/capital-profile.ts) and a new reporting
 * currency (lib/data/firm.ts).
 * Its own module, so those can enqueue without importing the report (no import cycle).
 */
import "server-only";
import { and, eq, notInArray } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { reportingPeriods } from "@/db/schema";
import { enqueueLatest } from "@/lib/jobs/queue";

/** The dedupe keys of a period's report jobs: one queued or running under each (the second for inputs that changed
 * while the first was computing). */
export function qualityJobKeys(periodId: string): [string, string] {
  return [`data-quality:${periodId}`, `data-quality:${periodId}:next`];
}

/**
 * Ask the worker to compute the reports of these periods for their inputs as they will be once the caller's
 * transaction commits (enqueued inside it). A job still queued for a period reads the inputs when it runs, so none
 * is added then. Without a worker the page computes the report on its next view, as before.
 */
export async function enqueueQualityRefresh(tx: Tx, firmId: string, periodIds: string[]): Promise<void> {
  for (const periodId of periodIds) await enqueueLatest(tx, { kind: "data-quality", firmId, payload: { periodId }, maxAttempts: 3 }, qualityJobKeys(periodId));
}

/** The firm's periods whose report a new price history can change: those not signed or filed. */
export async function periodsTakingPrices(tx: Tx, firmId: string): Promise<string[]> {
  const rows = await tx
    .select({ id: reportingPeriods.id })
    .from(reportingPeriods)
    .where(and(eq(reportingPeriods.firmId, firmId), notInArray(reportingPeriods.state, ["signed", "filed"])));
  return rows.map((r) => r.id);
}
