/**
 * "data-quality": compute and store a period's data-quality report for its inputs as they are now
 * (lib/data/data-quality.ts refreshDataQuality), so the page reads it instead of computing it. Payload `{ periodId }`;
 * enqueued when a positions or price-history upload is confirmed and when a finding is confirmed
 * (enqueueQualityRefresh). Then the period's runs are compared with the price history as it is now and the comparison
 * kept (run_price_checks), so that no page view has to compare a big run's closes itself, and the history check of the
 * period's book is kept for the next run start (history_checks). Safe to run again: a report, comparison or check
 * already stored for the current inputs is left as it is.
 */
import "server-only";
import { periodPayloadSchema, readPayload } from "../payload";
import type { JobKind } from "../types";
import { firmWorkerActor } from "./firm-actor";

export const dataQualityJob: JobKind = {
  async handle(context) {
    const { storedDataQuality, refreshDataQuality, qualityInputsKey } = await import("@/lib/data/data-quality");
    const { periodId } = readPayload(context.job, periodPayloadSchema);
    const actor = await firmWorkerActor(context.db, context.job.firmId);
    await context.progress("checking the stored report", 0);
    const key = await qualityInputsKey(context.db, actor, periodId);
    let items: number | null = null;
    if (!(await storedDataQuality(actor, periodId, key))) {
      await context.progress("computing the report", 0.1);
      items = (await refreshDataQuality(actor, periodId, key)).report.items.length;
    }
    await context.progress("comparing the period's runs with the price history", 0.8);
    const { periodRunFreshness } = await import("@/lib/data/run-freshness");
    const runs = (await periodRunFreshness(actor, periodId)).size;
    await context.progress("checking the book's price history for the next run", 0.9);
    const { keepPeriodHistoryCheck } = await import("@/lib/data/runs");
    const historyChecked = await keepPeriodHistoryCheck(actor, periodId);
    await context.progress("stored", 1);
    return items === null ? { periodId, computed: false, runsChecked: runs, historyChecked } : { periodId, computed: true, items, runsChecked: runs, historyChecked };
  },
  backoffMs: (attempt) => 5_000 * attempt,
};
