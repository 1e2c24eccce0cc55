import { route } from "@/lib/auth/route";
import { replyOnFiling } from "@/lib/data/filings";
import { idParam } from "@/lib/validation/firm";
import { filingCommentSchema } from "@/lib/validation/filings";

/** The compliance officer's answer on one section. */
export const POST = route({ permission: "filing.prepare", params: idParam("filingId"), body: filingCommentSchema }, async ({ actor, params, body }) => ({
  filing: await replyOnFiling(actor, params.filingId, body),
}));
