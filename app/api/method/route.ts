import { route } from "@/lib/auth/route";
import { coApprovalRequired, createMethodDraft, currentMethod, listMethodVersions } from "@/lib/data/method";
import { newMethodDraftSchema } from "@/lib/validation/method";

/** The firm's method statement versions, newest first, with the approved one in full. */
export const GET = route({ permission: "member" }, async ({ actor }) => ({
  current: await currentMethod(actor),
  versions: await listMethodVersions(actor),
  coApprovalRequired: await coApprovalRequired(actor),
}));

/** Open a new draft version (from the approved one, with a reason; or from the defaults). */
export const POST = route({ permission: "method.edit", body: newMethodDraftSchema }, async ({ actor, body }) =>
  Response.json({ version: await createMethodDraft(actor, body) }, { status: 201 }),
);
