import { route } from "@/lib/auth/route";
import { attachEvidence } from "@/lib/data/method";
import { idParam } from "@/lib/validation/firm";
import { methodEvidenceSchema } from "@/lib/validation/method";

/** Recompute the estimator comparison on the firm's stored prices and attach it to a draft. */
export const POST = route({ permission: "method.edit", params: idParam("methodId"), body: methodEvidenceSchema }, async ({ actor, params, body }) => ({
  version: await attachEvidence(actor, params.methodId, body),
}));
