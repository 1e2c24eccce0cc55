import { after } from "next/server";
import { route } from "@/lib/auth/route";
import { reproduceRun } from "@/lib/data/runs";
import { executeRun } from "@/lib/runs/execute";
import { idParam } from "@/lib/validation/firm";
import { reproduceRunSchema } from "@/lib/validation/runs";

/** Re-run a completed run from its stored inputs as a new run pointing at it (risk analysts). */
export const POST = route({ permission: "run.start", params: idParam("runId"), body: reproduceRunSchema }, async ({ actor, params }) => {
  const run = await reproduceRun(actor, params.runId as string);
  after(() => executeRun(run.id));
  return Response.json({ run }, { status: 202 });
});
