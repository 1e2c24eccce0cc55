/**
 * "data-quality": compute and store a period's data-quality report for its inputs as they are now
 * (lib/data/data-quality.ts refreshDataQuality), so the page reads it instead of computing it. Payload `{ periodId }`;
 * enqueued when a positions or price-history upload is confirmed and when a finding is confirmed
 * (enqueueQualityRefresh). Safe to run again: a report already stored for the current inputs is left as it is.
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
    if (await storedDataQuality(actor, periodId, key)) return { periodId, computed: false };
    await context.progress("computing the report", 0.1);
    const view = await refreshDataQuality(actor, periodId, key);
    await context.progress("stored", 1);
    return { periodId, computed: true, items: view.report.items.length };
  },
  backoffMs: (attempt) => 5_000 * attempt,
};
