/**
 * Results computed once and read many times: the data-quality report of a period (recomputed only when what it
 * reads changes, lib/data/data-quality.ts) and the rendered filing packs (one per filing version, state, format and
 * content, lib/data/packs.ts). Stored packs are never changed (trigger in db/migrations).
 */
import { sqliteTable, text, integer, blob, uniqueIndex, index } from "drizzle-orm/sqlite-core";
import type { QualityReport } from "../../lib/uploads/data-quality";
import { id, createdAt, firmColumns } from "../columns";
import { firmReference } from "./firms";
import { filings } from "./filings";

/** The period's data-quality report as of the inputs fingerprinted by `inputsKey`. One row per firm and period. */
export const dataQualityReports = sqliteTable(
  "data_quality_reports",
  {
    id: id(),
    ...firmColumns,
    periodId: text("period_id").notNull(),
    /** SHA-256 over what the report read (lib/data/data-quality.ts: qualityInputsKey) */
    inputsKey: text("inputs_key").notNull(),
    /** the confirmed positions upload it checked (null: none yet) */
    uploadId: text("upload_id"),
    fileName: text("file_name"),
    positionCount: integer("position_count").notNull().default(0),
    report: text("report", { mode: "json" }).$type<QualityReport>().notNull(),
    computedAt: text("computed_at").notNull(),
  },
  (t) => [uniqueIndex("data_quality_reports_firm_period").on(t.firmId, t.periodId)],
);

/** One rendered filing pack. Immutable: a new state, version or content is a new row. */
export const packFiles = sqliteTable(
  "pack_files",
  {
    id: id(),
    ...firmReference(),
    filingId: text("filing_id")
      .notNull()
      .references(() => filings.id),
    version: integer("version").notNull(),
    /** draft | signed | filed | superseded (the state in the pack's file name) */
    state: text("state").notNull(),
    /** docx | xlsx */
    format: text("format").notNull(),
    /** SHA-256 of the filing content the pack was rendered from (drafts change under one state) */
    contentKey: text("content_key").notNull(),
    fileName: text("file_name").notNull(),
    sha256: text("sha256").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    bytes: blob("bytes", { mode: "buffer" }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("pack_files_one_per_content").on(t.filingId, t.version, t.state, t.format, t.contentKey),
    index("pack_files_firm_filing").on(t.firmId, t.filingId),
  ],
);
