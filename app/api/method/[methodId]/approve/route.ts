import { route } from "@/lib/auth/route";
import { approveMethod } from "@/lib/data/method";
import { idParam } from "@/lib/validation/firm";
import { approveMethodSchema } from "@/lib/validation/method";

/** Approve a draft (risk analyst) or co-approve it (a different person, a compliance head, where the firm requires it). */
export const POST = route({ permission: "method.approve", params: idParam("methodId"), body: approveMethodSchema }, async ({ actor, params, body }) => ({
  version: await approveMethod(actor, params.methodId, body),
}));
