import { route } from "@/lib/auth/route";
import { getFiling, updateFiling } from "@/lib/data/filings";
import { idParam } from "@/lib/validation/firm";
import { updateFilingSchema } from "@/lib/validation/filings";

/** One version of a filing, with its comments and signatures (any member). */
export const GET = route({ permission: "member", params: idParam("filingId") }, async ({ actor, params }) => ({
  filing: await getFiling(actor, params.filingId),
}));

/** The cover note and exception explanations of a draft (compliance officer); a signed version is refused. */
export const PATCH = route({ permission: "filing.prepare", params: idParam("filingId"), body: updateFilingSchema }, async ({ actor, params, body }) => ({
  filing: await updateFiling(actor, params.filingId, body),
}));
