/** Ending sessions on the server (no Auth.js import, so scripts and tests can use it). */
import { and, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { auditEvents, memberships, users } from "@/db/schema";
import { now } from "@/lib/clock";
import type { Actor } from "@/lib/auth/actor";
import { recordAudit } from "@/lib/audit/record";

/** The app's own sign-out: the person's session version moves on (every copy of the token stops working), audited. */
export async function endSessionOfActor(actor: Actor): Promise<void> {
  await getDb().transaction(async (tx) => {
    await tx.update(users).set({ sessionVersion: sql`${users.sessionVersion} + 1` }).where(eq(users.id, actor.userId));
    await recordAudit(tx, actor, { action: "session.sign_out", entityType: "user", entityId: actor.userId, summary: `${actor.name} signed out` });
  });
}

/**
 * End a person's sessions on the server: the session version moves on, so every copy of the token is refused by
 * the gate. Only when the token's version is still current (the app's own sign-out has already moved it on and
 * audited it); recorded in the audit trail of each firm the person belongs to.
 */
export async function endSessionsOf(userId: string, tokenVersion: number): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const moved = await tx
      .update(users)
      .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
      .where(and(eq(users.id, userId), eq(users.sessionVersion, tokenVersion)))
      .returning({ name: users.name });
    if (moved.length === 0) return false;
    const firms = await tx.select({ firmId: memberships.firmId }).from(memberships).where(eq(memberships.userId, userId));
    for (const { firmId } of firms) {
      await tx.insert(auditEvents).values({
        firmId,
        actorId: userId,
        actorName: moved[0].name,
        at: now().toISOString(),
        action: "session.sign_out",
        entityType: "user",
        entityId: userId,
        summary: `${moved[0].name} signed out (sign-in service)`,
      });
    }
    return true;
  });
}
