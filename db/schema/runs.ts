import { sqliteTable, text, integer, real, index } from "drizzle-orm/sqlite-core";
import { id, createdAt, firmColumns } from "../columns";

/** A run computes every figure of a period from stated inputs; it is never edited. */
export const runs = sqliteTable(
  "runs",
  {
    id: id(),
    ...firmColumns,
    periodId: text("period_id").notNull(),
    methodStatementId: text("method_statement_id").notNull(),
    positionsUploadId: text("positions_upload_id").notNull(),
    capitalProfileId: text("capital_profile_id"),
    /** queued → running → completed | failed */
    status: text("status").notNull().default("queued"),
    stage: text("stage").notNull().default("queued"),
    progress: real("progress").notNull().default(0),
    inputHashes: text("input_hashes", { mode: "json" }).$type<Record<string, string>>(),
    engineVersion: text("engine_version"),
    results: text("results", { mode: "json" }).$type<Record<string, unknown>>(),
    error: text("error"),
    isFilingRun: integer("is_filing_run", { mode: "boolean" }).notNull().default(false),
    reproducesRunId: text("reproduces_run_id"),
    startedBy: text("started_by").notNull(),
    startedAt: createdAt(),
    finishedAt: text("finished_at"),
  },
  (t) => [index("runs_firm_period").on(t.firmId, t.periodId)],
);
