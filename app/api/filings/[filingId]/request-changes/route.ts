import { route } from "@/lib/auth/route";
import { requestChanges } from "@/lib/data/filings";
import { idParam } from "@/lib/validation/firm";
import { requestChangesSchema } from "@/lib/validation/filings";

/** Send the version in review back to the compliance officer, with the reason (compliance head). */
export const POST = route({ permission: "filing.review", params: idParam("filingId"), body: requestChangesSchema }, async ({ actor, params, body }) => ({
  filing: await requestChanges(actor, params.filingId, body),
}));
