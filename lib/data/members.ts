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

/**
 * Change a member's roles or deactivate/reactivate them. The firm always keeps one active administrator, and nobody
 * gives themselves the compliance head (signing) role: another administrator must.
 */
export async function updateMember(actor: Actor, memberId: string, input: MemberUpdateInput): Promise<Member> {
  const member = await getMember(actor, memberId);
  const members = await listMembers(actor);
  const roles = input.roles ?? member.roles;
  const active = input.active ?? member.active;
  const adminsAfter = members.filter((m) => (m.id === memberId ? active && roles.includes("admin") : m.active && m.roles.includes("admin")));
  if (adminsAfter.length === 0) {
    throw new AppError("conflict:member", "The firm needs at least one active administrator; give the role to someone else first.");
  }
  // Nobody grants themselves the signing role: another administrator must, so that no one signs what they alone
  // administer. The refusal is audited (and nothing else is written).
  const grantsSelfSigning = member.userId === actor.userId && roles.includes("compliance_head") && !member.roles.includes("compliance_head");
  if (grantsSelfSigning) {
    const others = members.filter((m) => m.userId !== actor.userId && m.active && m.roles.includes("admin"));
    await recordAudit(getDb(), actor, {
      action: "member.role_change_refused",
      entityType: "membership",
      entityId: memberId,
      summary: `${actor.name} tried to give themselves the compliance head role; refused (needs another administrator)`,
      detail: { before: member.roles, asked: roles, otherAdministrators: others.length },
    });
    throw new AppError(
      "forbidden:member",
      others.length > 0
        ? `You cannot give yourself the compliance head role; another administrator (${others.map((m) => m.name).join(", ")}) must grant it.`
        : "You cannot give yourself the compliance head role, and the firm has no other administrator who could: add a second administrator first.",
      { roles: "Another administrator must grant the compliance head role." },
    );
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
