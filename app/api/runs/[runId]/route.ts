import { route } from "@/lib/auth/route";
import { getRun } from "@/lib/data/runs";
import { runFreshnessOf } from "@/lib/data/run-freshness";
import { idParam } from "@/lib/validation/firm";
import { runQuerySchema } from "@/lib/validation/runs";

/**
 * One run with its stored figures and its freshness (any member who reads periods); with `?detail=contributions`
 * also each position's contributions, which are left out otherwise (the run's page polls this while it runs).
 */
export const GET = route({ permission: "periods.read", params: idParam("runId"), query: runQuerySchema }, async ({ actor, params, query }) => {
  const run = await getRun(actor, params.runId, { detail: query.detail === "contributions" });
  return { run, reportingCurrency: actor.reportingCurrency, freshness: await runFreshnessOf(actor, run.id) };
});
