import { after } from "next/server";
import { route } from "@/lib/auth/route";
import { listRuns, startRun } from "@/lib/data/runs";
import { executeRun } from "@/lib/runs/execute";
import { idParam } from "@/lib/validation/firm";
import { startRunSchema } from "@/lib/validation/runs";

/** The period's runs, newest first (any member who reads periods). */
export const GET = route({ permission: "periods.read", params: idParam("periodId") }, async ({ actor, params }) => ({ runs: await listRuns(actor, params.periodId as string) }));

/** Start a run (risk analysts): answered at once with the queued run, which then runs on the server. */
export const POST = route({ permission: "run.start", params: idParam("periodId"), body: startRunSchema }, async ({ actor, params, body }) => {
  const run = await startRun(actor, params.periodId as string, body);
  after(() => executeRun(run.id));
  return Response.json({ run }, { status: 202 });
});
