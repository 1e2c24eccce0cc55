import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { actorFor, freshDatabase, snapshot } from "../helpers/db";
import type { Database } from "@/db/client";
import { auditEvents, reportingPeriods } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { importHolidayCsv, listHolidays, replaceHolidays, getReminderSettings, updateReminderSettings, setMyReminderPreference, getMyReminderPreference } from "@/lib/data/calendar-settings";
import { holidayListSchema, parseHolidayCsv, parseOffsetList, reminderSettingsSchema } from "@/lib/calendar/validation";
import { firmSettingsSchema } from "@/lib/validation/firm";
import { openDuePeriods } from "@/lib/data/period-auto-open";
import { DEMO_USERS, SECOND_FIRM_USERS } from "@/db/seed";

let db: Database;
beforeAll(async () => {
  db = await freshDatabase();
});

describe("holiday CSV", () => {
  it("names every bad row and stores nothing", async () => {
    const admin = await actorFor(DEMO_USERS[0].email);
    const before = await snapshot(db);
    const csv = ["date,name", "2027-01-01,New Year's Day", "2027-02-30,Not a day", "01/05/2027,Wrong format", "2027-04-02,Good Friday", "2027-04-02,Twice", "2027-05-01,May Day,extra"].join("\n");
    const { errors } = parseHolidayCsv(csv);
    expect(errors.map((e) => e.row)).toEqual([3, 4, 6, 7]);
    expect(errors[0].message).toBe('Row 3: "2027-02-30" is not a real calendar date.');
    expect(errors[1].message).toContain('Row 4: "01/05/2027" is not a date written yyyy-mm-dd');
    expect(errors[2].message).toBe("Row 6: 2027-04-02 is already on row 5.");
    expect(errors[3].message).toContain("Row 7: expected two columns");
    const error = await importHolidayCsv(admin, { csv, mode: "add" }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(AppError);
    expect((error as AppError).status).toBe(422);
    expect((error as AppError).message).toMatch(/^The file has 4 problems; no holidays were stored\. Row 3:/);
    expect((error as AppError).fields).toMatchObject({ "row 3": '"2027-02-30" is not a real calendar date.' });
    expect(await snapshot(db)).toEqual(before);
  });

  it("takes a clean file (header optional, names optional) and records it in the audit trail", async () => {
    const admin = await actorFor(DEMO_USERS[0].email);
    const result = await importHolidayCsv(admin, { csv: "\uFEFF2027-04-02,Good Friday\r\n2027-04-05\r\n\r\n2026-12-24,Christmas Eve (renamed)\r\n", mode: "add" });
    expect(result.imported).toBe(3);
    const list = await listHolidays(admin);
    expect(list.map((h) => h.date)).toEqual(["2026-12-24", "2026-12-25", "2026-12-26", "2026-12-31", "2027-01-01", "2027-04-02", "2027-04-05"]);
    expect(list[0].name).toBe("Christmas Eve (renamed)");
    const [event] = await db.select().from(auditEvents).where(eq(auditEvents.action, "calendar.holidays.import"));
    expect(event.summary).toContain("2 added, 0 removed, 1 renamed");
    // The other firm's list is untouched.
    expect(await listHolidays(await actorFor(SECOND_FIRM_USERS[0].email))).toEqual([]);
  });

  it("replace mode makes the file the whole list; an empty file is refused", async () => {
    const admin = await actorFor(DEMO_USERS[0].email);
    await importHolidayCsv(admin, { csv: "date,name\n2027-12-24,Christmas Eve\n", mode: "replace" });
    expect((await listHolidays(admin)).map((h) => h.date)).toEqual(["2027-12-24"]);
    expect(parseHolidayCsv("date,name\n").errors[0].message).toBe("The file lists no holidays.");
  });

  it("the edited list refuses a bad or repeated date by its row", async () => {
    const bad = holidayListSchema.safeParse({ holidays: [{ date: "2027-01-01", name: "" }, { date: "2027-13-01", name: "" }, { date: "2027-01-01", name: "again" }] });
    expect(bad.success).toBe(false);
    const messages = bad.error!.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    expect(messages).toContain('holidays.1.date: "2027-13-01" is not a real calendar date.');
    expect(messages).toContain("holidays.2.date: 2027-01-01 is listed twice (rows 1 and 3).");
    const admin = await actorFor(DEMO_USERS[0].email);
    const saved = await replaceHolidays(admin, { holidays: [{ date: "2027-01-01", name: "New Year's Day" }] });
    expect(saved).toEqual([{ date: "2027-01-01", name: "New Year's Day" }]);
  });
});

describe("reminder schedule and deadline rule", () => {
  it("refuses N outside 1..60, in the schedule and in the deadline rule", () => {
    for (const bad of [[0], [61], [-1], [2.5], [5, 5]]) expect(reminderSettingsSchema.safeParse({ reminderOffsets: bad, remindOverdue: true, autoOpenPeriods: true }).success, JSON.stringify(bad)).toBe(false);
    const issue = reminderSettingsSchema.safeParse({ reminderOffsets: [10, 61], remindOverdue: true, autoOpenPeriods: true }).error!.issues[0];
    expect(issue.path).toEqual(["reminderOffsets", 1]);
    expect(issue.message).toBe("Between 1 and 60.");
    expect(parseOffsetList("10, 5 2,x")).toEqual([10, 5, 2, "x"]);
    const rule = { name: "Northmoor", reportingCurrency: "EUR", regulatorName: "", licenceLabel: "Reg. no.", methodCoApproval: true, deadlineRule: "business-days-after" };
    expect(firmSettingsSchema.safeParse({ ...rule, deadlineValue: 0 }).success).toBe(false);
    expect(firmSettingsSchema.safeParse({ ...rule, deadlineValue: 61 }).error!.issues[0]).toMatchObject({ path: ["deadlineValue"], message: "Between 1 and 60." });
    expect(firmSettingsSchema.safeParse({ ...rule, deadlineValue: 60 }).success).toBe(true);
  });

  it("saves the schedule sorted, with an audit record", async () => {
    const admin = await actorFor(DEMO_USERS[0].email);
    expect(await getReminderSettings(admin)).toEqual({ reminderOffsets: [10, 5, 2, 1], remindOverdue: true, autoOpenPeriods: true });
    const saved = await updateReminderSettings(admin, { reminderOffsets: [3, 15, 1], remindOverdue: false, autoOpenPeriods: true });
    expect(saved.reminderOffsets).toEqual([15, 3, 1]);
    const [event] = await db.select().from(auditEvents).where(eq(auditEvents.action, "calendar.reminders.update"));
    expect(event.summary).toContain("15, 3, 1 business days");
    await updateReminderSettings(admin, { reminderOffsets: [10, 5, 2, 1], remindOverdue: true, autoOpenPeriods: true });
  });

  it("each person turns their own reminders off, in their own firm only", async () => {
    const officer = await actorFor(DEMO_USERS[1].email);
    await setMyReminderPreference(officer, false);
    expect(await getMyReminderPreference(officer)).toEqual({ remindersEnabled: false });
    expect(await getMyReminderPreference(await actorFor(DEMO_USERS[5].email))).toEqual({ remindersEnabled: true });
    await setMyReminderPreference(officer, true);
  });
});

describe("automatic opening at month end", () => {
  it("opens the month's period once per firm, with its deadline, and is idempotent", async () => {
    const countPeriods = async () => (await db.select().from(reportingPeriods)).length;
    expect(await openDuePeriods("2026-12-14")).toEqual([]); // November is already open
    const before = await countPeriods();
    const opened = await openDuePeriods("2026-12-31");
    expect(opened).toHaveLength(2);
    const northmoor = (await actorFor(DEMO_USERS[0].email)).firmId;
    // Holidays now: 2027-01-01 only (set above); 15 business days after Thursday 31 Dec → Friday 22 Jan 2027.
    expect(opened.find((o) => o.firmId === northmoor)).toEqual({ firmId: northmoor, periodEnd: "2026-12-31", deadline: "2027-01-22" });
    expect(await openDuePeriods("2026-12-31")).toEqual([]);
    expect(await openDuePeriods("2027-01-05")).toEqual([]);
    expect(await countPeriods()).toBe(before + 2);
    const events = await db.select().from(auditEvents).where(eq(auditEvents.summary, "Opened the period ending 2026-12-31 at month end (deadline 2027-01-22)"));
    expect(events).toHaveLength(1);
    expect(events[0].actorId).toBeNull();
  });

  it("leaves a firm alone when it opens periods by hand", async () => {
    const admin = await actorFor(DEMO_USERS[0].email);
    await updateReminderSettings(admin, { reminderOffsets: [10, 5, 2, 1], remindOverdue: true, autoOpenPeriods: false });
    const opened = await openDuePeriods("2027-01-31");
    expect(opened.map((o) => o.firmId)).not.toContain(admin.firmId);
    expect(opened).toHaveLength(1);
  });
});
