/** The firm's members: people, their roles, and whether they may sign in. */
import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { memberships, users } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import { hashPassword } from "@/lib/auth/password";
import { parseRoles, type Role } from "@/lib/auth/roles";
import { isCommonPassword } from "@/lib/validation/common-passwords";
import type { MemberUpdateInput, NewMemberInput } from "@/lib/validation/firm";

export interface Member {
  id: string;
  userId: string;
  name: string;
  email: string;
  roles: Role[];
  active: boolean;
  createdAt: string;
  deactivatedAt: string | null;
}

/** Every member of the actor's firm, active first, by name. */
export async function listMembers(actor: Actor): Promise<Member[]> {
  const rows = await getDb()
    .select({ m: memberships, u: users })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.firmId, actor.firmId));
  return rows
    .map(({ m, u }) => ({
      id: m.id,
      userId: u.id,
      name: u.name,
      email: u.email,
      roles: parseRoles(m.roles),
      active: m.active && u.active,
      createdAt: m.createdAt,
      deactivatedAt: m.deactivatedAt,
    }))
    .sort((a, b) => Number(b.active) - Number(a.active) || a.name.localeCompare(b.name));
}

async function getMember(actor: Actor, memberId: string): Promise<Member> {
  const member = (await listMembers(actor)).find((m) => m.id === memberId);
  if (!member) throw new AppError("not_found:member");
  return member;
}

/**
 * Add a person to the firm. A new e-mail gets a new account with the given password; an e-mail that already has
 * a Ballast account (at another firm) is linked without changing its password. The answer is the same in both
 * cases, so the form cannot be used to learn which addresses have accounts.
 */
export async function addMember(actor: Actor, input: NewMemberInput): Promise<Member> {
  if (isCommonPassword(input.password)) {
    throw new AppError("unprocessable:member", "Choose a less common password.", { password: "This password is too common; choose another." });
  }
  const db = getDb();
  const passwordHash = await hashPassword(input.password);
  const membershipId = await db.transaction(async (tx) => {
    let [user] = await tx.select().from(users).where(eq(users.email, input.email));
    if (!user) {
      [user] = await tx.insert(users).values({ email: input.email, name: input.name, passwordHash }).returning();
    }
    const [existing] = await tx
      .select()
      .from(memberships)
      .where(and(eq(memberships.firmId, actor.firmId), eq(memberships.userId, user.id)));
    if (existing) throw new AppError("conflict:member", "This person is already a member of the firm.", { email: "Already a member of this firm." });
    const [membership] = await tx.insert(memberships).values({ firmId: actor.firmId, userId: user.id, roles: input.roles }).returning();
    await recordAudit(tx, actor, {
      action: "member.add",
      entityType: "membership",
      entityId: membership.id,
      summary: `Added ${input.name} <${input.email}> as ${input.roles.join(", ")}`,
      detail: { roles: input.roles },
    });
    return membership.id;
  });
  return getMember(actor, membershipId);
}

/** Change a member's roles or deactivate/reactivate them. The firm always keeps one active administrator. */
export async function updateMember(actor: Actor, memberId: string, input: MemberUpdateInput): Promise<Member> {
  const member = await getMember(actor, memberId);
  const members = await listMembers(actor);
  const roles = input.roles ?? member.roles;
  const active = input.active ?? member.active;
  const adminsAfter = members.filter((m) => (m.id === memberId ? active && roles.includes("admin") : m.active && m.roles.includes("admin")));
  if (adminsAfter.length === 0) {
    throw new AppError("conflict:member", "The firm needs at least one active administrator; give the role to someone else first.");
  }
  await getDb().transaction(async (tx) => {
    await tx
      .update(memberships)
      .set({ roles, active, deactivatedAt: active ? null : member.deactivatedAt ?? new Date().toISOString() })
      .where(and(eq(memberships.id, memberId), eq(memberships.firmId, actor.firmId)));
    const changes: string[] = [];
    if (input.roles && input.roles.join() !== member.roles.join()) changes.push(`roles ${member.roles.join(", ")} → ${roles.join(", ")}`);
    if (input.active !== undefined && input.active !== member.active) changes.push(active ? "reactivated" : "deactivated");
    await recordAudit(tx, actor, {
      action: input.active === false && member.active ? "member.deactivate" : input.active && !member.active ? "member.reactivate" : "member.update",
      entityType: "membership",
      entityId: memberId,
      summary: `${member.name}: ${changes.join("; ") || "no change"}`,
      detail: { before: { roles: member.roles, active: member.active }, after: { roles, active } },
    });
  });
  return getMember(actor, memberId);
}
