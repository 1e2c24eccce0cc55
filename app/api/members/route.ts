import { route } from "@/lib/auth/route";
import { inviteMember } from "@/lib/data/accounts";
import { listMembers } from "@/lib/data/members";
import { newMemberSchema } from "@/lib/validation/firm";

/** The firm's members and their roles (administrators). */
export const GET = route({ permission: "users.manage" }, async ({ actor }) => ({ members: await listMembers(actor) }));

/** Invite a person with roles (administrators): they choose their own password through an e-mailed single-use link. */
export const POST = route({ permission: "users.manage", body: newMemberSchema }, async ({ actor, body }) => {
  const invitation = await inviteMember(actor, body);
  const member = (await listMembers(actor)).find((m) => m.id === invitation.memberId);
  return Response.json({ member, invitation }, { status: 201 });
});
