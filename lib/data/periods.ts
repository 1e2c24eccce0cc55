/** Reporting periods: listing, opening, and what each still needs and from whom. */
import "server-only";
import { firmRow } from "@/lib/data/firm-row";
import { and, desc, eq, inArray } from "drizzle-orm";
import { getDb, type Database, type Tx } from "@/db/client";
import { calendarSettings, holidays, reportingPeriods, uploads, methodStatements, runs, filings, reminderLog } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import type { Role } from "@/lib/auth/roles";
import { businessDaysBetween, deadlineFor, type DeadlineRule } from "@/lib/calendar/deadline";
import { staleSummary, type RunFreshness } from "@/lib/runs/freshness";
import { freshnessForPeriods } from "./run-freshness";
import { today } from "@/lib/clock";
import { earliestPeriodMonth, periodEndOf } from "@/lib/validation/periods";

/** The month-end steps in order, each with the role that owns it. */
export const STEPS = [
  { key: "positions", label: "Upload and confirm month-end positions", owner: "compliance_officer" },
  { key: "method", label: "Approve the method statement", owner: "risk_analyst" },
  { key: "run", label: "Complete a run", owner: "risk_analyst" },
  { key: "filing", label: "Prepare and submit the draft filing", owner: "compliance_officer" },
  { key: "signoff", label: "Review and sign the filing", owner: "compliance_head" },
  { key: "file", label: "File with the regulator and record the reference", owner: "compliance_officer" },
] as const satisfies readonly { key: string; label: string; owner: Role }[];
export type StepKey = (typeof STEPS)[number]["key"];

/** The firm's deadline rule and holiday set. */
export async function getCalendar(firmId: string): Promise<{ rule: DeadlineRule; holidays: Set<string> }> {
  const db = getDb();
  const [settings] = await db.select().from(calendarSettings).where(eq(calendarSettings.firmId, firmId));
  const rows = await db.select({ date: holidays.date }).from(holidays).where(eq(holidays.firmId, firmId));
  const rule: DeadlineRule =
    settings?.deadlineRule === "fixed-day-next-month"
      ? { kind: "fixed-day-next-month", day: settings.deadlineValue }
      : { kind: "business-days-after", days: settings?.deadlineValue ?? 15 };
  return { rule, holidays: new Set(rows.map((r) => r.date)) };
}

type StepStatus = { done: Record<StepKey, boolean>; notes: Partial<Record<StepKey, string>> };

/**
 * Which steps of each period are done, from what is stored; a stale run does not count, and the step says why.
 * A fixed number of queries however many periods there are: each table is read once for all of them.
 */
async function stepStatuses(firmId: string, periods: readonly (typeof reportingPeriods.$inferSelect)[]): Promise<Map<string, StepStatus>> {
  const out = new Map<string, StepStatus>();
  if (periods.length === 0) return out;
  const db = getDb();
  const periodIds = periods.map((p) => p.id);
  const confirmed = await db
    .select({ periodId: uploads.periodId })
    .from(uploads)
    .where(and(eq(uploads.firmId, firmId), inArray(uploads.periodId, periodIds), eq(uploads.kind, "positions"), eq(uploads.status, "confirmed")));
  const approved = await db
    .select({ id: methodStatements.id })
    .from(methodStatements)
    .where(and(eq(methodStatements.firmId, firmId), eq(methodStatements.status, "approved")))
    .limit(1);
  const allCompleted = await db
    .select({ id: runs.id, periodId: runs.periodId, isFilingRun: runs.isFilingRun })
    .from(runs)
    .where(and(eq(runs.firmId, firmId), inArray(runs.periodId, periodIds), eq(runs.status, "completed")));
  const withCompleted = periods.filter((p) => allCompleted.some((r) => r.periodId === p.id));
  const freshnessByPeriod = withCompleted.length ? await freshnessForPeriods(firmId, withCompleted) : new Map<string, Map<string, RunFreshness>>();
  const allFilings = await db
    .select({ periodId: filings.periodId, status: filings.status })
    .from(filings)
    .where(and(eq(filings.firmId, firmId), inArray(filings.periodId, periodIds)));
  for (const period of periods) {
    const completedRuns = allCompleted.filter((r) => r.periodId === period.id);
    const freshness = freshnessByPeriod.get(period.id) ?? new Map<string, RunFreshness>();
    const fresh = completedRuns.filter((r) => !freshness.get(r.id)?.stale);
    const notes: Partial<Record<StepKey, string>> = {};
    if (completedRuns.length > 0 && fresh.length === 0) {
      notes.run = `Every completed run is stale: ${staleSummary(freshness.get(completedRuns[0].id)!)} Start a new run.`;
    }
    const filingRun = completedRuns.find((r) => r.isFilingRun);
    if (filingRun && freshness.get(filingRun.id)?.stale) {
      notes.filing = `The run chosen for the filing is stale (${staleSummary(freshness.get(filingRun.id)!)}): choose a current run before submitting.`;
    }
    const statuses = new Set(allFilings.filter((f) => f.periodId === period.id).map((f) => f.status));
    const periodState = period.state;
    const signed = statuses.has("signed") || statuses.has("filed") || periodState === "signed" || periodState === "filed";
    const done = {
      positions: confirmed.some((u) => u.periodId === period.id),
      method: approved.length > 0,
      run: fresh.length > 0,
      filing: statuses.has("in_review") || signed,
      signoff: signed,
      file: periodState === "filed" || statuses.has("filed"),
    };
    out.set(period.id, { done, notes });
  }
  return out;
}

export interface PeriodSummary {
  id: string;
  periodEnd: string;
  deadline: string;
  state: string;
  businessDaysLeft: number;
  overdue: boolean;
  steps: { key: StepKey; label: string; owner: Role; done: boolean; note?: string }[];
  nextStep: { key: StepKey; label: string; owner: Role } | null;
  filingReference: string | null;
}

function summarise(period: typeof reportingPeriods.$inferSelect, status: StepStatus, holidaySet: Set<string>): PeriodSummary {
  const { done, notes } = status;
  const steps = STEPS.map((s) => ({ ...s, done: done[s.key], ...(notes[s.key] ? { note: notes[s.key] } : {}) }));
  const next = steps.find((s) => !s.done) ?? null;
  const left = businessDaysBetween(today(), period.deadline, holidaySet);
  return {
    id: period.id,
    periodEnd: period.periodEnd,
    deadline: period.deadline,
    state: period.state,
    businessDaysLeft: left,
    overdue: next !== null && today() > period.deadline,
    steps,
    nextStep: next ? { key: next.key, label: next.label, owner: next.owner } : null,
    filingReference: period.filingReference,
  };
}

/** Every period of the firm, newest first, with its progress. */
export async function listPeriods(actor: Actor): Promise<PeriodSummary[]> {
  const rows = await getDb()
    .select()
    .from(reportingPeriods)
    .where(eq(reportingPeriods.firmId, actor.firmId))
    .orderBy(desc(reportingPeriods.periodEnd));
  const { holidays: holidaySet } = await getCalendar(actor.firmId);
  const statuses = await stepStatuses(actor.firmId, rows);
  return rows.map((row) => summarise(row, statuses.get(row.id)!, holidaySet));
}

/** One period of the actor's firm; another firm's period looks absent. */
export async function getPeriod(actor: Actor, periodId: string): Promise<PeriodSummary> {
  const row = await firmRow(reportingPeriods, actor.firmId, periodId, "not_found:period", "No such reporting period.");
  const { holidays: holidaySet } = await getCalendar(actor.firmId);
  const statuses = await stepStatuses(actor.firmId, [row]);
  return summarise(row, statuses.get(row.id)!, holidaySet);
}

/** Whether the actor's firm has this period (a cheap check for pages that answer 404 before they stream). */
export async function periodExists(actor: Actor, periodId: string): Promise<boolean> {
  const [row] = await getDb()
    .select({ id: reportingPeriods.id })
    .from(reportingPeriods)
    .where(and(eq(reportingPeriods.id, periodId), eq(reportingPeriods.firmId, actor.firmId)));
  return Boolean(row);
}

/** Open the reporting period for a month, with its deadline under the firm's rule. */
export async function openPeriod(actor: Actor, month: string): Promise<PeriodSummary> {
  const periodEnd = periodEndOf(month);
  // A period opens once its month has ended (its last day has come), as the calendar opens it: the positions are as
  // of the period end, and a file as of a day still to come cannot be taken.
  if (periodEnd > today()) {
    throw new AppError(
      "unprocessable:period",
      `The period ending ${periodEnd} can be opened from ${periodEnd} on, once its month has ended: its positions are as of that day.`,
      { month: "That month has not ended yet." },
    );
  }
  const earliest = earliestPeriodMonth(today());
  if (month < earliest) {
    throw new AppError("unprocessable:period", `A period can be opened back to ${earliest}, not earlier.`, {
      month: `Choose ${earliest} or later.`,
    });
  }
  const { rule, holidays: holidaySet } = await getCalendar(actor.firmId);
  const deadline = deadlineFor(periodEnd, rule, holidaySet);
  const id = await getDb().transaction(async (tx) => {
    const [existing] = await tx
      .select({ id: reportingPeriods.id })
      .from(reportingPeriods)
      .where(and(eq(reportingPeriods.firmId, actor.firmId), eq(reportingPeriods.periodEnd, periodEnd)));
    if (existing) throw new AppError("conflict:period", `The period ending ${periodEnd} is already open.`, { month: "Already open." });
    const [row] = await tx
      .insert(reportingPeriods)
      .values({ firmId: actor.firmId, periodEnd, deadline, openedBy: actor.userId })
      .returning({ id: reportingPeriods.id });
    await recordAudit(tx, actor, {
      action: "period.open",
      entityType: "reporting_period",
      entityId: row.id,
      summary: `Opened the period ending ${periodEnd} (deadline ${deadline})`,
      detail: { periodEnd, deadline, rule },
    });
    return row.id;
  });
  return getPeriod(actor, id);
}

/**
 * Withdraw a period opened by mistake: allowed only while nothing has entered it (no upload in any state, no run,
 * no filing). The period row and the reminders logged for it go, in one transaction with the audit record.
 */
export async function withdrawPeriod(actor: Actor, periodId: string, reason: string): Promise<{ periodEnd: string }> {
  return getDb().transaction(async (tx) => {
    const [period] = await tx
      .select()
      .from(reportingPeriods)
      .where(and(eq(reportingPeriods.id, periodId), eq(reportingPeriods.firmId, actor.firmId)));
    if (!period) throw new AppError("not_found:period", "No such reporting period.");
    const inside = (
      await Promise.all([
        tx.select({ id: uploads.id }).from(uploads).where(and(eq(uploads.firmId, actor.firmId), eq(uploads.periodId, periodId))).limit(1),
        tx.select({ id: runs.id }).from(runs).where(and(eq(runs.firmId, actor.firmId), eq(runs.periodId, periodId))).limit(1),
        tx.select({ id: filings.id }).from(filings).where(and(eq(filings.firmId, actor.firmId), eq(filings.periodId, periodId))).limit(1),
      ])
    ).map((rows) => rows.length > 0);
    if (period.state !== "open" || inside.some(Boolean)) {
      const what = [inside[0] ? "a file" : null, inside[1] ? "a run" : null, inside[2] ? "a filing" : null].filter(Boolean).join(", ");
      throw new AppError(
        "conflict:period",
        `The period ending ${period.periodEnd} cannot be withdrawn: it already holds ${what || `work (${period.state})`}. Only an empty period opened by mistake can be withdrawn.`,
      );
    }
    const reminders = await tx
      .delete(reminderLog)
      .where(and(eq(reminderLog.firmId, actor.firmId), eq(reminderLog.periodId, periodId)))
      .returning({ id: reminderLog.id });
    await tx.delete(reportingPeriods).where(and(eq(reportingPeriods.id, periodId), eq(reportingPeriods.firmId, actor.firmId)));
    await recordAudit(tx, actor, {
      action: "period.withdraw",
      entityType: "reporting_period",
      entityId: periodId,
      summary: `Withdrew the empty period ending ${period.periodEnd}: ${reason}`,
      detail: { periodEnd: period.periodEnd, deadline: period.deadline, reason, reminderRowsRemoved: reminders.length },
    });
    return { periodEnd: period.periodEnd };
  });
}

/** Period states and filing states in which nothing new may enter the period (a new filing version reopens it). */
const LOCKED_PERIOD_STATES = ["in_review", "signed", "filed"] as const;
const LOCKING_FILING_STATES = ["in_review", "changes_requested", "signed", "filed"] as const;

/**
 * Refuse new data for a period under review, signed or filed, read through `tx` so that a caller's transaction
 * sees the state it writes against (call it inside the confirming transaction). Another firm's period: not found.
 */
export async function assertPeriodTakesData(tx: Tx | Database, firmId: string, periodId: string): Promise<void> {
  const [period] = await tx
    .select({ state: reportingPeriods.state, periodEnd: reportingPeriods.periodEnd })
    .from(reportingPeriods)
    .where(and(eq(reportingPeriods.id, periodId), eq(reportingPeriods.firmId, firmId)));
  if (!period) throw new AppError("not_found:period", "No such reporting period.");
  const [filing] = await tx
    .select({ status: filings.status, version: filings.version })
    .from(filings)
    .where(and(eq(filings.firmId, firmId), eq(filings.periodId, periodId), inArray(filings.status, [...LOCKING_FILING_STATES])))
    .limit(1);
  const locked = (LOCKED_PERIOD_STATES as readonly string[]).includes(period.state) ? period.state : filing?.status;
  if (!locked) return;
  const words: Record<string, string> = { in_review: "under review", changes_requested: "under review", signed: "signed", filed: "filed" };
  throw new AppError(
    "conflict:period",
    `The period ending ${period.periodEnd} is ${words[locked] ?? locked}: its positions can no longer change. To correct them, start a new version of the filing (compliance officer), which reopens the period.`,
  );
}

/** The same check for the actor's firm outside a transaction (the upload route's middleware, before any bytes). */
export async function assertPeriodOpenForData(actor: Actor, periodId: string): Promise<void> {
  await assertPeriodTakesData(getDb(), actor.firmId, periodId);
}
