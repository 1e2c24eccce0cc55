import { route } from "@/lib/auth/route";
import { periodFiling, prepareFiling } from "@/lib/data/filings";
import { idParam } from "@/lib/validation/firm";
import { prepareFilingSchema } from "@/lib/validation/filings";

/** The period's filing: the marked run, the current version and every version (any member). */
export const GET = route({ permission: "member", params: idParam("periodId") }, async ({ actor, params }) => periodFiling(actor, params.periodId));

/** Assemble the draft filing from the period's marked run, or rebuild the open draft from it (compliance officer). */
export const POST = route({ permission: "filing.prepare", params: idParam("periodId"), body: prepareFilingSchema }, async ({ actor, params, body }) => ({
  filing: await prepareFiling(actor, params.periodId, body),
}));
