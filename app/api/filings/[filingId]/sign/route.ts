import { route } from "@/lib/auth/route";
import { signFiling } from "@/lib/data/filings";
import { idParam } from "@/lib/validation/firm";
import { signFilingSchema } from "@/lib/validation/filings";

/** Sign the version in review: password again, attestation, name and reference; four eyes (compliance head). */
export const POST = route({ permission: "filing.sign", params: idParam("filingId"), body: signFilingSchema }, async ({ actor, params, body }) => ({
  filing: await signFiling(actor, params.filingId, body),
}));
