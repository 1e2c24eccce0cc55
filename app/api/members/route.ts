import { route } from "@/lib/auth/route";
import { addMember, listMembers } from "@/lib/data/members";
import { newMemberSchema } from "@/lib/validation/firm";

/** The firm's members and their roles (administrators). */
export const GET = route({ permission: "users.manage" }, async ({ actor }) => ({ members: await listMembers(actor) }));

/** Add a person to the firm with roles (administrators). */
export const POST = route({ permission: "users.manage", body: newMemberSchema }, async ({ actor, body }) =>
  Response.json({ member: await addMember(actor, body) }, { status: 201 }),
);
