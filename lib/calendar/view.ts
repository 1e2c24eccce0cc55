/** The Calendar page and the .ics download: the firm's deadlines, open and coming, with their reminder days. */
import "server-only";
import { format, parseISO } from "date-fns";
import type { Actor } from "@/lib/auth/actor";
import { getCalendar, listPeriods, type PeriodSummary } from "@/lib/data/periods";
import { now, today } from "@/lib/clock";
import { appUrl } from "@/lib/reminders/message";
import { businessDaysBetween, deadlineFor, nextMonthEnds, subtractBusinessDays, type DeadlineRule } from "./deadline";
import { buildIcs } from "./ics";
import { getReminderSettings, type ReminderSettings } from "@/lib/data/calendar-settings";

export interface ComingDeadline {
  periodEnd: string;
  deadline: string;
  businessDaysLeft: number;
  /** opens at its month end (not stored yet) */
  projected: boolean;
}

export interface CalendarView {
  today: string;
  rule: DeadlineRule;
  reminders: ReminderSettings;
  /** periods with a step outstanding, soonest deadline first */
  open: (PeriodSummary & { nextReminder: string | null })[];
  /** the next month ends' deadlines under the current rule */
  coming: ComingDeadline[];
  /** the most recent periods with every step done */
  done: PeriodSummary[];
}

/** The next day (after today) on which a reminder for this deadline goes out, or null. */
export function nextReminderDay(todayDate: string, deadline: string, offsets: readonly number[], holidays: ReadonlySet<string>): string | null {
  const days = offsets.map((o) => subtractBusinessDays(deadline, o, holidays)).filter((d) => d > todayDate).sort();
  return days[0] ?? null;
}

export async function calendarView(actor: Actor, months = 3): Promise<CalendarView> {
  const day = today();
  const [periods, { rule, holidays }, reminders] = await Promise.all([listPeriods(actor), getCalendar(actor.firmId), getReminderSettings(actor)]);
  const stored = new Set(periods.map((p) => p.periodEnd));
  const open = periods
    .filter((p) => p.nextStep)
    .sort((a, b) => a.deadline.localeCompare(b.deadline))
    .map((p) => ({ ...p, nextReminder: nextReminderDay(day, p.deadline, reminders.reminderOffsets, holidays) }));
  const coming = nextMonthEnds(day, months)
    .filter((end) => !stored.has(end))
    .map((periodEnd) => {
      const deadline = deadlineFor(periodEnd, rule, holidays);
      return { periodEnd, deadline, businessDaysLeft: businessDaysBetween(day, deadline, holidays), projected: true };
    });
  return { today: day, rule, reminders, open, coming, done: periods.filter((p) => !p.nextStep).slice(0, 6) };
}

/** The firm's deadlines as an iCalendar file: every stored period, and the next six month ends under the current rule. */
export async function firmDeadlinesIcs(actor: Actor): Promise<string> {
  const periods = await listPeriods(actor);
  const { rule, holidays } = await getCalendar(actor.firmId);
  const stored = new Set(periods.map((p) => p.periodEnd));
  const url = appUrl();
  const events = [
    ...periods.map((p) => ({
      uid: `deadline-${actor.firmId}-${p.periodEnd}@ballast`,
      date: p.deadline,
      summary: `${p.nextStep ? "Filing deadline" : "Filed"}: ${format(parseISO(p.periodEnd), "MMMM yyyy")} (${actor.firmName})`,
      description: p.nextStep
        ? `Reporting period ending ${p.periodEnd}. Next step: ${p.nextStep.label}.`
        : `Reporting period ending ${p.periodEnd}. Every step is done${p.filingReference ? `; filing reference ${p.filingReference}` : ""}.`,
      url: `${url}/periods/${p.id}`,
    })),
    ...nextMonthEnds(today(), 6)
      .filter((end) => !stored.has(end))
      .map((periodEnd) => ({
        uid: `deadline-${actor.firmId}-${periodEnd}@ballast`,
        date: deadlineFor(periodEnd, rule, holidays),
        summary: `Filing deadline: ${format(parseISO(periodEnd), "MMMM yyyy")} (${actor.firmName})`,
        description: `Reporting period ending ${periodEnd}; it opens at month end. Deadline under the firm's current rule and holidays.`,
        url: `${url}/calendar`,
      })),
  ].sort((a, b) => a.date.localeCompare(b.date));
  return buildIcs({ name: `${actor.firmName}: filing deadlines`, events, stamp: now() });
}
