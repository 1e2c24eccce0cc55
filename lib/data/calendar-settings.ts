/** The firm's filing calendar settings: reminder schedule, automatic opening, holidays, and each person's reminder choice. */
import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { calendarSettings, holidays, memberships } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import { enqueueQualityRefresh, periodsTakingPrices } from "@/lib/data/quality-jobs";
import { parseHolidayCsv, type HolidayCsvInput, type HolidayListInput, type ReminderSettingsInput } from "@/lib/calendar/validation";

export interface ReminderSettings {
  reminderOffsets: number[];
  remindOverdue: boolean;
  autoOpenPeriods: boolean;
}

/** The firm's reminder schedule and whether periods open by themselves. */
export async function getReminderSettings(actor: Actor): Promise<ReminderSettings> {
  const [row] = await getDb().select().from(calendarSettings).where(eq(calendarSettings.firmId, actor.firmId));
  return {
    reminderOffsets: [...(row?.reminderOffsets ?? [10, 5, 2, 1])].sort((a, b) => b - a),
    remindOverdue: row?.remindOverdue ?? true,
    autoOpenPeriods: row?.autoOpenPeriods ?? true,
  };
}

/** Change the reminder schedule; the change and its audit record share one transaction. */
export async function updateReminderSettings(actor: Actor, input: ReminderSettingsInput): Promise<ReminderSettings> {
  const before = await getReminderSettings(actor);
  const offsets = [...input.reminderOffsets].sort((a, b) => b - a);
  await getDb().transaction(async (tx) => {
    const values = { reminderOffsets: offsets, remindOverdue: input.remindOverdue, autoOpenPeriods: input.autoOpenPeriods, updatedAt: new Date().toISOString() };
    const [existing] = await tx.select({ id: calendarSettings.id }).from(calendarSettings).where(eq(calendarSettings.firmId, actor.firmId));
    if (existing) await tx.update(calendarSettings).set(values).where(eq(calendarSettings.firmId, actor.firmId));
    else await tx.insert(calendarSettings).values({ firmId: actor.firmId, ...values });
    await recordAudit(tx, actor, {
      action: "calendar.reminders.update",
      entityType: "firm",
      entityId: actor.firmId,
      summary: `Set reminders at ${offsets.length ? offsets.join(", ") : "no"} business days before the deadline${input.remindOverdue ? ", and when overdue" : ""}; periods open ${input.autoOpenPeriods ? "automatically" : "by hand only"}`,
      detail: { before, after: { ...input, reminderOffsets: offsets } },
    });
  });
  return getReminderSettings(actor);
}

export interface Holiday {
  date: string;
  name: string;
}

/** The firm's holidays, in date order. */
export async function listHolidays(actor: Actor): Promise<Holiday[]> {
  return getDb()
    .select({ date: holidays.date, name: holidays.name })
    .from(holidays)
    .where(eq(holidays.firmId, actor.firmId))
    .orderBy(asc(holidays.date));
}

async function writeHolidays(actor: Actor, list: Holiday[], audit: { action: string; summary: string; detail: Record<string, unknown> }): Promise<Holiday[]> {
  await getDb().transaction(async (tx) => {
    await tx.delete(holidays).where(eq(holidays.firmId, actor.firmId));
    if (list.length) await tx.insert(holidays).values(list.map((h) => ({ firmId: actor.firmId, date: h.date, name: h.name })));
    await recordAudit(tx, actor, { ...audit, entityType: "firm", entityId: actor.firmId });
    // the business-day checks of every open period's data-quality report read the holidays: the worker computes them again
    await enqueueQualityRefresh(tx, actor.firmId, await periodsTakingPrices(tx, actor.firmId));
  });
  return listHolidays(actor);
}

function diff(before: Holiday[], after: Holiday[]) {
  const was = new Map(before.map((h) => [h.date, h.name]));
  const now = new Map(after.map((h) => [h.date, h.name]));
  return {
    added: after.filter((h) => !was.has(h.date)).map((h) => h.date),
    removed: before.filter((h) => !now.has(h.date)).map((h) => h.date),
    renamed: after.filter((h) => was.has(h.date) && was.get(h.date) !== h.name).map((h) => h.date),
  };
}

/** Replace the firm's holiday list with the one edited in settings. */
export async function replaceHolidays(actor: Actor, input: HolidayListInput): Promise<Holiday[]> {
  const before = await listHolidays(actor);
  const after = [...input.holidays].sort((a, b) => a.date.localeCompare(b.date));
  const change = diff(before, after);
  return writeHolidays(actor, after, {
    action: "calendar.holidays.update",
    summary: `Edited the holiday list: ${change.added.length} added, ${change.removed.length} removed, ${change.renamed.length} renamed`,
    detail: change,
  });
}

/**
 * Take a holiday CSV: every row checked first; any problem refuses the whole file (422 naming each row) and stores
 * nothing. "add" merges the file into the list (a listed date takes the file's name); "replace" makes it the list.
 */
export async function importHolidayCsv(actor: Actor, input: HolidayCsvInput): Promise<{ holidays: Holiday[]; imported: number }> {
  const { holidays: rows, errors } = parseHolidayCsv(input.csv);
  if (errors.length) {
    const fields = Object.fromEntries(errors.map((e) => [`row ${e.row}`, e.message.replace(/^Row \d+: /, "")]));
    const shown = errors.slice(0, 3).map((e) => e.message).join(" ");
    throw new AppError(
      "unprocessable:csv",
      `The file has ${errors.length} problem${errors.length === 1 ? "" : "s"}; no holidays were stored. ${shown}${errors.length > 3 ? ` …and ${errors.length - 3} more.` : ""}`,
      fields,
    );
  }
  const before = await listHolidays(actor);
  const merged = new Map(input.mode === "replace" ? [] : before.map((h) => [h.date, h.name]));
  for (const h of rows) merged.set(h.date, h.name);
  const after = [...merged].map(([date, name]) => ({ date, name })).sort((a, b) => a.date.localeCompare(b.date));
  if (after.length > 1000) throw new AppError("unprocessable:csv", "The holiday list would hold more than 1,000 days; nothing was stored.", { csv: "At most 1,000 holidays." });
  const change = diff(before, after);
  const list = await writeHolidays(actor, after, {
    action: "calendar.holidays.import",
    summary: `Imported ${rows.length} holiday${rows.length === 1 ? "" : "s"} from a file (${input.mode}): ${change.added.length} added, ${change.removed.length} removed, ${change.renamed.length} renamed`,
    detail: { mode: input.mode, ...change },
  });
  return { holidays: list, imported: rows.length };
}

/** Whether the actor receives reminder e-mails at this firm (the overdue notice always goes out). */
export async function getMyReminderPreference(actor: Actor): Promise<{ remindersEnabled: boolean }> {
  const [row] = await getDb()
    .select({ remindersEnabled: memberships.remindersEnabled })
    .from(memberships)
    .where(and(eq(memberships.firmId, actor.firmId), eq(memberships.userId, actor.userId)));
  if (!row) throw new AppError("not_found:membership");
  return row;
}

/** Turn the actor's own reminders on or off. */
export async function setMyReminderPreference(actor: Actor, remindersEnabled: boolean): Promise<{ remindersEnabled: boolean }> {
  await getDb().transaction(async (tx) => {
    const updated = await tx
      .update(memberships)
      .set({ remindersEnabled })
      .where(and(eq(memberships.firmId, actor.firmId), eq(memberships.userId, actor.userId)))
      .returning({ id: memberships.id });
    if (!updated.length) throw new AppError("not_found:membership");
    await recordAudit(tx, actor, {
      action: "calendar.reminders.preference",
      entityType: "membership",
      entityId: updated[0].id,
      summary: remindersEnabled ? `${actor.name} turned reminder e-mails on` : `${actor.name} turned reminder e-mails off (overdue notices still arrive)`,
    });
  });
  return { remindersEnabled };
}
