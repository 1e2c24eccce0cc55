import { sqliteTable, text, integer, uniqueIndex, index } from "drizzle-orm/sqlite-core";
import { id, createdAt } from "../columns";

/** A firm is a tenant: nobody sees another firm's rows. */
export const firms = sqliteTable("firms", {
  id: id(),
  name: text("name").notNull(),
  slug: text("slug").notNull().unique(),
  reportingCurrency: text("reporting_currency").notNull().default("EUR"),
  regulatorName: text("regulator_name").notNull().default(""),
  /** label of the signer's licence or registration reference, e.g. "Registration no." */
  licenceLabel: text("licence_label").notNull().default("Registration reference"),
  /** require a compliance head to co-approve method statements */
  methodCoApproval: integer("method_co_approval", { mode: "boolean" }).notNull().default(false),
  /** why the firm allows one-person method approval (required when methodCoApproval is off; new firms start with it on) */
  methodSingleApprovalReason: text("method_single_approval_reason").notNull().default(""),
  createdAt: createdAt(),
});
export type Firm = typeof firms.$inferSelect;

/** The firm column of a tenant table that also declares it as a foreign key to firms.id. */
export const firmReference = () => ({ firmId: text("firm_id").notNull().references(() => firms.id) });
export type NewFirm = typeof firms.$inferInsert;

/** People. A person signs in once and may belong to several firms through memberships. */
export const users = sqliteTable("users", {
  id: id(),
  email: text("email").notNull().unique(),
  name: text("name").notNull(),
  passwordHash: text("password_hash").notNull(),
  active: integer("active", { mode: "boolean" }).notNull().default(true),
  /** bumped on sign-out everywhere or password change; sessions carrying an older value stop working */
  sessionVersion: integer("session_version").notNull().default(1),
  createdAt: createdAt(),
});
export type User = typeof users.$inferSelect;
export type NewUser = typeof users.$inferInsert;

/** user × firm × roles. Roles are read from here on every request, never trusted from the client. */
export const memberships = sqliteTable(
  "memberships",
  {
    id: id(),
    ...firmReference(),
    userId: text("user_id").notNull().references(() => users.id),
    /** JSON array of role names; validated by zod in lib/auth/permissions.ts */
    roles: text("roles", { mode: "json" }).$type<string[]>().notNull(),
    active: integer("active", { mode: "boolean" }).notNull().default(true),
    /** per-person opt-out of reminder e-mails (the overdue one is always sent) */
    remindersEnabled: integer("reminders_enabled", { mode: "boolean" }).notNull().default(true),
    deactivatedAt: text("deactivated_at"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("memberships_firm_user").on(t.firmId, t.userId)],
);
export type Membership = typeof memberships.$inferSelect;
export type NewMembership = typeof memberships.$inferInsert;

/** Sign-in attempts, for rate limiting per account and per address. Global: attempts precede any firm. */
export const signInAttempts = sqliteTable(
  "sign_in_attempts",
  {
    id: id(),
    email: text("email").notNull(),
    address: text("address").notNull(),
    succeeded: integer("succeeded", { mode: "boolean" }).notNull(),
    at: text("at").notNull(),
  },
  (t) => [index("sign_in_attempts_email_at").on(t.email, t.at), index("sign_in_attempts_address_at").on(t.address, t.at)],
);
