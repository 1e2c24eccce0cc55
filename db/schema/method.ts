import { sqliteTable, text, integer, real, uniqueIndex } from "drizzle-orm/sqlite-core";
import { id, createdAt, firmColumns } from "../columns";

/** A version of the firm's method statement. Approved versions never change; a change is a new version. */
export const methodStatements = sqliteTable(
  "method_statements",
  {
    id: id(),
    ...firmColumns,
    version: integer("version").notNull(),
    /** draft → approved → superseded */
    status: text("status").notNull().default("draft"),
    content: text("content", { mode: "json" }).$type<Record<string, unknown>>().notNull(),
    rationale: text("rationale").notNull().default(""),
    limitations: text("limitations", { mode: "json" }).$type<string[]>().notNull().default([]),
    evidence: text("evidence", { mode: "json" }).$type<Record<string, unknown> | null>(),
    reason: text("reason").notNull().default(""),
    previousId: text("previous_id"),
    createdBy: text("created_by").notNull(),
    approvedBy: text("approved_by"),
    coApprovedBy: text("co_approved_by"),
    approvedAt: text("approved_at"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("method_statements_firm_version").on(t.firmId, t.version)],
);

/** The firm's capital rule profile: every parameter of the capital formula is the firm's to set. */
export const capitalRuleProfiles = sqliteTable("capital_rule_profiles", {
  id: id(),
  ...firmColumns,
  name: text("name").notNull().default("Default (Basel market-risk framework)"),
  confidence: real("confidence").notNull().default(0.99),
  horizonDays: integer("horizon_days").notNull().default(10),
  averagingDays: integer("averaging_days").notNull().default(60),
  baseMultiplier: real("base_multiplier").notNull().default(3),
  stressedMultiplier: real("stressed_multiplier").notNull().default(3),
  backtestDays: integer("backtest_days").notNull().default(250),
  /** plus factor by exception count (JSON object "5": 0.4 …); defaults follow the 1996 backtesting framework */
  plusFactors: text("plus_factors", { mode: "json" }).$type<Record<string, number>>().notNull(),
  active: integer("active", { mode: "boolean" }).notNull().default(true),
  createdAt: createdAt(),
});
