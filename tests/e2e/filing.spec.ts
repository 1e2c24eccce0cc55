import { createHash } from "node:crypto";
import { test, expect, type APIRequestContext, type Browser, type Page } from "@playwright/test";
import { readFileSync } from "node:fs";
import JSZip from "jszip";
import XlsxPopulate from "xlsx-populate";
import { DataPage } from "./pages/data";
import { FilingPage } from "./pages/filing";
import { bookDatedTo, completedRunOf, DEMO_PASSWORD, SECOND_FIRM_USERS, signInThroughPage, signedInApi } from "./helpers";

/**
 * The review loop across roles, in the browser: the compliance officer assembles and submits the draft filing; the
 * compliance head comments and requests a change; the officer answers and resubmits; the officer, given the compliance
 * head role for the check, is refused under four eyes; the head's wrong password is refused, then he signs with the
 * attestation; both packs download and open; a change after signing makes version 2 with version 1's signature shown
 * superseded; version 2 is signed and the officer records it as filed with the regulator's reference.
 *
 * It works on a reporting period of its own so that no other spec sees its end state: Pellam's October 2026, opened
 * here, its positions (Pellam's demo book dated 30 October) uploaded through the Data page, a run started by June
 * Okafor (Pellam's risk analyst and compliance officer) through the API and marked for the filing; Rafe Pellam is the
 * compliance head. (On Northmoor, a filed November would stop the runs, reminders and uploads specs that follow the
 * demo period, and any earlier Northmoor period with a filing run changes what the runs spec's "change since last
 * period" shows.)
 */
const OFFICER = SECOND_FIRM_USERS.find((u) => u.email === "june.okafor@pellam.example")!;
const HEAD = SECOND_FIRM_USERS.find((u) => u.email === "rafe.pellam@pellam.example")!;
const SCREENS = "test-results/screens";

let periodId = "";
let filingUrl = "";

async function json<T>(api: APIRequestContext, url: string): Promise<T> {
  const response = await api.get(url);
  expect(response.status(), `${url}: ${await response.text()}`).toBe(200);
  return (await response.json()) as T;
}

/** June's roles at Pellam, set by Rafe Pellam (the firm's administrator) through the API; restored after the check. */
async function setOfficerRoles(roles: string[]) {
  const admin = await signedInApi(HEAD.email);
  const { members } = await json<{ members: { id: string; email: string }[] }>(admin, "/api/members");
  const june = members.find((m) => m.email === OFFICER.email)!;
  const response = await admin.patch(`/api/members/${june.id}`, { data: { roles } });
  expect(response.status(), await response.text()).toBe(200);
  await admin.dispose();
}

async function asPerson(browser: Browser, email: string): Promise<Page> {
  const page = await browser.newPage();
  await signInThroughPage(page, email);
  await page.goto(filingUrl);
  return page;
}

const status = (page: Page) => new FilingPage(page).status();

test.describe.configure({ mode: "serial", timeout: 120_000 });

test.beforeAll(async ({ browser }) => {
  test.setTimeout(240_000);
  // Pellam's October 2026, opened by its compliance officer
  const officer = await signedInApi(OFFICER.email);
  const { periods } = await json<{ periods: { id: string; periodEnd: string }[] }>(officer, "/api/periods");
  const existing = periods.find((p) => p.periodEnd === "2026-10-31");
  if (existing) periodId = existing.id;
  else {
    const opened = await officer.post("/api/periods", { data: { month: "2026-10" } });
    expect(opened.status(), await opened.text()).toBe(201);
    periodId = (await opened.json()).period.id;
  }
  filingUrl = `/periods/${periodId}/filing`;

  // its positions, uploaded and confirmed through the Data page
  const filing = await json<{ markedRun: unknown; current: unknown }>(officer, `/api/periods/${periodId}/filing`);
  const uploads = await json<{ uploads: { periodId: string | null; status: string }[] }>(officer, "/api/uploads");
  await officer.dispose();
  if (!filing.markedRun) {
    if (!uploads.uploads.some((u) => u.periodId === periodId && u.status === "confirmed")) {
      const page = await browser.newPage();
      await signInThroughPage(page, OFFICER.email);
      const data = new DataPage(page);
      await data.open();
      await page.getByLabel("Reporting period").selectOption({ label: "October 2026 (ends 2026-10-31)" });
      const book = bookDatedTo(readFileSync("templates/demo/pellam-positions-2026-11.csv", "utf8"), "2026-11-30", "2026-10-30");
      await data.upload("positions", { name: "pellam-positions-2026-10.csv", mimeType: "text/csv", buffer: Buffer.from(book) });
      await data.confirm();
      await page.close();
    }

    // a run by the risk analyst, marked for the filing
    const analyst = await signedInApi(OFFICER.email);
    const runId = await completedRunOf(analyst, periodId);
    const marked = await analyst.post(`/api/runs/${runId}/use-for-filing`, { data: { confirm: true } });
    expect(marked.status(), await marked.text()).toBe(200);
    await analyst.dispose();
  }
});

test.afterAll(async () => {
  await setOfficerRoles([...OFFICER.roles]);
});

test("the compliance officer assembles the draft, explains an exception and submits it", async ({ page }) => {
  await signInThroughPage(page, OFFICER.email);
  // the shell's Filing link leads to a filing page (the current period's)
  await page.getByRole("navigation", { name: "Month end" }).getByRole("link", { name: "Filing" }).click();
  await expect(page).toHaveURL(/\/periods\/[0-9a-f-]{36}\/filing$/);

  await page.goto(filingUrl);
  await expect(page.getByTestId("no-filing")).toContainText("is marked for this period's filing");
  await page.getByRole("button", { name: "Assemble the draft filing" }).click();
  await expect(status(page)).toHaveText(/Draft/);
  await expect(page.getByRole("note").first()).toContainText("Draft computed under the stated method");
  for (const section of ["cover", "capital", "var-es", "stressed", "backtest", "method", "limitations", "data-quality", "changes", "sign-off", "cautions"]) {
    await expect(page.getByTestId(`section-${section}`)).toBeVisible();
  }
  await expect(page.getByTestId("capital-table")).toContainText("Capital");
  await expect(page.getByTestId("totals-table")).toContainText("(primary)");
  await expect(page.getByTestId("stressed-table")).toContainText("Stressed VaR, 1 day (GBP)");
  await expect(page.getByTestId("sign-off-table")).toContainText("Filled in when the filing is signed");

  await new FilingPage(page).saveCoverNote("October 2026: the first month on Ballast. The principal book is unchanged in kind from September.");
  await expect(page.getByTestId("section-cover")).toContainText("the first month on Ballast");

  const firstException = page.locator("[id^=explanation-]").first();
  if (await firstException.count()) {
    await firstException.fill("A gap in gilt prices after the rate announcement; no change to the method.");
    await page.getByRole("button", { name: "Save explanations" }).click();
    await expect(page.getByTestId("exceptions-table")).toContainText("A gap in gilt prices");
  }
  await page.screenshot({ path: `${SCREENS}/filing-draft.png`, fullPage: true });

  // an unsigned draft offers no signature check
  await expect(page.getByTestId("not-signed")).toContainText("Not signed yet");
  await expect(page.getByRole("button", { name: "Verify signature" })).toHaveCount(0);
  await page.getByLabel("Note to the reviewer (optional)").fill("Ready for your review.");
  await page.getByRole("button", { name: "Submit for review" }).click();
  await expect(status(page)).toHaveText(/In review/);
  await expect(page.getByTestId("comments-general")).toContainText("Ready for your review.");
  // the note sent with the submission is called that, not an answer to the review
  const submissionNote = page.getByTestId("comments-general").getByRole("listitem").filter({ hasText: "Ready for your review." });
  await expect(submissionNote).toContainText("Note with the submission");
  await expect(submissionNote).not.toContainText("Answer");
});

test("the compliance head comments on a section and requests a change", async ({ page }) => {
  await signInThroughPage(page, HEAD.email);
  await page.goto(filingUrl);
  await expect(status(page)).toHaveText(/In review/);
  await page.screenshot({ path: `${SCREENS}/filing-in-review.png`, fullPage: true });

  const capital = page.getByTestId("comments-capital");
  await capital.getByRole("button", { name: /Comment on capital summary/i }).click();
  // the cursor goes into the comment box
  await expect(capital.getByLabel(/Comment on Capital summary/)).toBeFocused();
  await capital.getByLabel(/Comment on Capital summary/).fill("Say in a sentence why the plus factor is what it is.");
  await capital.getByRole("button", { name: "Add comment" }).click();
  await expect(capital).toContainText("Say in a sentence why the plus factor is what it is.");

  await new FilingPage(page).requestChanges("backtest", "Explain every exception, not only the first.");
});

test("the officer answers, completes the explanations and resubmits", async ({ page }) => {
  await signInThroughPage(page, OFFICER.email);
  await page.goto(filingUrl);
  const filing = new FilingPage(page);
  await expect(filing.status()).toHaveText(/Changes requested/);
  const { count } = await filing.fillEmptyExplanations((i) => `Exception ${i + 1}: a market move outside the book's usual range; reviewed, no change to the method.`);
  if (count) await filing.saveExplanations();
  await filing.answerOn("backtest", "Backtest", "Every exception now has an explanation.");

  await page.getByLabel("Your answer to the review (optional)").fill("Done as asked.");
  await page.getByRole("button", { name: "Resubmit for review" }).click();
  await expect(status(page)).toHaveText(/In review/);
});

test("four eyes: the officer, given the compliance head role, is told why she cannot sign what she prepared", async ({ browser }) => {
  await setOfficerRoles(["compliance_officer", "risk_analyst", "compliance_head"]);
  const page = await asPerson(browser, OFFICER.email);
  const note = page.getByTestId("four-eyes-note");
  await expect(note).toContainText("You prepared, submitted and started the run of this filing, so you cannot also sign it.");
  await expect(note).toContainText("Ask Rafe Pellam to sign it.");
  await expect(page.getByRole("button", { name: "Sign version 1" })).toHaveCount(0);
  // and the route refuses her all the same
  const api = await signedInApi(OFFICER.email);
  const filingId = (await json<{ current: { id: string } }>(api, `/api/periods/${periodId}/filing`)).current.id;
  const refused = await api.post(`/api/filings/${filingId}/sign`, { data: { password: DEMO_PASSWORD, attest: true, signerName: OFFICER.name, licenceReference: "CA-CO-4410" } });
  expect(refused.status()).toBe(403);
  expect((await refused.json()).error).toMatchObject({ code: "forbidden:four_eyes" });
  await api.dispose();
  await page.close();
  await setOfficerRoles([...OFFICER.roles]);
});

test("the head's wrong password is refused; he then signs with the attestation and the hash verifies", async ({ page }) => {
  await signInThroughPage(page, HEAD.email);
  await page.goto(filingUrl);
  const filing = new FilingPage(page);
  const dialog = await filing.openSignDialog(1);
  await expect(dialog).toContainText("By signing, the compliance head confirms");
  await filing.attest(1, { name: HEAD.name, reference: "CA-CH-0391" });
  await filing.signWith(1, "not-my-password");
  await expect(dialog).toContainText("The password is not correct.");
  await expect(status(page)).toHaveText(/In review/);

  await filing.signWith(1, DEMO_PASSWORD);
  await expect(dialog).toBeHidden();
  await expect(status(page)).toHaveText(/Signed/);
  // nothing on the signed filing is headed "Draft" beside its "Signed" state
  // (the caution's own sentence, "Draft computed under the stated method…", stays: it is required wherever figures are shown)
  await expect(page.getByText(/^Draft( ·)?$/)).toHaveCount(0);
  await expect(page.getByRole("heading", { name: /^Draft\b/ })).toHaveCount(0);
  await expect(page.getByRole("article")).toHaveAttribute("aria-label", "Filing, version 1 (signed)");
  const hash = await filing.verifySignature();
  await expect(page.getByTestId("verify-result")).toContainText(hash);
  await page.screenshot({ path: `${SCREENS}/filing-signed.png`, fullPage: true });
});

test("both packs download with their content types and open; each download is in the audit trail", async ({ page }) => {
  await signInThroughPage(page, OFFICER.email);
  await page.goto(filingUrl);
  const [docx] = await Promise.all([page.waitForEvent("download"), page.getByTestId("download-docx").click()]);
  expect(docx.suggestedFilename()).toBe("pellam-2026-10-v1-signed.docx");
  const zip = await JSZip.loadAsync(readFileSync((await docx.path())!));
  const body = (await zip.file("word/document.xml")!.async("string")).replace(/<[^>]+>/g, "");
  expect(body).toContain("Sign-off");
  expect(body).toContain("Rafe Pellam");

  const [xlsx] = await Promise.all([page.waitForEvent("download"), page.getByTestId("download-xlsx").click()]);
  expect(xlsx.suggestedFilename()).toBe("pellam-2026-10-v1-signed.xlsx");
  const book = await XlsxPopulate.fromDataAsync(readFileSync((await xlsx.path())!));
  expect(book.sheets().length).toBeGreaterThan(3);

  const api = await signedInApi(OFFICER.email);
  const filingId = (await json<{ current: { id: string } }>(api, `/api/periods/${periodId}/filing`)).current.id;
  const word = await api.get(`/api/filings/${filingId}/packs/docx`);
  expect(word.headers()["content-type"]).toBe("application/vnd.openxmlformats-officedocument.wordprocessingml.document");
  expect(word.headers()["content-disposition"]).toBe('attachment; filename="pellam-2026-10-v1-signed.docx"');
  const sheet = await api.get(`/api/filings/${filingId}/packs/xlsx`);
  expect(sheet.headers()["content-type"]).toBe("application/vnd.openxmlformats-officedocument.spreadsheetml.sheet");
  // the stored pack: its SHA-256 in the headers is the bytes' own, and the page shows it once stored
  const wordSha = createHash("sha256").update(await word.body()).digest("hex");
  expect(word.headers()["x-ballast-pack-sha256"]).toBe(wordSha);
  expect(word.headers()["etag"]).toBe(`"${wordSha}"`);
  expect(createHash("sha256").update(await (await api.get(`/api/filings/${filingId}/packs/docx`)).body()).digest("hex")).toBe(wordSha);
  await api.dispose();
  await page.reload();
  await expect(page.getByTestId("pack-status-docx")).toContainText(`SHA-256 ${wordSha}`);
  await page.getByTestId("pack-status").screenshot({ path: `${SCREENS}/filing-pack-status.png` });

  // Rafe Pellam is the firm's administrator too, so he reads the audit trail
  const admin = await signedInApi(HEAD.email);
  const audit = await json<{ events: { action: string; summary: string }[] }>(admin, "/api/audit?action=filing.download&pageSize=200");
  const summaries = audit.events.filter((e) => e.action === "filing.download").map((e) => e.summary);
  expect(summaries.filter((s) => s.includes("pellam-2026-10-v1-signed")).length).toBeGreaterThanOrEqual(4);
  await admin.dispose();
});

test("a change after signing makes version 2; version 1's signature stays, superseded; version 2 is signed and filed", async ({ browser }) => {
  const officer = await asPerson(browser, OFFICER.email);
  await officer.getByRole("button", { name: "Change the signed filing…" }).click();
  await officer.getByLabel("Why does the signed version need to change?").fill("The cover note must say that September was filed outside Ballast.");
  await officer.getByRole("button", { name: "Start version 2" }).click();
  await expect(status(officer)).toHaveText(/Draft/);
  await expect(officer.getByTestId("filing-version")).toHaveText("2");
  const v1 = officer.getByTestId("version-1");
  await expect(v1).toContainText("Superseded");
  await expect(v1.getByTestId("superseded-signature")).toContainText("Signed by Rafe Pellam");
  await expect(v1.getByTestId("superseded-signature")).toContainText("The cover note must say that September was filed outside Ballast.");
  await expect(officer.getByTestId("section-changes")).toContainText("Version 2 replaces version 1.");
  await new FilingPage(officer).saveCoverNote("October 2026: the first month on Ballast; September was filed outside it.");
  await expect(officer.getByTestId("section-cover")).toContainText("September was filed outside it");
  await officer.getByRole("button", { name: "Submit for review" }).click();
  await expect(status(officer)).toHaveText(/In review/);

  const head = await asPerson(browser, HEAD.email);
  const headFiling = new FilingPage(head);
  const dialog = await headFiling.openSignDialog(2);
  await headFiling.attest(2, { name: HEAD.name });
  await expect(dialog.getByLabel("Registration no.")).toHaveValue("CA-CH-0391");
  await headFiling.signWith(2, DEMO_PASSWORD);
  await expect(status(head)).toHaveText(/Signed/);
  await expect(head.getByTestId("version-1").getByTestId("superseded-signature")).toBeVisible();
  await expect(head.getByTestId("version-2").getByTestId("signature")).toContainText("Signed by Rafe Pellam");
  await head.close();

  await officer.reload();
  await new FilingPage(officer).recordFiled("CA/2026/10/0117");
  await officer.screenshot({ path: `${SCREENS}/filing-filed.png`, fullPage: true });
  await officer.close();

  const api = await signedInApi(OFFICER.email);
  const period = await json<{ period: { state: string; filingReference: string } }>(api, `/api/periods/${periodId}`);
  expect(period.period).toMatchObject({ state: "filed", filingReference: "CA/2026/10/0117" });
  await api.dispose();
});
