/**
 * The reminder scheduler: opens due periods, works out the reminders each firm's schedule calls for, and sends
 * them. Exactly-once bookkeeping, in this order:
 *   1. a reminder_log row is inserted for period × step × offset × person (the unique index turns a second run's
 *      insert into a no-op), status "pending";
 *   2. the row is claimed ("pending"/"retry" → "sending") by a conditional update: only one run can win it;
 *   3. the e-mail goes out, retried with backoff inside the run;
 *   4. "sent" and the audit event are written in one transaction; a failure becomes "retry" (with the next
 *      attempt time and the error) and, after MAX_TRIES, "failed".
 * A crash between 2 and 4 leaves the row "sending": it is never sent again automatically, and the admin sees it
 * as unconfirmed. So a restart sends no duplicates.
 */
import "server-only";
import { and, eq, inArray, isNull, lte, or } from "drizzle-orm";
import { getDb } from "@/db/client";
import { calendarSettings, firms, memberships, reminderLog, users } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { recordAudit, scheduledActor } from "@/lib/audit/record";
import { parseRoles } from "@/lib/auth/roles";
import { openDuePeriods } from "@/lib/data/period-auto-open";
import { businessDaysBetween } from "@/lib/calendar/deadline";
import { getCalendar, listPeriods, type PeriodSummary } from "@/lib/data/periods";
import { now as clockNow, today } from "@/lib/clock";
import { describeMailError, getMailer, type Mailer } from "@/lib/mail/transport";
import { appUrl as defaultAppUrl, reminderMessage } from "@/lib/reminders/message";
import { dueOffset, planReminders, timingText, OVERDUE_OFFSET, type PlanPerson, type ReminderSchedule } from "@/lib/reminders/plan";
import { withRetry, type Delay } from "@/lib/reminders/retry";

export const SCHEDULER_ACTOR_NAME = "Reminder scheduler";
/** SMTP tries, over all runs, before a reminder is given up as failed. */
export const MAX_TRIES = 9;
/** Minutes to wait before the next run retries a failed reminder (doubling with each further failure). */
export const RETRY_AFTER_MINUTES = 15;

export interface RunOptions {
  /** the day to act as "today" (yyyy-mm-dd); the pinned clock's day by default */
  asOf?: string;
  /** the time of this run, for retry scheduling; the clock's time by default */
  now?: Date;
  /** the mailer; the configured SMTP transport by default, null for none */
  mailer?: Mailer | null;
  /** how to wait between tries (tests pass a recorder that does not sleep) */
  delay?: Delay;
  /** SMTP tries per reminder within one run */
  sendAttempts?: number;
  baseDelayMs?: number;
  appUrl?: string;
}

export interface RunResult {
  asOf: string;
  mail: "ok" | "not_configured";
  opened: { firmId: string; periodEnd: string; deadline: string }[];
  /** reminders the schedules call for today (including ones already sent) */
  due: number;
  /** new reminder_log rows written by this run */
  recorded: number;
  sent: number;
  /** reminders that could not be sent this run (they wait for a retry, or failed for good) */
  failed: number;
  /** reminders no longer needed when their turn came (the step was done, or a later reminder replaced them) */
  skipped: number;
  problems: string[];
}

const CONNECTION_CODES = new Set(["ECONNREFUSED", "ETIMEDOUT", "ENOTFOUND", "EDNS", "ESOCKET", "ECONNECTION", "ECONNRESET", "EHOSTUNREACH"]);
const isConnectionError = (error: unknown) => CONNECTION_CODES.has(String((error as { code?: string })?.code));

/** The scheduler acts for each firm in turn; this actor only scopes the firm's queries (it is never a person). */
function firmScope(firm: { id: string; name: string; reportingCurrency: string }): Actor {
  return { userId: "", name: SCHEDULER_ACTOR_NAME, email: "", firmId: firm.id, firmName: firm.name, reportingCurrency: firm.reportingCurrency, roles: [], firms: [] };
}

async function firmPeople(firmId: string): Promise<PlanPerson[]> {
  const rows = await getDb()
    .select({ userId: users.id, name: users.name, email: users.email, roles: memberships.roles, remindersEnabled: memberships.remindersEnabled })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.firmId, firmId), eq(memberships.active, true), eq(users.active, true)));
  return rows.map((r) => ({ ...r, roles: parseRoles(r.roles) }));
}

async function firmSchedule(firmId: string): Promise<ReminderSchedule> {
  const [row] = await getDb().select().from(calendarSettings).where(eq(calendarSettings.firmId, firmId));
  return { reminderOffsets: row?.reminderOffsets ?? [10, 5, 2, 1], remindOverdue: row?.remindOverdue ?? true };
}

/** Run the scheduler once, for every firm. Never throws for a mail problem: it reports it. */
export async function runReminders(options: RunOptions = {}): Promise<RunResult> {
  const db = getDb();
  const asOf = options.asOf ?? today();
  const runAt = options.now ?? clockNow();
  const result: RunResult = { asOf, mail: "ok", opened: [], due: 0, recorded: 0, sent: 0, failed: 0, skipped: 0, problems: [] };
  result.opened = await openDuePeriods(asOf);

  const mailer = options.mailer === undefined ? getMailer() : options.mailer;
  if (!mailer) {
    result.mail = "not_configured";
    result.problems.push("No mail server is configured (set SMTP_HOST); no reminders were recorded or sent.");
    return result;
  }
  const url = options.appUrl ?? defaultAppUrl();
  let serverDown = false;

  // 1. Record what is due, for every firm, before anything is sent (a second run's inserts do nothing).
  const contexts = [];
  for (const firm of await db.select().from(firms)) {
    const scope = firmScope(firm);
    const [schedule, { holidays }, people, periods] = await Promise.all([firmSchedule(firm.id), getCalendar(firm.id), firmPeople(firm.id), listPeriods(scope)]);
    const open = new Map<string, PeriodSummary>(periods.filter((p) => p.nextStep).map((p) => [p.id, p]));
    for (const period of open.values()) {
      const planned = planReminders({ period, asOf, holidays, schedule, people });
      result.due += planned.length;
      for (const r of planned) {
        const inserted = await db
          .insert(reminderLog)
          .values({ firmId: firm.id, periodId: r.periodId, step: r.step, offsetDays: r.offsetDays, userId: r.userId, email: r.email, status: "pending" })
          .onConflictDoNothing()
          .returning({ id: reminderLog.id });
        result.recorded += inserted.length;
      }
    }
    contexts.push({ firm, schedule, holidays, people, open });
  }

  for (const { firm, schedule, holidays, people, open } of contexts) {
    if (serverDown) break;
    // 2–4. Send what waits: new rows, and earlier failures whose retry time has come.
    const waiting = await db
      .select()
      .from(reminderLog)
      .where(
        and(
          eq(reminderLog.firmId, firm.id),
          inArray(reminderLog.status, ["pending", "retry"]),
          or(isNull(reminderLog.nextAttemptAt), lte(reminderLog.nextAttemptAt, runAt.toISOString())),
        ),
      );
    for (const row of waiting) {
      const period = open.get(row.periodId);
      const stillDue = period?.nextStep?.key === row.step && dueOffset(asOf, period.deadline, holidays, schedule) === row.offsetDays;
      if (!period || !stillDue) {
        const updated = await db
          .update(reminderLog)
          .set({ status: "skipped", lastError: period?.nextStep?.key === row.step ? "A later reminder replaced this one." : "The step was done before the reminder went out." })
          .where(and(eq(reminderLog.id, row.id), inArray(reminderLog.status, ["pending", "retry"])))
          .returning({ id: reminderLog.id });
        result.skipped += updated.length;
        continue;
      }
      const claimed = await db
        .update(reminderLog)
        .set({ status: "sending" })
        .where(and(eq(reminderLog.id, row.id), inArray(reminderLog.status, ["pending", "retry"])))
        .returning({ id: reminderLog.id });
      if (claimed.length === 0) continue; // another run has it

      const person = people.find((p) => p.userId === row.userId);
      const overdue = row.offsetDays === OVERDUE_OFFSET;
      const left = businessDaysBetween(asOf, period.deadline, holidays);
      const message = reminderMessage({
        firmId: firm.id,
        firmName: firm.name,
        recipientName: person?.name ?? row.email,
        email: row.email,
        periodId: period.id,
        periodEnd: period.periodEnd,
        deadline: period.deadline,
        stepLabel: period.nextStep!.label,
        owner: period.nextStep!.owner,
        businessDaysLeft: left,
        overdue,
        appUrl: url,
        logId: row.id,
      });
      let tries = 0;
      try {
        const info = await withRetry(
          () => {
            tries++;
            return mailer.send(message);
          },
          { attempts: options.sendAttempts ?? 3, baseDelayMs: options.baseDelayMs ?? 1000, delay: options.delay },
        );
        const timing = timingText(left, overdue);
        await db.transaction(async (tx) => {
          await tx
            .update(reminderLog)
            .set({ status: "sent", sentAt: runAt.toISOString(), attempts: row.attempts + tries, lastError: null, nextAttemptAt: null })
            .where(eq(reminderLog.id, row.id));
          await recordAudit(tx, scheduledActor(firm.id, SCHEDULER_ACTOR_NAME), {
            action: "reminder.sent",
            entityType: "reporting_period",
            entityId: period.id,
            summary: `Sent a reminder (${timing}) for “${period.nextStep!.label}” to ${person?.name ?? row.email} <${row.email}>`,
            detail: { reminderId: row.id, step: row.step, offsetDays: row.offsetDays, email: row.email, asOf, messageId: info.messageId },
          });
        });
        result.sent++;
      } catch (error) {
        const attempts = row.attempts + tries;
        const reason = describeMailError(error, mailer.describe);
        const givingUp = attempts >= MAX_TRIES;
        // 15 minutes after the first failed run, then 30, 60…
        const failedRuns = Math.ceil(attempts / (options.sendAttempts ?? 3));
        const retryAt = new Date(runAt.getTime() + RETRY_AFTER_MINUTES * 60_000 * 2 ** Math.min(6, failedRuns - 1));
        await db.transaction(async (tx) => {
          await tx
            .update(reminderLog)
            .set({ status: givingUp ? "failed" : "retry", attempts, lastError: reason, nextAttemptAt: givingUp ? null : retryAt.toISOString() })
            .where(eq(reminderLog.id, row.id));
          if (givingUp) {
            await recordAudit(tx, scheduledActor(firm.id, SCHEDULER_ACTOR_NAME), {
              action: "reminder.failed",
              entityType: "reporting_period",
              entityId: period.id,
              summary: `Gave up on a reminder for “${period.nextStep!.label}” to ${row.email} after ${attempts} tries: ${reason}`,
              detail: { reminderId: row.id, step: row.step, offsetDays: row.offsetDays, email: row.email, error: reason },
            });
          }
        });
        result.failed++;
        if (!result.problems.includes(reason)) result.problems.push(reason);
        if (isConnectionError(error)) {
          serverDown = true;
          result.problems.push("Stopped this run: the mail server cannot be reached. The remaining reminders wait for the next run.");
          break;
        }
      }
    }
  }
  return result;
}
