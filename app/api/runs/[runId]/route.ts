import { route } from "@/lib/auth/route";
import { getRun } from "@/lib/data/runs";
import { runFreshnessOf } from "@/lib/data/run-freshness";
import { idParam } from "@/lib/validation/firm";

/** One run with its stored results and its freshness (any member who reads periods). */
export const GET = route({ permission: "periods.read", params: idParam("runId") }, async ({ actor, params }) => {
  const run = await getRun(actor, params.runId);
  return { run, reportingCurrency: actor.reportingCurrency, freshness: await runFreshnessOf(actor, run.id) };
});
