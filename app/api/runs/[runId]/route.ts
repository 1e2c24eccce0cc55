import { route } from "@/lib/auth/route";
import { getRun } from "@/lib/data/runs";
import { idParam } from "@/lib/validation/firm";

/** One run with its stored results (any member who reads periods). */
export const GET = route({ permission: "periods.read", params: idParam("runId") }, async ({ actor, params }) => ({ run: await getRun(actor, params.runId as string), reportingCurrency: actor.reportingCurrency }));
