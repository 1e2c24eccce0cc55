/** Write one audit event inside the caller's transaction, so the change and its record stand or fall together. */
import "server-only";
import { auditEvents } from "@/db/schema";
import type { Tx, Database } from "@/db/client";
import type { Actor } from "@/lib/auth/actor";
import { now } from "@/lib/clock";

export interface AuditInput {
  action: string;
  entityType: string;
  entityId?: string | null;
  summary: string;
  detail?: Record<string, unknown>;
  /** the time of the act when the caller stamped the record itself (so both show the same instant); now otherwise */
  at?: string;
}

/** Who an audit record names: a person of the firm, or a part of Ballast acting on its own (no user id). */
export type AuditActor = Pick<Actor, "name" | "firmId"> & { userId: string | null };

/** The actor of what Ballast does on its own schedule for a firm (opening a period, sending a reminder …). */
export function scheduledActor(firmId: string, name: string): AuditActor {
  return { firmId, userId: null, name };
}

/** Record who did what, when, on which record. */
export async function recordAudit(tx: Tx | Database, actor: AuditActor, event: AuditInput): Promise<void> {
  await tx.insert(auditEvents).values({
    firmId: actor.firmId,
    actorId: actor.userId,
    actorName: actor.name,
    at: event.at ?? now().toISOString(),
    action: event.action,
    entityType: event.entityType,
    entityId: event.entityId ?? null,
    summary: event.summary,
    detail: event.detail ?? null,
  });
}
