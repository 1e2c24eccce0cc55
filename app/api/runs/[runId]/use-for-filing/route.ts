import { route } from "@/lib/auth/route";
import { useForFiling } from "@/lib/data/runs";
import { idParam } from "@/lib/validation/firm";
import { useForFilingSchema } from "@/lib/validation/runs";

/** Mark a completed run as the one the period's filing uses (risk analysts; one per period). */
export const POST = route({ permission: "run.start", params: idParam("runId"), body: useForFilingSchema }, async ({ actor, params }) => ({ run: await useForFiling(actor, params.runId) }));
