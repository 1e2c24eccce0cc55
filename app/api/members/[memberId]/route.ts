import { route } from "@/lib/auth/route";
import { updateMember } from "@/lib/data/members";
import { idParam, memberUpdateSchema } from "@/lib/validation/firm";

/** Change a member's roles, or deactivate / reactivate them (administrators). */
export const PATCH = route(
  { permission: "users.manage", params: idParam("memberId"), body: memberUpdateSchema },
  async ({ actor, params, body }) => ({ member: await updateMember(actor, params.memberId, body) }),
);
