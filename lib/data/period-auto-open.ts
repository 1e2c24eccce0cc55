/**
 * Opening reporting periods automatically: on or after each month end, the period ending that day is opened for
 * every firm whose calendar says so, with its deadline under the firm's rule. Idempotent: an open period is left
 * alone (the unique index on firm × period end settles a race). Called by the reminder scheduler.
 */
import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { calendarSettings, firms, reportingPeriods } from "@/db/schema";
import { getCalendar } from "@/lib/data/periods";
import { recordAudit, scheduledActor } from "@/lib/audit/record";
import { deadlineFor, latestMonthEnd } from "@/lib/calendar/deadline";

export const SCHEDULER_NAME = "Calendar (automatic)";

/** Open the period ending at the latest month end on or before `asOf`, for each firm that opens periods automatically. */
export async function openDuePeriods(asOf: string): Promise<{ firmId: string; periodEnd: string; deadline: string }[]> {
  const db = getDb();
  const periodEnd = latestMonthEnd(asOf);
  const rows = await db
    .select({ firmId: firms.id, auto: calendarSettings.autoOpenPeriods })
    .from(firms)
    .leftJoin(calendarSettings, eq(calendarSettings.firmId, firms.id));
  const opened: { firmId: string; periodEnd: string; deadline: string }[] = [];
  for (const row of rows) {
    if (row.auto === false) continue;
    const [existing] = await db
      .select({ id: reportingPeriods.id })
      .from(reportingPeriods)
      .where(and(eq(reportingPeriods.firmId, row.firmId), eq(reportingPeriods.periodEnd, periodEnd)));
    if (existing) continue;
    const { rule, holidays } = await getCalendar(row.firmId);
    const deadline = deadlineFor(periodEnd, rule, holidays);
    const inserted = await db.transaction(async (tx) => {
      const [period] = await tx
        .insert(reportingPeriods)
        .values({ firmId: row.firmId, periodEnd, deadline })
        .onConflictDoNothing()
        .returning({ id: reportingPeriods.id });
      if (!period) return false;
      await recordAudit(tx, scheduledActor(row.firmId, SCHEDULER_NAME), {
        action: "period.open",
        entityType: "reporting_period",
        entityId: period.id,
        summary: `Opened the period ending ${periodEnd} at month end (deadline ${deadline})`,
        detail: { periodEnd, deadline, rule, automatic: true },
      });
      return true;
    });
    if (inserted) opened.push({ firmId: row.firmId, periodEnd, deadline });
  }
  return opened;
}
