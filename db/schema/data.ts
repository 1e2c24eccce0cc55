import { sql } from "drizzle-orm";
import { sqliteTable, text, integer, real, index, uniqueIndex } from "drizzle-orm/sqlite-core";
import { id, createdAt } from "../columns";
import { firmReference } from "./firms";
import { reportingPeriods } from "./periods";
import type { ReadOptions } from "../../lib/uploads/types";
import type { UploadSummary } from "../../lib/uploads/summary";

/** An uploaded file: positions for a period, or price history for the firm. Confirmed by a person before use. */
export const uploads = sqliteTable(
  "uploads",
  {
    id: id(),
    ...firmReference(),
    periodId: text("period_id").references(() => reportingPeriods.id),
    kind: text("kind").notNull(), // "positions" | "prices"
    fileName: text("file_name").notNull(),
    /** generated storage key, never the client's file name */
    fileKey: text("file_key").notNull(),
    sha256: text("sha256").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    /** where the upload service serves the stored bytes */
    fileUrl: text("file_url").notNull().default(""),
    /** how to read the file: number format, header mapping (JSON) */
    options: text("options", { mode: "json" }).$type<ReadOptions>(),
    rowCount: integer("row_count").notNull().default(0),
    errorCount: integer("error_count").notNull().default(0),
    warningCount: integer("warning_count").notNull().default(0),
    cancelledAt: text("cancelled_at"),
    /**
     * reading (a worker reads and checks the file) → pending (waiting for a person) | duplicate (the same file was
     * uploaded before: summary.duplicateOf) | failed (it could not be read: summary.rejected); pending → confirming
     * (a worker stores the rows) → confirmed (or back to pending, summary.confirmError, when that failed) | cancelled;
     * confirmed → superseded
     */
    status: text("status").notNull().default("pending"),
    summary: text("summary", { mode: "json" }).$type<UploadSummary>(),
    problems: text("problems", { mode: "json" }).$type<unknown[]>(),
    uploadedBy: text("uploaded_by").notNull(),
    confirmedBy: text("confirmed_by"),
    confirmedAt: text("confirmed_at"),
    supersededBy: text("superseded_by"),
    createdAt: createdAt(),
  },
  (t) => [index("uploads_firm_period").on(t.firmId, t.periodId)],
);
export type Upload = typeof uploads.$inferSelect;

/**
 * The firm's instruments, including exchange-rate series named by currency pair. A price confirmation adds the codes
 * it does not know before it stages their closes (so that the closes can refer to them); until its last step they are
 * pending (`pendingUpload` set) and no reader lists them.
 */
export const instruments = sqliteTable(
  "instruments",
  {
    id: id(),
    ...firmReference(),
    code: text("code").notNull(),
    name: text("name").notNull().default(""),
    assetClass: text("asset_class").notNull().default("unknown"),
    currency: text("currency").notNull().default(""),
    /** the price upload whose confirmation, still in progress, added this instrument; null once it counts */
    pendingUpload: text("pending_upload").references(() => uploads.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("instruments_firm_code").on(t.firmId, t.code)],
);
export type Instrument = typeof instruments.$inferSelect;

/** One closing price. A correction keeps the old row (current = false) and points to the upload that replaced it. */
export const pricePoints = sqliteTable(
  "price_points",
  {
    id: id(),
    ...firmReference(),
    instrumentId: text("instrument_id")
      .notNull()
      .references(() => instruments.id),
    date: text("date").notNull(),
    close: real("close").notNull(),
    uploadId: text("upload_id").references(() => uploads.id),
    current: integer("current", { mode: "boolean" }).notNull().default(true),
    replacedByUpload: text("replaced_by_upload"),
    /** written by a confirmation still in progress (current = false until its last step makes it current) */
    staged: integer("staged", { mode: "boolean" }).notNull().default(false),
    createdAt: createdAt(),
  },
  (t) => [
    index("price_points_firm_instrument_date").on(t.firmId, t.instrumentId, t.date),
    index("price_points_staged").on(t.uploadId).where(sql`${t.staged} = 1`),
  ],
);

/**
 * What the worker read from an upload's file, in numbered parts of up to UPLOAD_PART_SIZE items: the rows that
 * passed ("rows") and the problems ("problems"). The preview pages through them and the confirmation stores them,
 * so neither reads the file again. Replaced when the file is read again; deleted when the upload is decided.
 */
export const uploadParts = sqliteTable(
  "upload_parts",
  {
    id: id(),
    ...firmReference(),
    uploadId: text("upload_id")
      .notNull()
      .references(() => uploads.id),
    /** rows | problems */
    part: text("part").notNull(),
    seq: integer("seq").notNull(),
    items: text("items", { mode: "json" }).$type<unknown[]>().notNull(),
  },
  (t) => [uniqueIndex("upload_parts_upload_part_seq").on(t.uploadId, t.part, t.seq)],
);

/** One month-end position row from a confirmed positions upload. */
export const positions = sqliteTable(
  "positions",
  {
    id: id(),
    ...firmReference(),
    periodId: text("period_id")
      .notNull()
      .references(() => reportingPeriods.id),
    uploadId: text("upload_id")
      .notNull()
      .references(() => uploads.id),
    rowNumber: integer("row_number").notNull(),
    asOf: text("as_of").notNull(),
    book: text("book").notNull(),
    instrument: text("instrument_code").notNull(),
    instrumentName: text("instrument_name").notNull(),
    assetClass: text("asset_class").notNull(),
    currency: text("currency").notNull(),
    quantity: real("quantity").notNull(),
    price: real("price").notNull(),
    marketValue: real("market_value").notNull(),
    deltaExposure: real("delta_exposure"),
    /** optional attributes the standardised building blocks read (null where the file did not give them) */
    instrumentType: text("instrument_type"),
    issuerCategory: text("issuer_category"),
    maturityDate: text("maturity_date"),
    residualMaturityYears: real("residual_maturity_years"),
    coupon: real("coupon"),
    nextResetDate: text("next_reset_date"),
    modifiedDuration: real("modified_duration"),
    nationalMarket: text("national_market"),
    commodity: text("commodity"),
    underlying: text("underlying"),
    strike: real("strike"),
    /** call or put */
    optionKind: text("option_type"),
    nextResetYears: real("next_reset_years"),
    /** derivatives: signed notional in the reporting currency */
    notional: real("notional"),
    /** bond future or forward: the deliverable bond's residual maturity in years */
    underlyingMaturityYears: real("underlying_maturity_years"),
    /** options: the underlying's price per unit in the reporting currency */
    underlyingPrice: real("underlying_price"),
  },
  (t) => [index("positions_firm_upload").on(t.firmId, t.uploadId)],
);
