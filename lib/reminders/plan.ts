/**
 * Who gets which reminder, as a pure function of a period, the day, the firm's schedule and its people. The owner
 * of the period's next outstanding step (STEPS in lib/data/periods.ts) gets it: positions → compliance officers,
 * method and run → risk analysts, the draft filing → compliance officers, sign-off → compliance heads, filing with
 * the regulator → compliance officers. People who turned reminders off get only the overdue one.
 */
import type { Role } from "@/lib/auth/roles";
import { businessDaysBetween } from "@/lib/calendar/deadline";

/** The offset stored for the overdue reminder. */
export const OVERDUE_OFFSET = -1;

export interface ReminderSchedule {
  /** business days before the deadline, each 1..60 */
  reminderOffsets: readonly number[];
  remindOverdue: boolean;
}

export interface PlanPeriod {
  id: string;
  periodEnd: string;
  deadline: string;
  nextStep: { key: string; label: string; owner: Role } | null;
}

export interface PlanPerson {
  userId: string;
  name: string;
  email: string;
  roles: readonly Role[];
  remindersEnabled: boolean;
}

export interface PlannedReminder {
  periodId: string;
  step: string;
  stepLabel: string;
  owner: Role;
  offsetDays: number;
  userId: string;
  name: string;
  email: string;
  businessDaysLeft: number;
  overdue: boolean;
}

/**
 * The reminder due on `asOf`: the smallest scheduled offset that is at least the business days left (so a run that
 * missed a day still sends the latest reminder it missed, once), or the overdue one after the deadline; null when none.
 */
export function dueOffset(asOf: string, deadline: string, holidays: ReadonlySet<string>, schedule: ReminderSchedule): number | null {
  if (asOf > deadline) return schedule.remindOverdue ? OVERDUE_OFFSET : null;
  const left = businessDaysBetween(asOf, deadline, holidays);
  const candidates = schedule.reminderOffsets.filter((o) => o >= left);
  return candidates.length ? Math.min(...candidates) : null;
}

/** The reminders one period calls for on `asOf`, one per person who owns its next step. */
export function planReminders(input: {
  period: PlanPeriod;
  asOf: string;
  holidays: ReadonlySet<string>;
  schedule: ReminderSchedule;
  people: readonly PlanPerson[];
}): PlannedReminder[] {
  const { period, asOf, holidays, schedule, people } = input;
  const step = period.nextStep;
  if (!step) return [];
  const offset = dueOffset(asOf, period.deadline, holidays, schedule);
  if (offset === null) return [];
  const overdue = offset === OVERDUE_OFFSET;
  const left = businessDaysBetween(asOf, period.deadline, holidays);
  return people
    .filter((p) => p.roles.includes(step.owner))
    .filter((p) => overdue || p.remindersEnabled)
    .map((p) => ({
      periodId: period.id,
      step: step.key,
      stepLabel: step.label,
      owner: step.owner,
      offsetDays: offset,
      userId: p.userId,
      name: p.name,
      email: p.email,
      businessDaysLeft: left,
      overdue,
    }));
}

/** "5 business days left", "due today", "overdue by 2 business days". */
export function timingText(businessDaysLeft: number, overdue: boolean): string {
  if (overdue) {
    const n = Math.max(1, Math.abs(businessDaysLeft));
    return `overdue by ${n} business day${n === 1 ? "" : "s"}`;
  }
  if (businessDaysLeft <= 0) return "due today";
  return `${businessDaysLeft} business day${businessDaysLeft === 1 ? "" : "s"} left`;
}
