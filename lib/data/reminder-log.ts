/** The reminder record as the admin sees it: what went out, what waits, what failed and why. */
import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { reminderLog, reportingPeriods, users } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";

export type ReminderStatus = "pending" | "sending" | "sent" | "retry" | "failed" | "skipped";

export interface ReminderLogEntry {
  id: string;
  periodEnd: string;
  step: string;
  offsetDays: number;
  name: string;
  email: string;
  status: ReminderStatus;
  attempts: number;
  lastError: string | null;
  nextAttemptAt: string | null;
  sentAt: string | null;
  createdAt: string;
}

/** The firm's latest reminders, newest first. */
export async function listReminderLog(actor: Actor, limit = 50): Promise<ReminderLogEntry[]> {
  const rows = await getDb()
    .select({
      id: reminderLog.id,
      periodEnd: reportingPeriods.periodEnd,
      step: reminderLog.step,
      offsetDays: reminderLog.offsetDays,
      name: users.name,
      email: reminderLog.email,
      status: reminderLog.status,
      attempts: reminderLog.attempts,
      lastError: reminderLog.lastError,
      nextAttemptAt: reminderLog.nextAttemptAt,
      sentAt: reminderLog.sentAt,
      createdAt: reminderLog.createdAt,
    })
    .from(reminderLog)
    .innerJoin(reportingPeriods, and(eq(reportingPeriods.id, reminderLog.periodId), eq(reportingPeriods.firmId, actor.firmId)))
    .leftJoin(users, eq(users.id, reminderLog.userId))
    .where(eq(reminderLog.firmId, actor.firmId))
    .orderBy(desc(reminderLog.createdAt))
    .limit(limit);
  return rows.map((r) => ({ ...r, name: r.name ?? r.email, status: r.status as ReminderStatus }));
}
