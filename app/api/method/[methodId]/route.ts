import { route } from "@/lib/auth/route";
import { getMethodVersion, updateMethodDraft } from "@/lib/data/method";
import { idParam } from "@/lib/validation/firm";
import { methodDraftSchema } from "@/lib/validation/method";

/** One version of the firm's method statement. */
export const GET = route({ permission: "member", params: idParam("methodId") }, async ({ actor, params }) => ({
  version: await getMethodVersion(actor, params.methodId),
}));

/** Save a draft (checked again on the server, field by field). */
export const PUT = route({ permission: "method.edit", params: idParam("methodId"), body: methodDraftSchema }, async ({ actor, params, body }) => ({
  version: await updateMethodDraft(actor, params.methodId, body),
}));
