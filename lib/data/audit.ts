/** Reading the audit trail, filtered and paged, always within the actor's firm. */
import "server-only";
import { and, desc, eq, gte, lte, like, or, count, type SQL } from "drizzle-orm";
import { getDb } from "@/db/client";
import { auditEvents } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import type { AuditQuery } from "@/lib/validation/audit";

/** One page of audit events, newest first, plus the total and the distinct actions for the filter list. */
export async function listAuditEvents(actor: Actor, query: AuditQuery) {
  const db = getDb();
  const conditions: SQL[] = [eq(auditEvents.firmId, actor.firmId)];
  if (query.action) conditions.push(eq(auditEvents.action, query.action));
  if (query.entityType) conditions.push(eq(auditEvents.entityType, query.entityType));
  if (query.from) conditions.push(gte(auditEvents.at, `${query.from}T00:00:00.000Z`));
  if (query.to) conditions.push(lte(auditEvents.at, `${query.to}T23:59:59.999Z`));
  if (query.q) {
    const pattern = `%${query.q.replace(/[%_]/g, "")}%`;
    conditions.push(or(like(auditEvents.summary, pattern), like(auditEvents.actorName, pattern))!);
  }
  const where = and(...conditions);
  const [{ total }] = await db.select({ total: count() }).from(auditEvents).where(where);
  const rows = await db
    .select()
    .from(auditEvents)
    .where(where)
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  const actions = await db
    .selectDistinct({ action: auditEvents.action })
    .from(auditEvents)
    .where(eq(auditEvents.firmId, actor.firmId))
    .orderBy(auditEvents.action);
  return {
    events: rows.map(({ firmId: _firmId, ...row }) => row),
    total,
    page: query.page,
    pageSize: query.pageSize,
    actions: actions.map((a) => a.action),
  };
}
