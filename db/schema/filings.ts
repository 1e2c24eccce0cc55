import { sql } from "drizzle-orm";
import { sqliteTable, text, integer, index, uniqueIndex } from "drizzle-orm/sqlite-core";
import { id, createdAt } from "../columns";
import { firmReference } from "./firms";
import { reportingPeriods } from "./periods";
import { runs } from "./runs";
import type { FilingViewModel } from "../../reports/view-model";

/** A draft filing assembled from a run. Signed versions are locked; a change is a new version pointing back. */
export const filings = sqliteTable(
  "filings",
  {
    id: id(),
    ...firmReference(),
    periodId: text("period_id")
      .notNull()
      .references(() => reportingPeriods.id),
    runId: text("run_id")
      .notNull()
      .references(() => runs.id),
    version: integer("version").notNull().default(1),
    previousId: text("previous_id"),
    /** draft → in_review → changes_requested → in_review … → signed → filed */
    status: text("status").notNull().default("draft"),
    content: text("content", { mode: "json" }).$type<FilingViewModel>().notNull(),
    coverNote: text("cover_note").notNull().default(""),
    reason: text("reason").notNull().default(""),
    preparedBy: text("prepared_by").notNull(),
    submittedBy: text("submitted_by"),
    filedAt: text("filed_at"),
    filingReference: text("filing_reference"),
    createdAt: createdAt(),
  },
  (t) => [
    index("filings_firm_period").on(t.firmId, t.periodId),
    /** versions of a period's filing are numbered 1, 2, … once each */
    uniqueIndex("filings_firm_period_version").on(t.firmId, t.periodId, t.version),
    /** one current (not superseded) version per period */
    uniqueIndex("filings_one_current_per_period").on(t.firmId, t.periodId).where(sql`status <> 'superseded'`),
  ],
);

/** A review comment on one section of a filing. */
export const reviewComments = sqliteTable(
  "review_comments",
  {
    id: id(),
    ...firmReference(),
    filingId: text("filing_id")
      .notNull()
      .references(() => filings.id),
    section: text("section").notNull(),
    body: text("body").notNull(),
    kind: text("kind").notNull().default("comment"), // comment | changes_requested | reply
    authorId: text("author_id").notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("review_comments_firm_filing").on(t.firmId, t.filingId)],
);

/** A signature over the SHA-256 of a filing's canonical content. */
export const signatures = sqliteTable(
  "signatures",
  {
    id: id(),
    ...firmReference(),
    filingId: text("filing_id")
      .notNull()
      .references(() => filings.id),
    signerId: text("signer_id").notNull(),
    signerName: text("signer_name").notNull(),
    licenceReference: text("licence_reference").notNull(),
    contentHash: text("content_hash").notNull(),
    signedAt: text("signed_at").notNull(),
    /** the statement the signer ticked, word for word */
    attestation: text("attestation").notNull().default(""),
    supersededAt: text("superseded_at"),
    supersededReason: text("superseded_reason"),
    createdAt: createdAt(),
  },
  (t) => [
    index("signatures_firm_filing").on(t.firmId, t.filingId),
    /** one signature in force per filing version */
    uniqueIndex("signatures_one_current_per_filing").on(t.filingId).where(sql`superseded_at is null`),
  ],
);
