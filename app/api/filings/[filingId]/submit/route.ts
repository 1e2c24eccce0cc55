import { route } from "@/lib/auth/route";
import { submitFiling } from "@/lib/data/filings";
import { idParam } from "@/lib/validation/firm";
import { submitFilingSchema } from "@/lib/validation/filings";

/** Send the draft (or the version sent back) to the compliance head for review (compliance officer). */
export const POST = route({ permission: "filing.prepare", params: idParam("filingId"), body: submitFilingSchema }, async ({ actor, params, body }) => ({
  filing: await submitFiling(actor, params.filingId, body),
}));
