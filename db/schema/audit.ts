import { sqliteTable, text, index } from "drizzle-orm/sqlite-core";
import { id, firmColumns } from "../columns";

/** Who did what, when, on which record. Written in the same transaction as the change; never updated or deleted. */
export const auditEvents = sqliteTable(
  "audit_events",
  {
    id: id(),
    ...firmColumns,
    actorId: text("actor_id"),
    actorName: text("actor_name").notNull().default(""),
    at: text("at").notNull(),
    action: text("action").notNull(),
    entityType: text("entity_type").notNull(),
    entityId: text("entity_id"),
    summary: text("summary").notNull().default(""),
    detail: text("detail", { mode: "json" }).$type<Record<string, unknown>>(),
  },
  (t) => [index("audit_events_firm_at").on(t.firmId, t.at)],
);
export type AuditEvent = typeof auditEvents.$inferSelect;
