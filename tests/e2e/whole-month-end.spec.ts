import { test, expect, type Browser, type Page } from "@playwright/test";
import { readFileSync } from "node:fs";
import JSZip from "jszip";
import XlsxPopulate from "xlsx-populate";
import { E2E_ENV } from "../../playwright.config";
import { DataPage } from "./pages/data";
import { MailPage } from "./pages/calendar";
import { FilingPage } from "./pages/filing";
import { MethodPage } from "./pages/method";
import { RunPage } from "./pages/runs";
import { csv, demoFile, DEMO_PASSWORD, DEMO_USERS, resizedDemoBook, signInThroughPage, signedInApi } from "./helpers";

/**
 * The whole month end of the demo firm Northmoor (period ending 2026-11-30), through the browser, as the people who
 * do it: the compliance officer uploads positions (a bad file, then a good one) and confirms them; the risk analyst
 * extends the price history, starts a new method statement version with evidence and approves it, starts a run, reads
 * its results and chooses it for the filing; the compliance officer assembles (or rebuilds) the draft and submits it;
 * the compliance head requests a change; the officer answers and resubmits; the head's wrong password is refused, then
 * she signs with the attestation; both packs download and open; the officer records the filing as filed; the auditor
 * reads the audit trail of all of it; the reminder e-mails for the period reached the local SMTP listener.
 *
 * It runs last (alphabetically) and works from whatever the earlier specs left on the shared e2e database: a confirmed
 * v2 positions file and the price extension (uploads), an approved method version 2 (method), runs with one chosen for
 * the filing (runs), a draft filing for November (permissions) and the reminders sent (reminders). Once it has filed
 * November, nothing else may depend on that period.
 */
const person = (email: string) => DEMO_USERS.find((u) => u.email === email)!;
const ADMIN = person("ada.quayle@northmoor.example");
const OFFICER = person("tomas.reyne@northmoor.example");
const ANALYST = person("priya.castell@northmoor.example");
const HEAD = person("helen.marsh@northmoor.example");
const AUDITOR = person("oskar.lind@northmoor.example");
const LISTENER = E2E_ENV.MAIL_LISTENER_URL;
const SECRET = E2E_ENV.REMINDERS_SECRET!;
const SCREENS = "test-results/screens";
const FILING_REFERENCE = "FMA/2026/11/0042";

const status = (page: Page) => new FilingPage(page).status();

let shot = 0;
async function screen(page: Page, step: string) {
  shot += 1;
  await page.screenshot({ path: `${SCREENS}/month-end-${String(shot).padStart(2, "0")}-${step}.png`, fullPage: true });
}

async function asPerson(browser: Browser, email: string): Promise<Page> {
  const page = await browser.newPage();
  await signInThroughPage(page, email);
  return page;
}

/** The reminder e-mails the local listener holds for Northmoor's November 2026 (read as reminders.spec reads them). */
async function novemberReminders(): Promise<{ to: string[]; subject: string; text: string }[]> {
  const messages = (await (await fetch(`${LISTENER}/messages`)).json()).messages as { to: string[]; subject: string; text: string }[];
  return messages.filter((m) => m.subject.includes("November 2026 (Northmoor Brokerage Ltd)"));
}

test("the whole month end of Northmoor's November 2026, person by person", async ({ browser }) => {
  test.setTimeout(300_000);
  let periodId = "";
  let runId = "";
  const positionsFile = "northmoor-positions-2026-11-v3.csv";
  /** A step one person does in a signed-in page of their own, closed after it. */
  const stepAs = (title: string, email: string, body: (page: Page) => Promise<void>) =>
    test.step(title, async () => {
      const page = await asPerson(browser, email);
      await body(page);
      await page.close();
    });

  await test.step("the period is open and its reminders have gone out", async () => {
    const api = await signedInApi(OFFICER.email);
    const periods = (await (await api.get("/api/periods")).json()).periods as { id: string; periodEnd: string; state: string }[];
    await api.dispose();
    const november = periods.find((p) => p.periodEnd === "2026-11-30")!;
    expect(november.state).not.toBe("filed");
    periodId = november.id;
    // reminders.spec ran the scheduler five business days before the deadline; if nothing reached the listener for
    // November (say this spec runs alone), run it the same way, with its secret and the test-only asOf.
    if ((await novemberReminders()).length === 0) {
      const cron = await signedInApi(null);
      const response = await cron.post("/api/cron/reminders", { headers: { authorization: `Bearer ${SECRET}` }, data: { asOf: "2026-12-14" } });
      expect(response.status(), await response.text()).toBe(200);
      await cron.dispose();
    }
    expect((await novemberReminders()).length).toBeGreaterThan(0);
  });

  await stepAs("the compliance officer uploads a bad positions file, reads its problems and cancels it", OFFICER.email, async (page) => {
    const data = new DataPage(page);
    await data.uploadBadDemoBook();
    await data.cancelRefused(() => screen(page, "positions-bad-file"));
  });

  await stepAs("the compliance officer uploads a corrected book and confirms it", OFFICER.email, async (page) => {
    const data = new DataPage(page);
    // The demo book with its first position resized by 20 (uploads.spec used 10), so its SHA-256 is new.
    const book = resizedDemoBook(20);
    await data.open();
    await data.upload("positions", csv(positionsFile, book.text));
    await expect(page).not.toHaveURL(/duplicate=1/);
    await expect(page.getByTestId("total-positions")).toHaveText(String(book.positions));
    await expect(page.getByTestId("rows-table")).toBeVisible();
    await screen(page, "positions-preview");
    await data.confirm();
    await data.open();
    const rows = page.getByTestId("upload-row");
    await expect(rows.filter({ hasText: positionsFile })).toContainText("Confirmed");
    await expect(rows.filter({ hasText: "northmoor-positions-2026-11-v2.csv" }).or(rows.filter({ hasText: "northmoor-positions-2026-11.csv" })).first()).toContainText("Superseded");
    await screen(page, "data-page");
  });

  await stepAs("the risk analyst extends the price history (or is told the same file was taken before)", ANALYST.email, async (page) => {
    const data = new DataPage(page);
    await data.open();
    await data.upload("prices", csv("northmoor-prices-extension.csv", demoFile("northmoor-prices-extension.csv")));
    if (/duplicate=1/.test(page.url())) {
      await expect(page.getByText("This exact file (same SHA-256) was uploaded before")).toBeVisible();
    } else {
      await data.confirm();
    }
    await screen(page, "prices-extension");
  });

  await stepAs("the risk analyst starts a new method statement version, attaches evidence and approves it; the compliance head co-approves", ANALYST.email, async (page) => {
    const method = new MethodPage(page);
    await method.open();
    const approvedHeading = method.approvedHeading();
    await expect(approvedHeading).toBeVisible();
    const current = Number((await approvedHeading.textContent())!.match(/\d+/)![0]);
    const next = current + 1;

    await method.startNewVersion(current, "November month end: a slightly faster EWMA decay after the review of the backtest.");
    await method.defaults().getByLabel("λ value").fill("0.96");
    await method.saveDraft();
    await expect(method.savedNotice()).toBeVisible();

    await expect(method.approveButton(next)).toBeDisabled();
    await method.attachEvidence();
    await screen(page, "method-draft-evidence");
    await method.approve(next);
    await expect(page.getByText("Approved by Priya Castell; waiting for a compliance head to co-approve.")).toBeVisible();
    const draftUrl = page.url();
    const head = await asPerson(browser, HEAD.email);
    await head.goto(draftUrl);
    await new MethodPage(head).coApprove(next, ANALYST.name);
    await head.close();
    await page.goto("/method");
    await expect(method.approvedHeading(next)).toBeVisible();
    await expect(page.getByText("EWMA, λ 0.96 (fixed)")).toBeVisible();
    await screen(page, "method-approved");
  });

  await stepAs("the risk analyst starts a run and follows it to completion", ANALYST.email, async (page) => {
    const runs = new RunPage(page);
    await runs.openPeriod(periodId, "November 2026");
    const rows = runs.rows();
    await expect(rows.first()).toBeVisible();
    const before = await rows.count();

    // Factors short of history are named first; the run then starts without them (as runs.spec does).
    await runs.start(() => screen(page, "run-refused-short-history"));
    await screen(page, "run-progress");
    await page.goto(`/periods/${periodId}/runs`);
    await expect(rows).toHaveCount(before + 1);
    const newest = rows.first();
    await expect(newest.getByText("Completed")).toBeVisible({ timeout: 90_000 });
    await expect(page.getByTestId("run-progress")).toHaveCount(0);
    await screen(page, "runs-completed");
    await newest.getByRole("link").first().click();
    await expect(page).toHaveURL(/\/runs\/[0-9a-f-]{36}$/);
    runId = page.url().split("/").pop()!;
  });

  await stepAs("the risk analyst reads the results and chooses the run for the filing", ANALYST.email, async (page) => {
    const run = new RunPage(page);
    await run.open(periodId, runId);
    await expect(page.getByTestId("var-table")).toBeVisible();
    await expect(page.getByRole("note").filter({ hasText: "Draft computed under the stated method" })).toBeVisible();
    await expect(page.getByTestId("capital-total")).toContainText("€");
    await expect(page.getByTestId("backtest-zone")).toContainText(/(Green|Yellow|Red) zone/);
    await expect(page.getByTestId("method-version")).toContainText(/Version \d+/);
    await screen(page, "run-summary");

    await run.tab("Contributions");
    await expect(page.getByText("Component VaR by asset class, one day, 99 %")).toBeVisible();
    await screen(page, "run-contributions");
    await run.tab("Backtest");
    await expect(page.getByTestId("backtest-tests")).toContainText("Kupiec test");
    await screen(page, "run-backtest");

    await run.open(periodId, runId);
    await run.useForFiling();
  });

  await stepAs("the compliance officer assembles the draft from the chosen run and submits it", OFFICER.email, async (page) => {
    const filing = new FilingPage(page);
    await filing.open(periodId);
    // No filing yet: assemble it. A draft left by an earlier spec (from another run): rebuild it from the marked run.
    const assemble = page.getByRole("button", { name: "Assemble the draft filing" });
    const rebuild = page.getByRole("button", { name: "Rebuild from the marked run" });
    await expect(assemble.or(rebuild).or(status(page)).first()).toBeVisible();
    if (await assemble.isVisible()) await assemble.click();
    else if (await rebuild.isVisible()) await rebuild.click();
    await expect(status(page)).toHaveText(/Draft|Changes requested/);
    await expect(rebuild).toHaveCount(0);
    const api = await signedInApi(OFFICER.email);
    const current = (await (await api.get(`/api/periods/${periodId}/filing`)).json()).current as { runId: string };
    expect(current.runId).toBe(runId);
    await api.dispose();
    await expect(page.getByRole("note").first()).toContainText("Draft computed under the stated method");
    for (const section of ["cover", "regulatory-capital", "capital", "var-es", "backtest", "method", "sign-off"]) await expect(page.getByTestId(`section-${section}`)).toBeVisible();
    // the demo profile (version 2) files the standardised building blocks, the value-at-risk based figure beside it
    await expect(page.getByTestId("section-regulatory-capital")).toContainText("The capital figure filed for this period is the standardised 1996 building blocks figure");
    await expect(page.getByTestId("section-regulatory-capital")).toContainText("for comparison and not filed: the internal models (value-at-risk based) figure");

    await filing.saveCoverNote("November 2026: the book as confirmed on 1 December; the method statement was updated this month.");
    await expect(page.getByTestId("section-cover")).toContainText("the method statement was updated this month");
    const firstException = page.locator("[id^=explanation-]").first();
    if ((await firstException.count()) && !(await firstException.inputValue())) {
      await firstException.fill("A market move outside the book's usual range; reviewed, no change to the method.");
      await page.getByRole("button", { name: "Save explanations" }).click();
      await expect(page.getByTestId("exceptions-table")).toContainText("outside the book's usual range");
    }
    await screen(page, "filing-draft");
    await page.getByLabel("Note to the reviewer (optional)").fill("November is ready for your review.");
    await page.getByRole("button", { name: /^(Submit|Resubmit) for review$/ }).click();
    await expect(status(page)).toHaveText(/In review/);
    await expect(page.getByTestId("comments-general")).toContainText("November is ready for your review.");
  });

  await stepAs("the compliance head requests a change", HEAD.email, async (page) => {
    const filing = new FilingPage(page);
    await filing.open(periodId);
    await expect(filing.status()).toHaveText(/In review/);
    await screen(page, "filing-in-review");
    await filing.requestChanges("backtest", "Explain every backtest exception, not only the first.");
    await screen(page, "filing-changes-requested");
  });

  await stepAs("the compliance officer answers and resubmits", OFFICER.email, async (page) => {
    const filing = new FilingPage(page);
    await filing.open(periodId);
    await expect(filing.status()).toHaveText(/Changes requested/);
    const { filled } = await filing.fillEmptyExplanations((i) => `Exception ${i + 1}: a market move outside the book's usual range; reviewed, no change to the method.`);
    if (filled) await filing.saveExplanations();
    await filing.answerOn("backtest", "Backtest", "Every exception now has an explanation.");
    await page.getByLabel("Your answer to the review (optional)").fill("Done as asked.");
    await screen(page, "filing-answered");
    await page.getByRole("button", { name: "Resubmit for review" }).click();
    await expect(status(page)).toHaveText(/In review/);
  });

  await stepAs("the compliance head's wrong password is refused; she then signs with the attestation", HEAD.email, async (page) => {
    const filing = new FilingPage(page);
    await filing.open(periodId);
    await expect(filing.status()).toHaveText(/In review/);
    await expect(page.getByTestId("four-eyes-note")).toHaveCount(0);
    const version = (await page.getByTestId("filing-version").textContent())!.trim();
    const dialog = await filing.openSignDialog(version);
    await expect(dialog).toContainText("By signing, the compliance head confirms");
    await filing.attest(version, { name: HEAD.name, reference: "FMA-CH-2207" });
    await filing.signWith(version, "not-my-password");
    await expect(dialog).toContainText("The password is not correct.");
    await expect(filing.status()).toHaveText(/In review/);
    await screen(page, "sign-wrong-password");

    await filing.signWith(version, DEMO_PASSWORD);
    await expect(dialog).toBeHidden();
    await expect(filing.status()).toHaveText(/Signed/);
    await filing.verifySignature();
    await screen(page, "filing-signed");
  });

  await stepAs("both packs download and open with the sign-off", OFFICER.email, async (page) => {
    await page.goto(`/periods/${periodId}/filing`);
    await expect(status(page)).toHaveText(/Signed/);
    const [docx] = await Promise.all([page.waitForEvent("download"), page.getByTestId("download-docx").click()]);
    expect(docx.suggestedFilename()).toMatch(/^northmoor-2026-11-v\d+-signed\.docx$/);
    const zip = await JSZip.loadAsync(readFileSync((await docx.path())!));
    const body = (await zip.file("word/document.xml")!.async("string")).replace(/<[^>]+>/g, "");
    expect(body).toContain("Sign-off");
    expect(body).toContain(HEAD.name);

    const [xlsx] = await Promise.all([page.waitForEvent("download"), page.getByTestId("download-xlsx").click()]);
    expect(xlsx.suggestedFilename()).toMatch(/^northmoor-2026-11-v\d+-signed\.xlsx$/);
    const book = await XlsxPopulate.fromDataAsync(readFileSync((await xlsx.path())!));
    expect(book.sheets().length).toBeGreaterThan(3);
    await screen(page, "filing-packs");
  });

  await stepAs("the compliance officer records the filing as filed", OFFICER.email, async (page) => {
    const filing = new FilingPage(page);
    await filing.open(periodId);
    await filing.recordFiled(FILING_REFERENCE);
    await screen(page, "filing-filed");
    const api = await signedInApi(OFFICER.email);
    const period = (await (await api.get(`/api/periods/${periodId}`)).json()).period;
    expect(period).toMatchObject({ state: "filed", filingReference: FILING_REFERENCE });
    await api.dispose();
  });

  await stepAs("the auditor reads the audit trail of all of it", AUDITOR.email, async (page) => {
    await page.goto("/audit");
    const filters = page.getByRole("search", { name: "Filter the audit trail" });
    const rows = page.getByTestId("audit-row");
    await expect(rows.first()).toBeVisible();
    const expected: [action: string, who: string, text: string | RegExp][] = [
      ["upload.confirm", OFFICER.name, `"${positionsFile}"`],
      ["method.approve", ANALYST.name, /Approved method statement version \d+/],
      ["method.co_approve", HEAD.name, /Co-approved method statement version \d+/],
      ["run.start", ANALYST.name, "Started a run for the period ending 2026-11-30"],
      ["run.use_for_filing", ANALYST.name, ""],
      ["filing.submit", OFFICER.name, ""],
      ["filing.request_changes", HEAD.name, ""],
      ["filing.sign_refused", HEAD.name, ""],
      ["filing.sign", HEAD.name, ""],
      ["filing.filed", OFFICER.name, ""],
    ];
    for (const [action, who, text] of expected) {
      // the positions confirmation is found by its file: the analyst's price extension (confirmed after it when no
      // earlier spec took that file) is a newer upload.confirm
      await filters.getByLabel("Search").fill(action === "upload.confirm" ? positionsFile : "");
      await filters.getByLabel("Action").selectOption(action);
      const newest = rows.first();
      await expect(newest).toContainText(action);
      await expect(newest).toContainText(who);
      if (text) await expect(newest).toContainText(text);
    }
    await filters.getByLabel("Action").selectOption("filing.filed");
    await screen(page, "audit-filed");
    await filters.getByLabel("Action").selectOption("");
    await filters.getByLabel("Search").fill(positionsFile);
    await expect(rows.filter({ hasText: "upload.receive" })).toHaveCount(1);
    await expect(rows.filter({ hasText: "upload.confirm" })).toHaveCount(1);
    await screen(page, "audit-upload");
  });

  await test.step("the reminder e-mails for November reached the SMTP listener", async () => {
    const messages = await novemberReminders();
    expect(messages.length).toBeGreaterThan(0);
    for (const message of messages) {
      expect(message.text).toContain("Monday 21 December 2026");
      expect(message.text).toContain(`${E2E_ENV.BALLAST_URL}/periods/${periodId}`);
    }
    const page = await asPerson(browser, ADMIN.email);
    const mail = new MailPage(page);
    await mail.open();
    await expect(mail.items().first()).toBeVisible();
    for (const to of new Set(messages.flatMap((m) => m.to).filter((t) => t.endsWith("@northmoor.example")))) {
      await expect(page.getByTestId("mail-to").filter({ hasText: to }).first()).toBeVisible();
    }
    await screen(page, "reminders-received");
    await page.close();
  });
});
