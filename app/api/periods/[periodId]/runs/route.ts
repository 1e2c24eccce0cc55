import { route } from "@/lib/auth/route";
import { listRuns, startRun } from "@/lib/data/runs";
import { idParam } from "@/lib/validation/firm";
import { startRunSchema } from "@/lib/validation/runs";

/** The period's runs, newest first (any member who reads periods). */
export const GET = route({ permission: "periods.read", params: idParam("periodId") }, async ({ actor, params }) => ({ runs: await listRuns(actor, params.periodId) }));

/**
 * Start a run (risk analysts): refused at once when it cannot start; otherwise answered at once with the queued run,
 * whose job (inserted with it) a worker process picks up (`npm run worker`).
 */
export const POST = route({ permission: "run.start", params: idParam("periodId"), body: startRunSchema }, async ({ actor, params, body }) => {
  const run = await startRun(actor, params.periodId, body);
  return Response.json({ run }, { status: 202 });
});
