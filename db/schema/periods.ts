import { sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { id, createdAt, firmColumns } from "../columns";

/** A month-end reporting period and its deadline. */
export const reportingPeriods = sqliteTable(
  "reporting_periods",
  {
    id: id(),
    ...firmColumns,
    /** last calendar day of the month, yyyy-mm-dd */
    periodEnd: text("period_end").notNull(),
    deadline: text("deadline").notNull(),
    /** open → in_review → signed → filed (later issues add steps) */
    state: text("state").notNull().default("open"),
    openedBy: text("opened_by"),
    filedAt: text("filed_at"),
    filingReference: text("filing_reference"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("reporting_periods_firm_end").on(t.firmId, t.periodEnd)],
);
export type ReportingPeriod = typeof reportingPeriods.$inferSelect;
