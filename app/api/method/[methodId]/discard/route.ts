import { route } from "@/lib/auth/route";
import { discardMethodDraft } from "@/lib/data/method";
import { idParam } from "@/lib/validation/firm";
import { discardMethodSchema } from "@/lib/validation/method";

/** Discard a draft (kept in the history as discarded). */
export const POST = route({ permission: "method.edit", params: idParam("methodId"), body: discardMethodSchema }, async ({ actor, params, body }) => ({
  version: await discardMethodDraft(actor, params.methodId, body),
}));
