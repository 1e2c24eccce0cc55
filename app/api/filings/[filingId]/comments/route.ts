import { route } from "@/lib/auth/route";
import { commentOnFiling } from "@/lib/data/filings";
import { idParam } from "@/lib/validation/firm";
import { filingCommentSchema } from "@/lib/validation/filings";

/** A review comment on one section (compliance head). */
export const POST = route({ permission: "filing.review", params: idParam("filingId"), body: filingCommentSchema }, async ({ actor, params, body }) => ({
  filing: await commentOnFiling(actor, params.filingId, body),
}));
