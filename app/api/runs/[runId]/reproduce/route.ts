import { route } from "@/lib/auth/route";
import { reproduceRun } from "@/lib/data/runs";
import { idParam } from "@/lib/validation/firm";
import { reproduceRunSchema } from "@/lib/validation/runs";

/** Re-run a completed run from its stored inputs as a new run pointing at it (risk analysts); a worker computes it. */
export const POST = route({ permission: "run.start", params: idParam("runId"), body: reproduceRunSchema }, async ({ actor, params }) => {
  const run = await reproduceRun(actor, params.runId);
  return Response.json({ run }, { status: 202 });
});
