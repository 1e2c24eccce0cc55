import { sqliteTable, text, integer, real, uniqueIndex } from "drizzle-orm/sqlite-core";
import { id, createdAt, firmColumns } from "../columns";
import type { MethodEvidence } from "../../lib/method/evidence";
import type { MethodContent } from "../../lib/validation/method";
import type { StandardisedProfile } from "../../lib/risk/standardised/types";

/** A version of the firm's method statement. Approved versions never change; a change is a new version. */
export const methodStatements = sqliteTable(
  "method_statements",
  {
    id: id(),
    ...firmColumns,
    version: integer("version").notNull(),
    /** draft → approved → superseded */
    status: text("status").notNull().default("draft"),
    content: text("content", { mode: "json" }).$type<MethodContent>().notNull(),
    rationale: text("rationale").notNull().default(""),
    limitations: text("limitations", { mode: "json" }).$type<string[]>().notNull().default([]),
    evidence: text("evidence", { mode: "json" }).$type<MethodEvidence | null>(),
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
export const capitalRuleProfiles = sqliteTable(
  "capital_rule_profiles",
  {
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
    /** 1, 2, …: each saved change is a new version; the earlier one stays (active = false) */
    version: integer("version").notNull().default(1),
    /** which figures a run computes: "internal_models", "standardised" or "both" */
    regimes: text("regimes").notNull().default("internal_models"),
    /** which of the computed figures is the one filed: "internal_models" or "standardised" */
    filedRegime: text("filed_regime").notNull().default("internal_models"),
    /** the standardised building blocks' rates and choices (lib/validation/capital-profile.ts), null: the defaults */
    standardised: text("standardised", { mode: "json" }).$type<StandardisedProfile | null>(),
    /** show the risk-weighted-asset equivalent (capital × 12.5) beside the filed figure */
    showRwa: integer("show_rwa", { mode: "boolean" }).notNull().default(false),
    /** why this version was made */
    reason: text("reason").notNull().default(""),
    previousId: text("previous_id"),
    createdBy: text("created_by"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("capital_rule_profiles_firm_version").on(t.firmId, t.version)],
);
