import { sqliteTable, text, index, uniqueIndex } from "drizzle-orm/sqlite-core";
import { id, createdAt, firmColumns } from "../columns";

/**
 * Single-use links for setting a password: an invitation (a new member sets their first password) or a reset.
 * Only the SHA-256 of the token is stored; the token itself exists only in the e-mail (or the printed link).
 * Global: a reset precedes any firm, and one person may belong to several firms.
 */
export const accountTokens = sqliteTable(
  "account_tokens",
  {
    id: id(),
    userId: text("user_id").notNull(),
    /** the firm that invited them (invitations), or null (resets) */
    firmId: text("firm_id"),
    /** "invite" | "reset" */
    purpose: text("purpose").notNull(),
    tokenHash: text("token_hash").notNull(),
    expiresAt: text("expires_at").notNull(),
    usedAt: text("used_at"),
    /** who asked for it (the inviting administrator); null for a reset the person asked for */
    createdBy: text("created_by"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("account_tokens_hash").on(t.tokenHash), index("account_tokens_user").on(t.userId, t.purpose)],
);
export type AccountToken = typeof accountTokens.$inferSelect;

/** Requests that are rate limited outside sign-in (reset mails, invitations, first-run tries), by kind and key. */
export const accountRequests = sqliteTable(
  "account_requests",
  {
    id: id(),
    kind: text("kind").notNull(),
    key: text("key").notNull(),
    at: text("at").notNull(),
  },
  (t) => [index("account_requests_kind_key_at").on(t.kind, t.key, t.at)],
);

/** The install's one-time first-run: its row (id "first-run") exists once the first firm was created there. */
export const installSteps = sqliteTable("install_steps", {
  id: text("id").primaryKey(),
  at: text("at").notNull(),
  detail: text("detail", { mode: "json" }).$type<Record<string, unknown>>(),
});

/**
 * A person's confirmation of a data-quality item that asks for one ("Extreme return to confirm"): who, when, why.
 * Keyed by the item (check, instrument and the dates it names), so a changed finding asks again.
 */
export const qualityConfirmations = sqliteTable(
  "quality_confirmations",
  {
    id: id(),
    ...firmColumns,
    periodId: text("period_id").notNull(),
    check: text("check").notNull(),
    instrument: text("instrument").notNull(),
    /** the item's dates joined by commas ("" for none): the finding confirmed */
    itemKey: text("item_key").notNull(),
    reason: text("reason").notNull(),
    confirmedBy: text("confirmed_by").notNull(),
    confirmedByName: text("confirmed_by_name").notNull(),
    confirmedAt: text("confirmed_at").notNull(),
  },
  (t) => [uniqueIndex("quality_confirmations_item").on(t.firmId, t.periodId, t.check, t.instrument, t.itemKey)],
);
export type QualityConfirmation = typeof qualityConfirmations.$inferSelect;
