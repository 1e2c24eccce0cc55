import { z } from "zod";
import { route } from "@/lib/auth/route";
import { resendInvitation } from "@/lib/data/accounts";
import { idParam } from "@/lib/validation/firm";

/** Send a fresh invitation to a member who has not chosen a password yet (administrators); earlier links stop working. */
export const POST = route({ permission: "users.manage", params: idParam("memberId"), body: z.strictObject({}, { error: "Send an empty object: a new invitation takes no fields." }) }, async ({ actor, params }) => ({ invitation: await resendInvitation(actor, params.memberId) }));
