import { route } from "@/lib/auth/route";
import { newFilingVersion } from "@/lib/data/filings";
import { idParam } from "@/lib/validation/firm";
import { newFilingVersionSchema } from "@/lib/validation/filings";

/** A change after signing: a new draft version with the reason; the old signature is superseded (compliance officer). */
export const POST = route({ permission: "filing.prepare", params: idParam("filingId"), body: newFilingVersionSchema }, async ({ actor, params, body }) => ({
  filing: await newFilingVersion(actor, params.filingId, body),
}));
