import { sql } from "drizzle-orm";
import { sqliteTable, text, integer, real, index, uniqueIndex, blob, primaryKey } from "drizzle-orm/sqlite-core";
import { id, createdAt } from "../columns";
import { firmReference } from "./firms";
import { reportingPeriods } from "./periods";
import { uploads } from "./data";
import { methodStatements, capitalRuleProfiles } from "./method";
import type { RunInputHashes, RunResults } from "../../lib/runs/types";
import type { InputChange } from "../../lib/runs/freshness";
import type { HistoryAssessment } from "../../lib/runs/compute";

/** A run computes every figure of a period from stated inputs; it is never edited. */
export const runs = sqliteTable(
  "runs",
  {
    id: id(),
    ...firmReference(),
    periodId: text("period_id")
      .notNull()
      .references(() => reportingPeriods.id),
    methodStatementId: text("method_statement_id")
      .notNull()
      .references(() => methodStatements.id),
    positionsUploadId: text("positions_upload_id")
      .notNull()
      .references(() => uploads.id),
    capitalProfileId: text("capital_profile_id").references(() => capitalRuleProfiles.id),
    /** queued → running → completed | failed */
    status: text("status").notNull().default("queued"),
    stage: text("stage").notNull().default("queued"),
    progress: real("progress").notNull().default(0),
    inputHashes: text("input_hashes", { mode: "json" }).$type<RunInputHashes>(),
    engineVersion: text("engine_version"),
    results: text("results", { mode: "json" }).$type<RunResults>(),
    error: text("error"),
    isFilingRun: integer("is_filing_run", { mode: "boolean" }).notNull().default(false),
    reproducesRunId: text("reproduces_run_id"),
    startedBy: text("started_by").notNull(),
    startedAt: createdAt(),
    finishedAt: text("finished_at"),
    /** wall-clock time of the last progress report; a queued/running run silent for too long was interrupted */
    heartbeatAt: text("heartbeat_at"),
  },
  (t) => [
    index("runs_firm_period").on(t.firmId, t.periodId),
    /** one run at a time per period */
    uniqueIndex("runs_one_active_per_period").on(t.firmId, t.periodId).where(sql`status in ('queued', 'running')`),
    /** one filing run per period */
    uniqueIndex("runs_one_filing_run_per_period").on(t.firmId, t.periodId).where(sql`is_filing_run = 1`),
  ],
);
export type Run = typeof runs.$inferSelect;

/** The columns of a run's write-once compressed record: the run it belongs to, its firm, the gzip bytes and their uncompressed size. */
const runBlobColumns = () => ({
  runId: text("run_id")
    .primaryKey()
    .references(() => runs.id),
  ...firmReference(),
  /** gzip of JSON (see each table) */
  data: blob("data", { mode: "buffer" }).notNull(),
  /** uncompressed size in bytes */
  bytes: integer("bytes").notNull(),
  createdAt: createdAt(),
});

/**
 * The exact inputs of a run (positions rows, aligned closes per factor, method content, capital profile), as
 * gzip-compressed canonical JSON of RunInputs (lib/runs/types.ts), written once with the run and never changed:
 * reproducing a run reads these, never today's data.
 */
export const runInputs = sqliteTable("run_inputs", runBlobColumns());

/**
 * A completed run's per-position detail (each method's contributions by position and confidence), as gzip of the
 * JSON of RunDetail (lib/runs/detail.ts), written once with the run's completion and never changed. Kept apart from
 * `runs.results` so that the run's page, lists and checks do not read it; the contributions page, the packs and a
 * reproduction do.
 */
export const runDetails = sqliteTable("run_details", runBlobColumns());

/**
 * A run's stored closes compared with the firm's price history in one state of it (the count and latest confirmation
 * of its price uploads): the changes found, kept so that every web process and page view reads them instead of
 * comparing again (lib/data/run-freshness.ts). The worker fills them after a price confirmation (the data-quality job);
 * a row of an earlier state is replaced by the next.
 */
export const runPriceChecks = sqliteTable(
  "run_price_checks",
  {
    runId: text("run_id")
      .notNull()
      .references(() => runs.id),
    ...firmReference(),
    priceState: text("price_state").notNull(),
    changes: text("changes", { mode: "json" }).$type<InputChange[]>().notNull(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.runId, t.priceState] })],
);

/**
 * A run start's history check (lib/data/runs.ts historyCheck) of one confirmed positions upload against one state of
 * the firm's price history, for a period end and a minimum history: kept so that a start answers without counting a
 * big book's history again. The worker keeps it after each confirmation (the data-quality job), and so does a start
 * that goes ahead (never a refused one); a row of an earlier price state is replaced by the next.
 */
export const historyChecks = sqliteTable(
  "history_checks",
  {
    uploadId: text("upload_id")
      .notNull()
      .references(() => uploads.id),
    ...firmReference(),
    periodEnd: text("period_end").notNull(),
    minHistory: integer("min_history").notNull(),
    priceState: text("price_state").notNull(),
    assessment: text("assessment", { mode: "json" }).$type<HistoryAssessment>().notNull(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.uploadId, t.periodEnd, t.minHistory, t.priceState] })],
);
