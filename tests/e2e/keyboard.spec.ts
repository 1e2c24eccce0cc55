import { readFileSync } from "node:fs";
import { test, expect, type Locator, type Page } from "@playwright/test";
import { bookDatedTo, DEMO_PASSWORD, runCompletes, SECOND_FIRM_USERS, signedInApi, signInThroughPage } from "./helpers";
import { expectNoSeriousViolations } from "./a11y";

/**
 * Keyboard only: the upload of a positions file, starting a run, approving a method statement and signing a filing,
 * each reached with Tab and worked with Enter, Space and typing, no mouse. On Pellam's September 2026, a period of
 * its own (opened in the set-up), so that the specs on Northmoor's months see nothing of it.
 */

const OFFICER = SECOND_FIRM_USERS.find((u) => u.email === "june.okafor@pellam.example")!; // compliance officer and risk analyst
const HEAD = SECOND_FIRM_USERS.find((u) => u.email === "rafe.pellam@pellam.example")!; // administrator and compliance head

test.describe.configure({ mode: "serial", timeout: 120_000 });

let periodId = "";

/** Press Tab until `target` has the focus (at most `limit` presses), as a keyboard user moves through the page. */
async function tabTo(page: Page, target: Locator, limit = 80): Promise<void> {
  await expect(target).toBeVisible();
  for (let i = 0; i < limit; i++) {
    if (await target.evaluate((el) => el === document.activeElement || el.contains(document.activeElement)).catch(() => false)) return;
    await page.keyboard.press("Tab");
  }
  throw new Error(`Tab never reached ${target}`);
}

/** Start the Tab walk from the top of the page. */
async function fromTop(page: Page): Promise<void> {
  await page.locator("body").evaluate((b) => {
    (document.activeElement as HTMLElement | null)?.blur();
    b.focus();
  });
}

test.beforeAll(async () => {
  const officer = await signedInApi(OFFICER.email);
  const { periods } = await (await officer.get("/api/periods")).json();
  const existing = (periods as { id: string; periodEnd: string }[]).find((p) => p.periodEnd === "2026-09-30");
  if (existing) periodId = existing.id;
  else {
    const opened = await officer.post("/api/periods", { data: { month: "2026-09" } });
    expect(opened.status(), await opened.text()).toBe(201);
    periodId = (await opened.json()).period.id;
  }
  await officer.dispose();
});

test("a positions file is uploaded and confirmed with the keyboard alone", async ({ page }) => {
  await signInThroughPage(page, OFFICER.email);
  await page.goto("/data");
  const period = page.getByLabel("Reporting period");
  await fromTop(page);
  await tabTo(page, period);
  await page.keyboard.type("September 2026");
  await expect(period).toHaveValue(periodId);
  const area = page.getByTestId("positions-upload-button");
  await expect(area.locator("[data-state='ready']").first()).toBeVisible({ timeout: 20_000 });
  const button = area.locator("label").first();
  await tabTo(page, button);
  const book = bookDatedTo(readFileSync("templates/demo/pellam-positions-2026-11.csv", "utf8"), "2026-11-30", "2026-09-30");
  const [chooser] = await Promise.all([page.waitForEvent("filechooser"), page.keyboard.press("Enter")]);
  await chooser.setFiles({ name: "pellam-positions-2026-09.csv", mimeType: "text/csv", buffer: Buffer.from(book) });
  await page.waitForURL(/\/data\/uploads\/[0-9a-f-]{36}/, { timeout: 60_000 });
  // the job worker reads and checks the file first (it may be busy with another job): the problems come when it has
  await expect(page.getByRole("heading", { name: "Problems" })).toBeVisible({ timeout: 60_000 });
  await expectNoSeriousViolations(page, "upload preview");

  const acknowledge = page.getByLabel(/I have read the \d+ warnings?/);
  await fromTop(page);
  if (await acknowledge.count()) {
    await tabTo(page, acknowledge);
    await page.keyboard.press("Space");
    await expect(acknowledge).toBeChecked();
  }
  await tabTo(page, page.getByRole("button", { name: "Confirm", exact: true }));
  await page.keyboard.press("Enter");
  await expect(page.getByTestId("preview-message")).toContainText("Confirmed", { timeout: 60_000 });
});

test("a run is started with the keyboard and opens at once", async ({ page }) => {
  await signInThroughPage(page, OFFICER.email);
  await page.goto(`/periods/${periodId}/runs`);
  await fromTop(page);
  await tabTo(page, page.getByRole("button", { name: "Start run" }));
  await page.keyboard.press("Enter");
  const runPage = /\/runs\/[0-9a-f-]{36}$/;
  const refusal = page.getByTestId("run-refusal");
  await expect.poll(async () => runPage.test(page.url()) || (await refusal.isVisible()), { timeout: 30_000 }).toBe(true);
  if (!runPage.test(page.url())) {
    await tabTo(page, page.getByRole("button", { name: "Start without these factors" }));
    await page.keyboard.press("Enter");
  }
  await expect(page).toHaveURL(runPage);
  const runId = page.url().split("/").pop()!;
  const api = await signedInApi(OFFICER.email);
  await runCompletes(api, runId);
  await page.reload();
  await expect(page.getByTestId("var-table")).toBeVisible();
  await expectNoSeriousViolations(page, "run summary after a keyboard start");
  const marked = await api.post(`/api/runs/${runId}/use-for-filing`, { data: { confirm: true } });
  expect(marked.status(), await marked.text()).toBe(200);
  await api.dispose();
});

test("a filing is signed with the keyboard alone: the dialog's controls in order, focus inside it", async ({ page }) => {
  // the officer assembles and submits through the API; the compliance head signs by keyboard
  const officer = await signedInApi(OFFICER.email);
  const prepared = await officer.post(`/api/periods/${periodId}/filing`, { data: {} });
  expect(prepared.status(), await prepared.text()).toBe(200);
  const filingId = (await prepared.json()).filing.id as string;
  const exceptions = ((await prepared.json()).filing.exceptions ?? []) as { date: string }[];
  if (exceptions.length) {
    const explained = await officer.patch(`/api/filings/${filingId}`, { data: { explanations: Object.fromEntries(exceptions.map((e) => [e.date, "A market move outside the book's usual range; reviewed."])) } });
    expect(explained.status(), await explained.text()).toBe(200);
  }
  const submitted = await officer.post(`/api/filings/${filingId}/submit`, { data: { note: "" } });
  expect(submitted.status(), await submitted.text()).toBe(200);
  await officer.dispose();

  await signInThroughPage(page, HEAD.email);
  await page.goto(`/periods/${periodId}/filing`);
  await fromTop(page);
  await tabTo(page, page.getByRole("button", { name: "Sign version 1" }), 400);
  await page.keyboard.press("Enter");
  const dialog = page.getByRole("dialog", { name: "Sign version 1 of the filing" });
  await expect(dialog).toBeVisible();
  await expect.poll(() => dialog.evaluate((d) => d.contains(document.activeElement))).toBe(true);
  await expectNoSeriousViolations(page, "sign dialog");
  await tabTo(page, dialog.getByRole("checkbox"), 20);
  await page.keyboard.press("Space");
  await tabTo(page, dialog.getByLabel("Your full name"), 20);
  await page.keyboard.type(HEAD.name);
  await tabTo(page, dialog.getByLabel("Registration no."), 20);
  await page.keyboard.press("ControlOrMeta+a");
  await page.keyboard.type("CA-CH-0391");
  await tabTo(page, dialog.getByLabel("Your password, entered again"), 20);
  await page.keyboard.type(DEMO_PASSWORD);
  await page.keyboard.press("Enter");
  await expect(dialog).toBeHidden();
  await expect(page.getByTestId("filing-status").first()).toHaveText(/Signed/);
});

test("a method statement version is drafted, given evidence and approved with the keyboard alone", async ({ page }) => {
  await signInThroughPage(page, OFFICER.email);
  await page.goto("/method");
  await fromTop(page);
  await tabTo(page, page.getByRole("button", { name: "Start a new version" }), 200);
  await page.keyboard.press("Enter");
  await tabTo(page, page.getByLabel(/Why does version \d+ need to change\?/), 20);
  await page.keyboard.type("Quarterly review: no change to the estimators, the rationale restated.");
  await tabTo(page, page.getByRole("button", { name: "Start the draft" }), 20);
  await page.keyboard.press("Enter");
  await expect(page).toHaveURL(/\/method\/[0-9a-f-]{36}$/);
  await expect(page.getByRole("heading", { name: /Method statement · draft version \d+/ })).toBeVisible();
  const version = (await page.getByRole("heading", { level: 1 }).textContent())!.match(/draft version (\d+)/)![1];
  await fromTop(page);
  await tabTo(page, page.getByRole("button", { name: "Attach evidence" }), 400);
  await page.keyboard.press("Enter");
  await expect(page.getByRole("button", { name: "Recompute evidence" })).toBeEnabled({ timeout: 60_000 });
  await expectNoSeriousViolations(page, "method draft with evidence");
  const approve = page.getByRole("button", { name: `Approve version ${version}` });
  await fromTop(page);
  await tabTo(page, approve, 400);
  await page.keyboard.press("Enter");
  // a confirmation step, where there is one, is answered with the keyboard too
  const confirm = page.getByRole("dialog").getByRole("button", { name: /Approve|Confirm/ });
  const approvedOrPending = page.getByRole("heading", { name: `Method statement · version ${version}` }).or(page.getByText(/co-approv|second approval|awaiting/i).first());
  await expect(confirm.or(approvedOrPending).first()).toBeVisible({ timeout: 30_000 });
  if (await confirm.count()) {
    const tick = page.getByRole("dialog").getByRole("checkbox");
    if (await tick.count()) {
      await tabTo(page, tick.first(), 20);
      await page.keyboard.press("Space");
    }
    await tabTo(page, confirm.first(), 20);
    await page.keyboard.press("Enter");
  }
  await expect(approvedOrPending.first()).toBeVisible({ timeout: 30_000 });
});
