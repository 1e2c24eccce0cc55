import { test, expect } from "@playwright/test";
import { readFileSync } from "node:fs";
import ICAL from "ical.js";
import { E2E_ENV } from "../../playwright.config";
import { DEMO_USERS, SECOND_FIRM_USERS, signInThroughPage, signedInApi } from "./helpers";
import { CalendarPage, MailPage } from "./pages/calendar";
import { ROLE_LABELS, type Role } from "@/lib/auth/roles";

/**
 * Deadlines and reminders. The server's clock is pinned to 2026-12-01 (BALLAST_CLOCK); the demo period ends
 * 2026-11-30 with its deadline on Monday 21 Dec. To act "five business days before the deadline" the tests call the
 * scheduler with `asOf: "2026-12-14"`, a test-only setting the route accepts only because this server runs with
 * BALLAST_ALLOW_CLOCK=1 (as BALLAST_CLOCK itself needs). Nothing is restarted; e-mail goes to the real local SMTP
 * listener started beside the app (scripts/mail-listener.ts), which the admin's "Mail received" page reads.
 */
const LISTENER = E2E_ENV.MAIL_LISTENER_URL;
const SECRET = E2E_ENV.REMINDERS_SECRET!;
const [ada, tomas, , , , nia] = DEMO_USERS;

async function runScheduler(asOf: string) {
  const api = await signedInApi(null);
  const response = await api.post("/api/cron/reminders", { headers: { authorization: `Bearer ${SECRET}` }, data: { asOf } });
  expect(response.status(), await response.text()).toBe(200);
  const body = await response.json();
  await api.dispose();
  return body;
}

async function received(): Promise<{ to: string[]; subject: string; text: string }[]> {
  return (await (await fetch(`${LISTENER}/messages`)).json()).messages;
}

test.describe.configure({ mode: "serial" });

test("the scheduler route answers 401 without its secret, to everyone", async () => {
  // earlier specs leave their mail (invitations, resets) in the listener: start from an empty one
  await fetch(`${LISTENER}/messages`, { method: "DELETE" });
  const personas = [null, ...DEMO_USERS.map((u) => u.email), SECOND_FIRM_USERS[0].email];
  for (const email of personas) {
    const api = await signedInApi(email);
    const attempts: Record<string, string>[] = [{}, { authorization: "Bearer not-the-secret" }, { authorization: SECRET }];
    for (const headers of attempts) {
      const response = await api.post("/api/cron/reminders", { headers, data: { asOf: "2026-12-14" } });
      expect(response.status(), `${email ?? "signed out"} ${JSON.stringify(headers)}`).toBe(401);
      const body = await response.json();
      expect(body.error.code).toBe("unauthorized:scheduler");
      expect(body.error.message).toContain("authorization: Bearer");
    }
    await api.dispose();
  }
  expect(await received()).toEqual([]);
});

test("five business days before the deadline the scheduler e-mails the step's owners, once", async ({ page }) => {
  await fetch(`${LISTENER}/messages`, { method: "DELETE" });
  // Whoever owns the demo period's next step (positions not yet confirmed → the compliance officers).
  const admin = await signedInApi(ada.email);
  const [period] = (await (await admin.get("/api/periods")).json()).periods;
  await admin.dispose();
  const owner = period.nextStep.owner as string;
  const northmoorOwners = DEMO_USERS.filter((u) => (u.roles as readonly string[]).includes(owner)).map((u) => u.email).sort();
  // Pellam's own period has its own next step (earlier specs move Pellam's periods on)
  const pellamAdmin = await signedInApi(SECOND_FIRM_USERS[0].email);
  const [pellamPeriod] = (await (await pellamAdmin.get("/api/periods")).json()).periods;
  await pellamAdmin.dispose();
  const pellamOwner = pellamPeriod.nextStep.owner as string;
  const pellamOwners = SECOND_FIRM_USERS.filter((u) => (u.roles as readonly string[]).includes(pellamOwner)).map((u) => u.email);
  if (owner === "compliance_officer") expect(northmoorOwners).toEqual([nia.email, tomas.email].sort());

  const first = await runScheduler("2026-12-14");
  expect(first).toMatchObject({ asOf: "2026-12-14", mail: "ok", failed: 0 });
  const messages = await received();
  expect(first.sent).toBe(messages.length);
  const recipients = messages.flatMap((m) => m.to);
  // Northmoor's owners exactly; Pellam's mail goes only to the owners of its own open steps (earlier specs leave Pellam
  // more than one open period, each with its own reminder)
  expect(recipients.filter((r) => r.endsWith("@northmoor.example")).sort()).toEqual(northmoorOwners);
  const pellamRecipients = recipients.filter((r) => r.endsWith("@pellam.example"));
  expect(pellamRecipients).toEqual(expect.arrayContaining(pellamOwners));
  for (const r of pellamRecipients) expect(SECOND_FIRM_USERS.map((u) => u.email)).toContain(r);
  expect(recipients.length).toBe(northmoorOwners.length + pellamRecipients.length);
  const toTomas = messages.find((m) => m.to.includes(northmoorOwners[0]))!;
  expect(toTomas.subject).toContain("5 business days left");
  expect(toTomas.text).toContain("Monday 21 December 2026 (5 business days left)");
  expect(toTomas.text).toContain(`${E2E_ENV.BALLAST_URL}/periods/${period.id}`);

  // Running it again sends nothing new.
  const second = await runScheduler("2026-12-14");
  expect(second).toMatchObject({ sent: 0, recorded: 0, failed: 0 });
  expect(await received()).toHaveLength(messages.length);

  // The administrator sees the e-mails (their own firm's only) and the delivery record.
  await signInThroughPage(page, ada.email);
  const mail = new MailPage(page);
  await mail.open();
  await expect(mail.items()).toHaveCount(northmoorOwners.length);
  for (const email of northmoorOwners) await expect(page.getByTestId("mail-to").filter({ hasText: email })).toBeVisible();
  await expect(page.getByText(pellamOwners[0] ?? "nobody@pellam.example")).toHaveCount(0);
  await mail.items().first().getByRole("button").click();
  await expect(page.getByText("Step outstanding:")).toBeVisible();
  await page.screenshot({ path: "test-results/screens/mail-received.png", fullPage: true });

  const calendar = new CalendarPage(page);
  await calendar.open();
  await expect(calendar.reminderRows()).toHaveCount(northmoorOwners.length);
  await page.getByRole("heading", { name: "Reminder delivery" }).scrollIntoViewIfNeeded();
  await page.screenshot({ path: "test-results/screens/calendar-admin.png", fullPage: true });
  for (const row of await calendar.reminderRows().all()) {
    await expect(row).toContainText("Sent");
    await expect(row).toContainText("5 business days before");
  }
});

test("the mail page is for administrators only", async ({ page }) => {
  await signInThroughPage(page, tomas.email);
  await page.goto("/settings/mail");
  await expect(page.getByRole("heading", { name: "Not open to your role" })).toBeVisible();
  const api = await signedInApi(tomas.email);
  expect((await api.get("/api/mail/messages")).status()).toBe(403);
  await api.dispose();
});

test("the calendar lists deadlines, days left and owners, and downloads an .ics file that parses", async ({ page }) => {
  const api = await signedInApi(tomas.email);
  const [period] = (await (await api.get("/api/periods")).json()).periods;
  await api.dispose();
  await signInThroughPage(page, tomas.email);
  const calendar = new CalendarPage(page);
  await calendar.open();
  const row = calendar.deadlineRow("November 2026");
  await expect(row).toContainText("21 Dec 2026");
  // (1 Dec, 21 Dec]: 14 business days.
  await expect(row).toContainText("14 business days left");
  await expect(row).toContainText(period.nextStep.label);
  await expect(row).toContainText(ROLE_LABELS[period.nextStep.owner as Role]);
  // December 2026 ends on Thursday 31 Dec; with the demo holidays (31 Dec, 1 Jan) 15 business days later is 22 Jan.
  await expect(calendar.comingDeadlines()).toContainText("December 2026");
  await expect(calendar.comingDeadlines()).toContainText("22 Jan 2027");
  await expect(page.getByText("Send me reminder e-mails for steps I own")).toBeVisible();
  await expect(page.getByRole("heading", { name: "Reminder delivery" })).toHaveCount(0);
  await page.screenshot({ path: "test-results/screens/calendar.png", fullPage: true });

  const downloadPromise = page.waitForEvent("download");
  await calendar.downloadLink().click();
  const download = await downloadPromise;
  expect(download.suggestedFilename()).toBe("northmoor-brokerage-ltd-filing-deadlines.ics");
  const text = readFileSync((await download.path())!, "utf8");
  expect(text.split("\r\n").every((line) => Buffer.byteLength(line) <= 75)).toBe(true);
  const events = new ICAL.Component(ICAL.parse(text)).getAllSubcomponents("vevent").map((c) => new ICAL.Event(c));
  const november = events.find((e) => e.summary.includes("November 2026"))!;
  expect(november.startDate.toString()).toBe("2026-12-21");
  expect(november.summary).toBe("Filing deadline: November 2026 (Northmoor Brokerage Ltd)");
  expect(events.find((e) => e.summary.includes("December 2026"))!.startDate.toString()).toBe("2027-01-22");
});

test("a person turns their reminders off for themselves", async ({ page }) => {
  await signInThroughPage(page, nia.email);
  await new CalendarPage(page).open();
  const box = page.getByLabel(/Send me reminder e-mails/);
  await expect(box).toBeChecked();
  await box.uncheck();
  await expect(page.getByRole("status")).toContainText("Reminders are off for you; overdue notices still arrive.");
  await page.reload();
  await expect(page.getByLabel(/Send me reminder e-mails/)).not.toBeChecked();
  await page.getByLabel(/Send me reminder e-mails/).check();
  await expect(page.getByRole("status")).toContainText("You will receive reminders.");
});

test("holiday CSV with bad dates is refused row by row and stores nothing; the schedule refuses 61", async ({ page }) => {
  await signInThroughPage(page, ada.email);
  await page.goto("/settings");
  const list = page.getByTestId("holiday-list");
  const before = await list.locator("li").count();
  // the picker is enabled once the page is hydrated (a file set before that would be dropped)
  await expect(page.getByLabel("Holiday CSV file")).toBeEnabled();
  await page.getByLabel("Holiday CSV file").setInputFiles({
    name: "holidays-2027.csv",
    mimeType: "text/csv",
    buffer: Buffer.from("date,name\n2027-04-02,Good Friday\n2027-02-30,Not a day\n05/04/2027,Easter Monday\n"),
  });
  await expect(page.getByRole("status").filter({ hasText: "holidays-2027.csv was refused; nothing was stored." })).toBeVisible();
  const problems = page.getByTestId("csv-errors");
  await expect(problems).toContainText('Row 3: "2027-02-30" is not a real calendar date.');
  await expect(problems).toContainText('Row 4: "05/04/2027" is not a date written yyyy-mm-dd');
  await expect(list.locator("li")).toHaveCount(before);
  await page.screenshot({ path: "test-results/screens/holiday-csv-errors.png", fullPage: true });

  await page.getByLabel("Holiday CSV file").setInputFiles({ name: "ok.csv", mimeType: "text/csv", buffer: Buffer.from("2027-04-02,Good Friday\n") });
  await expect(page.getByRole("status").filter({ hasText: "Took 1 holiday from ok.csv." })).toBeVisible();
  await expect(list.locator("li")).toHaveCount(before + 1);
  await expect(list).toContainText("2 Apr 2027");

  await page.getByLabel("Reminders before the deadline").fill("10, 61");
  await page.getByRole("button", { name: "Save reminder schedule" }).click();
  await expect(page.getByText("Item 2: Between 1 and 60.")).toBeVisible();
  const api = await signedInApi(ada.email);
  const refused = await api.put("/api/calendar/settings", { data: { reminderOffsets: [0], remindOverdue: true, autoOpenPeriods: true } });
  expect(refused.status()).toBe(422);
  expect((await refused.json()).error.fields).toEqual({ "reminderOffsets.0": "Between 1 and 60." });
  expect((await (await api.get("/api/calendar/settings")).json()).reminderOffsets).toEqual([10, 5, 2, 1]);
  await api.dispose();
});
