/**
 * The method statement governs the figures, on Pellam's November (its own firm, so the Northmoor specs that follow
 * see their demo method unchanged): the risk analyst sets GARCH(1,1) with Student-t errors for equities and EWMA
 * λ = 0.97 for FX, with each factor's volatility from its asset class; the evidence shows the candidate methods
 * backtested on the book; she approves, the compliance head co-approves; the run's VaR changes from the run under
 * version 1; the run page and both packs name exactly those models per factor; the backtest is out of sample.
 */
import JSZip from "jszip";
import { test, expect, type APIRequestContext } from "@playwright/test";
import { completedRunOf, signInThroughPage, signedInApi } from "./helpers";

const ANALYST = "june.okafor@pellam.example"; // risk analyst and compliance officer
const HEAD = "rafe.pellam@pellam.example"; // compliance head (co-approves)

test.describe.configure({ mode: "serial", timeout: 300_000 });

async function json<T>(api: APIRequestContext, url: string): Promise<T> {
  const r = await api.get(url);
  expect(r.status(), await r.text()).toBe(200);
  return (await r.json()) as T;
}

interface RunJson {
  id: string;
  status: string;
  results: {
    monthEnd: {
      methods: { method: string; byConfidence: { confidence: number; oneDay: { var: number } }[] }[];
      model?: { covariance: string; factors: { factor: string; assetClass: string | null; spec: { kind: string; distribution?: string; lambda?: number }; label: string }[]; backtest: { statement: string } };
    };
  } | null;
}

async function runToCompletion(api: APIRequestContext, periodId: string): Promise<RunJson> {
  const id = await completedRunOf(api, periodId);
  return (await json<{ run: RunJson }>(api, `/api/runs/${id}`)).run;
}

const var99 = (r: RunJson) => r.results!.monthEnd.methods.find((m) => m.method === "parametric")!.byConfidence.find((c) => c.confidence === 0.99)!.oneDay.var;

test("GARCH(1,1)-t for equities and EWMA 0.97 for FX: approved, run, and said exactly so on the run page and in both packs", async ({ page, browser }) => {
  const api = await signedInApi(ANALYST);
  const { periods } = await json<{ periods: { id: string; periodEnd: string }[] }>(api, "/api/periods");
  const periodId = periods.find((p) => p.periodEnd === "2026-11-30")!.id;
  const before = await runToCompletion(api, periodId);
  // an earlier spec (the keyboard-only approval) may leave Pellam a draft awaiting co-approval: this path starts from
  // the approved version, so that draft is discarded (it stays in the history as discarded)
  const { versions } = await json<{ versions: { id: string; status: string }[] }>(api, "/api/method");
  for (const v of versions.filter((x) => x.status === "draft")) {
    const discarded = await api.post(`/api/method/${v.id}/discard`, { data: { reason: "Set aside for the per-asset-class method path." } });
    expect(discarded.status(), await discarded.text()).toBe(200);
  }

  // the draft: each factor's volatility from its asset class; equities GARCH(1,1)-t, FX EWMA 0.97
  await signInThroughPage(page, ANALYST);
  await page.goto("/method");
  await page.getByRole("button", { name: "Start a new version" }).click();
  await page.getByLabel("Why does version 1 need to change?").fill("Equities and FX follow their own volatility models in every figure, not only in the factor report.");
  await page.getByRole("button", { name: "Start the draft" }).click();
  await expect(page).toHaveURL(/\/method\/[0-9a-f-]{36}$/);
  const methodUrl = page.url();
  // the draft's number: 2 on a fresh demo, more where an earlier spec's draft was discarded above
  const { versions: drafted } = await json<{ versions: { id: string; version: number }[] }>(api, "/api/method");
  const v = drafted.find((x) => methodUrl.endsWith(x.id))!.version;
  await page.getByLabel("Portfolio volatilities", { exact: true }).selectOption("asset-class");
  const equities = page.getByRole("group", { name: "Equities" });
  await equities.getByLabel("Estimator").selectOption("garch");
  await equities.getByLabel("Errors").selectOption("t");
  const fx = page.getByRole("group", { name: "Foreign exchange" });
  await fx.getByLabel("Estimator").selectOption("ewma");
  await fx.getByLabel("λ value").fill("0.97");
  await expect(page.getByLabel("Backtest parameters")).toHaveValue("every");
  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Draft saved." })).toBeVisible();
  await page.screenshot({ path: "test-results/screens/method-governs-draft.png", fullPage: true });

  // the evidence: this draft, version 1 and the standard candidates backtested on the book
  await page.getByRole("button", { name: "Attach evidence" }).click();
  const book = page.getByTestId("book-evidence");
  await expect(book).toBeVisible({ timeout: 120_000 });
  const table = page.getByTestId("book-evidence-table");
  await expect(table.getByRole("rowheader", { name: `Version ${v} (this statement)` })).toBeVisible();
  await expect(table.getByRole("rowheader", { name: "Approved version 1" })).toBeVisible();
  for (const name of ["Moving average, 20 days", "Moving average, 250 days", "EWMA, λ = 0.94", "EWMA, λ fitted", "GARCH(1,1), normal errors", "GARCH(1,1), Student-t errors"]) {
    await expect(table.getByRole("rowheader", { name, exact: true })).toBeVisible();
  }
  await expect(page.getByText(/Backtest exceptions of each method on the firm's book, last 250 days/)).toBeVisible();
  await book.scrollIntoViewIfNeeded();
  await page.screenshot({ path: "test-results/screens/method-governs-evidence.png", fullPage: true });

  // approved by the analyst, co-approved by the compliance head
  await page.getByRole("button", { name: `Approve version ${v}…` }).click();
  await page.getByRole("group", { name: new RegExp(`Approve version ${v}\\?`) }).getByRole("button", { name: "Yes, approve" }).click();
  await expect(page.getByText(/waiting for a compliance head to co-approve/)).toBeVisible();
  const headPage = await browser.newPage();
  await signInThroughPage(headPage, HEAD);
  await headPage.goto(methodUrl);
  await headPage.getByRole("button", { name: `Co-approve version ${v}…` }).click();
  await headPage.getByRole("group", { name: new RegExp(`Co-approve version ${v}`) }).getByRole("button", { name: "Yes, co-approve" }).click();
  await expect(headPage.getByRole("heading", { name: `Method statement · version ${v}` })).toBeVisible();
  await headPage.close();

  // the run under version 2: the VaR changes; every equity factor follows GARCH(1,1)-t, the FX factor EWMA 0.97
  const after = await runToCompletion(api, periodId);
  expect(var99(after)).not.toBe(var99(before));
  const model = after.results!.monthEnd.model!;
  expect(model.covariance).toBe("per-factor");
  const equityFactors = model.factors.filter((f) => f.assetClass === "equity");
  const fxFactors = model.factors.filter((f) => f.assetClass === "fx");
  expect(equityFactors.length).toBeGreaterThan(0);
  expect(fxFactors.length).toBeGreaterThan(0);
  for (const f of equityFactors) expect(f.spec).toMatchObject({ kind: "garch", distribution: "t" });
  for (const f of fxFactors) expect(f.spec).toMatchObject({ kind: "ewma", lambda: 0.97 });
  expect(model.backtest.statement).toMatch(/out of sample/);

  await page.goto(`/periods/${periodId}/runs/${after.id}`);
  const factorsTable = page.getByTestId("model-factors");
  await expect(factorsTable).toBeVisible();
  for (const f of equityFactors) await expect(factorsTable.getByRole("row", { name: new RegExp(`^${f.factor}\\b`) })).toContainText("GARCH(1,1), Student-t errors");
  for (const f of fxFactors) await expect(factorsTable.getByRole("row", { name: new RegExp(`^${f.factor}\\b`) })).toContainText("EWMA, λ = 0.97");
  await expect(page.getByTestId("model-statements")).toContainText("out of sample");
  await expect(page.getByTestId("export-inputs")).toBeVisible();
  await page.getByTestId("model-factors").scrollIntoViewIfNeeded();
  await page.screenshot({ path: "test-results/screens/method-governs-run.png", fullPage: true });

  // both packs of the draft filing from that run say the same
  const marked = await api.post(`/api/runs/${after.id}/use-for-filing`, { data: { confirm: true } });
  expect(marked.status(), await marked.text()).toBe(200);
  const prepared = await api.post(`/api/periods/${periodId}/filing`, { data: {} });
  expect(prepared.status(), await prepared.text()).toBeLessThan(300);
  const filingId = (await json<{ current: { id: string } }>(api, `/api/periods/${periodId}/filing`)).current.id;
  const word = await api.get(`/api/filings/${filingId}/packs/docx`);
  expect(word.status()).toBe(200);
  const docXml = await (await JSZip.loadAsync(await word.body())).file("word/document.xml")!.async("string");
  const docText = [...docXml.matchAll(/<w:t(?:\s[^>]*)?>([^<]*)<\/w:t>/g)].map((m) => m[1]).join(" ").replace(/&amp;/g, "&");
  const workbook = await api.get(`/api/filings/${filingId}/packs/xlsx`);
  expect(workbook.status()).toBe(200);
  const zip = await JSZip.loadAsync(await workbook.body());
  const sheetText = (await Promise.all(Object.keys(zip.files).filter((n) => /^xl\/(sharedStrings|worksheets\/sheet\d+)\.xml$/.test(n)).map((n) => zip.file(n)!.async("string")))).join(" ");
  for (const f of equityFactors) {
    expect(docText).toContain(f.label);
    expect(sheetText).toContain(`Model used: ${f.factor}`);
  }
  for (const f of fxFactors) {
    expect(docText).toContain(f.label);
    expect(sheetText).toContain(f.label);
  }
  expect(docText).toContain("Backtest and VaR history: out of sample.");
  expect(docText).toContain("Method annex: the model of each factor and the candidate methods");
  await api.dispose();
});
