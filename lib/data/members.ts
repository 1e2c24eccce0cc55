/** The firm's members: people, their roles, and whether they may sign in. */
import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { memberships, users } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import { parseRoles, type Role } from "@/lib/auth/roles";
import type { MemberUpdateInput } from "@/lib/validation/firm";
import { pendingInvitations } from "./accounts";

export interface Member {
  id: string;
  userId: string;
  name: string;
  email: string;
  roles: Role[];
  active: boolean;
  createdAt: string;
  deactivatedAt: string | null;
  /** an invitation not yet taken up: when its link expires (it may have expired already) */
  invitationExpiresAt: string | null;
}

/** Every member of the actor's firm, active first, by name. */
export async function listMembers(actor: Actor): Promise<Member[]> {
  const rows = await getDb()
    .select({ m: memberships, u: users })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.firmId, actor.firmId));
  const pending = await pendingInvitations(actor, rows.map((r) => r.u.id));
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
      invitationExpiresAt: pending.get(u.id) ?? null,
    }))
    .sort((a, b) => Number(b.active) - Number(a.active) || a.name.localeCompare(b.name));
}

async function getMember(actor: Actor, memberId: string): Promise<Member> {
  const member = (await listMembers(actor)).find((m) => m.id === memberId);
  if (!member) throw new AppError("not_found:member");
  return member;
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
