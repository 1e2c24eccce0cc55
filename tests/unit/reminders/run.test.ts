import { describe, expect, it } from "vitest";
import { eq, like } from "drizzle-orm";
import { actorFor } from "../helpers/db";
import { reminderWorld } from "../helpers/reminder-world";
import { auditEvents, reminderLog, reportingPeriods } from "@/db/schema";
import { DEMO_USERS, SECOND_FIRM_USERS } from "@/db/seed";
import { startMailListener } from "@/lib/mail/listener";
import { runReminders } from "@/lib/data/reminders";
import { setMyReminderPreference } from "@/lib/data/calendar-settings";
import { delayRecorder, logRows, mailerFor, RUN } from "./helpers";

const world = reminderWorld();
const [, tomas, , , , nia] = DEMO_USERS;
const june = SECOND_FIRM_USERS[1];

const recipients = () => world.listener.messages.flatMap((m) => m.to).sort();

describe("the scheduler", () => {
  it("five business days before the deadline, e-mails whoever owns the open step; a second run sends nothing new", async () => {
    const mailer = mailerFor(world.listener);
    const first = await runReminders({ ...RUN, mailer });
    // The seeded periods wait on month-end positions: compliance officers at both firms.
    expect(first).toMatchObject({ asOf: "2026-12-14", mail: "ok", opened: [], due: 3, recorded: 3, sent: 3, failed: 0, problems: [] });
    expect(recipients()).toEqual([june.email, nia.email, tomas.email].sort());

    const second = await runReminders({ ...RUN, mailer });
    expect(second).toMatchObject({ due: 3, recorded: 0, sent: 0, failed: 0 });
    expect(world.listener.messages).toHaveLength(3);
    // A later run the same day, or a day later, still sends nothing new.
    expect(await runReminders({ ...RUN, asOf: "2026-12-15", mailer })).toMatchObject({ recorded: 0, sent: 0 });
    mailer.close();

    const rows = await logRows();
    expect(rows.map((r) => [r.email, r.step, r.offsetDays, r.status, r.attempts]).sort()).toEqual(
      [
        [june.email, "positions", 5, "sent", 1],
        [nia.email, "positions", 5, "sent", 1],
        [tomas.email, "positions", 5, "sent", 1],
      ].sort(),
    );
    // Every reminder sent is in the audit trail, in its own firm.
    const sent = await world.db.select().from(auditEvents).where(eq(auditEvents.action, "reminder.sent"));
    expect(sent).toHaveLength(3);
    const admin = await actorFor(DEMO_USERS[0].email);
    expect(sent.filter((e) => e.firmId === admin.firmId).map((e) => e.summary).sort()).toEqual([
      `Sent a reminder (5 business days left) for “Upload and confirm month-end positions” to Nia Dorrance <${nia.email}>`,
      `Sent a reminder (5 business days left) for “Upload and confirm month-end positions” to Tomas Reyne <${tomas.email}>`,
    ]);
    expect(sent.every((e) => e.actorId === null && e.actorName === "Reminder scheduler")).toBe(true);
  });

  it("writes the firm, period, deadline, days left, the step and a link, and no figures", async () => {
    const mailer = mailerFor(world.listener);
    await runReminders({ ...RUN, mailer });
    mailer.close();
    const admin = await actorFor(DEMO_USERS[0].email);
    const [period] = await world.db.select().from(reportingPeriods).where(eq(reportingPeriods.firmId, admin.firmId));
    const message = world.listener.messages.find((m) => m.to.includes(tomas.email))!;
    expect(message.subject).toBe("5 business days left: Upload and confirm month-end positions for November 2026 (Northmoor Brokerage Ltd)");
    expect(message.from).toContain("reminders@ballast.example");
    expect(message.firmId).toBe(admin.firmId);
    const text = message.text;
    expect(text).toContain("Hello Tomas Reyne,");
    expect(text).toContain("Northmoor Brokerage Ltd has a filing deadline coming up, and the next step is yours.");
    expect(text).toContain("Reporting period:  November 2026 (ended 30 November 2026)");
    expect(text).toContain("Deadline:          Monday 21 December 2026 (5 business days left)");
    expect(text).toContain("Step outstanding:  Upload and confirm month-end positions");
    expect(text).toContain("Owned by:          Compliance officer");
    expect(text).toContain(`Open the period: http://ballast.test/periods/${period.id}`);
    expect(text).toContain("turn reminders off for yourself on the Calendar page: http://ballast.test/calendar");
    expect(message.html).toContain(`href="http://ballast.test/periods/${period.id}"`);
    expect(message.html).toContain("Monday 21 December 2026 <strong>(5 business days left)</strong>");
    // No figures: no amounts, currencies or risk measures, in either part.
    for (const part of [text, message.html, message.subject]) {
      expect(part).not.toMatch(/\b(EUR|GBP|VaR|capital|shortfall)\b/i);
      expect(part).not.toMatch(/\d[\d,]*\.\d/);
    }
    // The June reminder belongs to the other firm and carries its firm id.
    expect(world.listener.messages.find((m) => m.to.includes(june.email))!.subject).toContain("(Pellam Capital Partners)");
  });

  it("an SMTP listener that refuses, then accepts: the send is retried with backoff and each person gets one e-mail", async () => {
    const picky = await startMailListener({ smtpPort: 0, refuseFirst: 1 });
    const mailer = mailerFor(picky);
    const { delay, waits } = delayRecorder();
    const result = await runReminders({ ...RUN, mailer, delay });
    mailer.close();
    expect(picky.refused).toBe(1);
    expect(result).toMatchObject({ sent: 3, failed: 0 });
    expect(waits).toEqual([1000]);
    expect(picky.messages.flatMap((m) => m.to).sort()).toEqual([june.email, nia.email, tomas.email].sort());
    const rows = await logRows();
    expect(rows.map((r) => r.attempts).sort()).toEqual([1, 1, 2]);
    expect(rows.every((r) => r.status === "sent" && r.lastError === null)).toBe(true);
    await picky.close();
  });

  it("people who turned reminders off get only the overdue notice", async () => {
    const officer = await actorFor(tomas.email);
    await setMyReminderPreference(officer, false);
    const mailer = mailerFor(world.listener);
    await runReminders({ ...RUN, mailer });
    expect(recipients()).toEqual([june.email, nia.email].sort());
    world.listener.messages.length = 0;
    // Tuesday 22 Dec is the first day past the deadline.
    const overdue = await runReminders({ ...RUN, asOf: "2026-12-22", mailer });
    expect(overdue.sent).toBe(3);
    expect(recipients()).toEqual([june.email, nia.email, tomas.email].sort());
    const notice = world.listener.messages.find((m) => m.to.includes(tomas.email))!;
    expect(notice.subject).toMatch(/^Overdue by 1 business day: /);
    expect(notice.text).toContain("The filing deadline for Northmoor Brokerage Ltd has passed");
    expect(notice.text).toContain("Overdue notices go to everyone who owns the step");
    // The overdue notice goes once, however many days it stays overdue.
    expect(await runReminders({ ...RUN, asOf: "2026-12-23", mailer })).toMatchObject({ recorded: 0, sent: 0 });
    mailer.close();
    await setMyReminderPreference(officer, true);
  });

  it("a reminder still waiting when a later one is due is not sent; the later one is", async () => {
    const admin = await actorFor(DEMO_USERS[0].email);
    const tomasActor = await actorFor(tomas.email);
    const [period] = await world.db.select().from(reportingPeriods).where(eq(reportingPeriods.firmId, admin.firmId));
    await world.db.insert(reminderLog).values({ firmId: admin.firmId, periodId: period.id, step: "positions", offsetDays: 10, userId: tomasActor.userId, email: tomas.email, status: "retry", attempts: 3, lastError: "earlier failure" });
    const mailer = mailerFor(world.listener);
    const result = await runReminders({ ...RUN, mailer });
    mailer.close();
    expect(result).toMatchObject({ sent: 3, skipped: 1 });
    const stale = (await logRows()).find((r) => r.offsetDays === 10)!;
    expect(stale).toMatchObject({ status: "skipped", lastError: "A later reminder replaced this one." });
    expect(world.listener.messages.filter((m) => m.to.includes(tomas.email))).toHaveLength(1);
  });

  it("without a configured mail server it says so, and records nothing", async () => {
    const result = await runReminders({ ...RUN, mailer: null });
    expect(result.mail).toBe("not_configured");
    expect(result.problems[0]).toContain("SMTP_HOST");
    expect(await logRows()).toEqual([]);
    expect(await world.db.select().from(auditEvents).where(like(auditEvents.action, "reminder.failed"))).toEqual([]);
  });
});
