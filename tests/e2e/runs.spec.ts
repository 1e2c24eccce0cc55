import { test, expect, type Page } from "@playwright/test";
import { DEMO_USERS, signInThroughPage, signedInApi } from "./helpers";

const ANALYST = DEMO_USERS.find((u) => u.email === "priya.castell@northmoor.example")!.email;
const OFFICER = DEMO_USERS.find((u) => u.email === "tomas.reyne@northmoor.example")!.email;
const AUDITOR = DEMO_USERS.find((u) => u.email === "oskar.lind@northmoor.example")!.email;
const SCREENS = "test-results/screens";

test.describe.configure({ mode: "serial" });

async function demoPeriodId(): Promise<string> {
  const api = await signedInApi(ANALYST);
  const periods = (await (await api.get("/api/periods")).json()).periods as { id: string; periodEnd: string }[];
  await api.dispose();
  return periods.find((p) => p.periodEnd === "2026-11-30")!.id;
}

async function openTab(page: Page, name: string) {
  await page.getByRole("navigation", { name: "Run pages" }).getByRole("link", { name, exact: true }).click();
  await expect(page.getByRole("navigation", { name: "Run pages" }).getByRole("link", { name, exact: true })).toHaveAttribute("aria-current", "page");
}

test.describe("runs and results", () => {
  let periodId = "";
  let runUrl = "";

  test("the risk analyst is refused for missing history, starts a run without those factors and follows its progress", async ({ page }) => {
    periodId = await demoPeriodId();
    await signInThroughPage(page, ANALYST);
    await page.getByRole("navigation", { name: "Month end" }).getByRole("link", { name: "Runs" }).click();
    await expect(page.getByRole("heading", { name: "Runs", level: 1 })).toBeVisible();
    await page.getByRole("link", { name: "November 2026" }).click();
    await expect(page).toHaveURL(new RegExp(`/periods/${periodId}/runs$`));
    await expect(page.getByRole("heading", { name: "Runs: November 2026" })).toBeVisible();
    await expect(page.getByRole("note").filter({ hasText: "Draft" }).first()).toBeVisible();
    // the list loads after the page: count its rows only once it has loaded (earlier specs may have left runs)
    await expect(page.getByText("Loading the runs…")).toHaveCount(0);
    const before = await page.getByTestId("run-row").count();
    await page.screenshot({ path: `${SCREENS}/runs-list-before.png`, fullPage: true });

    await page.getByRole("button", { name: "Start run" }).click();
    const refusal = page.getByTestId("run-refusal");
    await expect(refusal).toContainText("NMB-EQ-WYNCOTE (no price history up to the period end)");
    await expect(refusal).toContainText("TRADING · NMB-EQ-WYNCOTE");
    await page.screenshot({ path: `${SCREENS}/runs-refused.png`, fullPage: true });

    await page.getByRole("button", { name: "Start without these factors" }).click();
    // starting a run opens it; the run is on the server: the list shows it in progress or already completed
    await expect(page).toHaveURL(/\/runs\/[0-9a-f-]{36}$/);
    await page.screenshot({ path: `${SCREENS}/runs-progress.png`, fullPage: true });
    await page.goto(`/periods/${periodId}/runs`);
    await expect(page.getByText("Loading the runs…")).toHaveCount(0);
    await expect(page.getByTestId("run-row")).toHaveCount(before + 1);
    const newest = page.getByTestId("run-row").first();
    await expect(newest.getByText("Completed")).toBeVisible({ timeout: 45_000 });
    await expect(page.getByTestId("run-progress")).toHaveCount(0);
    await expect(page.getByRole("button", { name: "Start run" })).toBeEnabled();
    await page.screenshot({ path: `${SCREENS}/runs-list-completed.png`, fullPage: true });

    await newest.getByRole("link").first().click();
    await expect(page).toHaveURL(/\/runs\/[0-9a-f-]{36}$/);
    runUrl = new URL(page.url()).pathname;
  });

  test("the summary shows every headline figure with the caution, the method version, the hashes and the engine version", async ({ page }) => {
    await signInThroughPage(page, ANALYST);
    await page.goto(runUrl);
    await expect(page.getByTestId("var-table")).toBeVisible();
    await expect(page.getByRole("note").filter({ hasText: "Draft computed under the stated method" })).toBeVisible();
    await expect(page.getByTestId("var-table")).toContainText("Parametric");
    await expect(page.getByTestId("var-table")).toContainText("Historical simulation");
    await expect(page.getByTestId("var-table")).toContainText("99 %");
    await expect(page.getByTestId("var-table")).toContainText("€");
    await expect(page.getByTestId("stress-window")).toContainText("found by search");
    await expect(page.getByTestId("capital-table")).toContainText("Multiplier m_c");
    await expect(page.getByTestId("capital-table")).toContainText("Stressed VaR term");
    await expect(page.getByTestId("capital-total")).toContainText("€");
    await expect(page.getByTestId("backtest-zone")).toContainText(/(Green|Yellow|Red) zone/);
    await expect(page.getByTestId("quality-items")).toHaveText(/^\d+$/);
    await expect(page.getByTestId("method-version")).toContainText(/Version \d+/);
    await expect(page.getByTestId("input-hashes")).toContainText(/[0-9a-f]{64}/);
    await expect(page.getByTestId("engine-version")).toHaveText(/^\d+\.\d+\.\d+$/);
    await expect(page.getByTestId("excluded-factors")).toContainText("NMB-EQ-WYNCOTE");
    await page.screenshot({ path: `${SCREENS}/run-summary.png`, fullPage: true });
  });

  test("the risk factors table sorts and filters, with every estimator's parameters", async ({ page }) => {
    await signInThroughPage(page, ANALYST);
    await page.goto(runUrl);
    await openTab(page, "Risk factors");
    await expect(page.getByTestId("volatility-statement")).toContainText("one EWMA covariance for every factor");
    const rows = page.getByTestId("factor-row");
    await expect(rows.first()).toBeVisible();
    const all = await rows.count();
    expect(all).toBeGreaterThan(40);
    await page.getByLabel("Asset class").selectOption("fx");
    await expect(rows).toHaveCount(3);
    await page.getByLabel("Asset class").selectOption("");
    await page.getByRole("searchbox", { name: "Factor" }).fill("EQ-ALDER");
    await expect(rows).toHaveCount(1);
    await rows.first().getByRole("button", { name: "NMB-EQ-ALDER" }).click();
    await expect(page.getByText(/GARCH\(1,1\), Student-t errors \(ν = [\d.]+\), zero mean.* \(chosen\)/)).toBeVisible();
    await expect(page.getByText(/omega .*alpha .*beta/).first()).toBeVisible();
    await page.screenshot({ path: `${SCREENS}/run-factors-detail.png`, fullPage: true });
    await page.getByRole("searchbox", { name: "Factor" }).fill("");
    await page.getByRole("button", { name: /^Factor/ }).click();
    await expect(page.getByRole("columnheader", { name: /^Factor/ })).toHaveAttribute("aria-sort", "ascending");
    await expect(rows.first()).toContainText("CHFEUR");
    await page.screenshot({ path: `${SCREENS}/run-factors.png`, fullPage: true });
  });

  test("contributions by position, asset class and currency, each with a chart and a table", async ({ page }) => {
    await signInThroughPage(page, ANALYST);
    await page.goto(runUrl);
    await openTab(page, "Contributions");
    await expect(page.getByText("Component VaR by asset class, one day, 99 %")).toBeVisible();
    await expect(page.getByText("Component VaR by the positions' currency, one day, 99 %")).toBeVisible();
    await expect(page.getByText(/largest component VaRs by position/)).toBeVisible();
    // the demo November book: 56 positions, one left out of every figure (below)
    await expect(page.getByTestId("contributions-table").locator("tbody tr")).toHaveCount(55);
    await expect(page.getByText(/Left out of every figure: TRADING · NMB-EQ-WYNCOTE/)).toBeVisible();
    await page.getByLabel("VaR method").selectOption("historical");
    await expect(page.getByText(/Historical simulation, 99 %/)).toBeVisible();
    await page.screenshot({ path: `${SCREENS}/run-contributions.png`, fullPage: true });
  });

  test("volatility of a chosen factor under each estimator, and the GARCH term structure", async ({ page }) => {
    await signInThroughPage(page, ANALYST);
    await page.goto(runUrl);
    await openTab(page, "Volatility");
    await page.getByTestId("factor-select").selectOption("NMB-EQ-ALDER");
    await expect(page.getByText(/NMB-EQ-ALDER: conditional volatility \(annualised, %\) under each estimator/)).toBeVisible();
    await expect(page.getByTestId("estimator-table")).toContainText(/GARCH\(1,1\), Student-t errors \(ν = [\d.]+\), zero mean.* \(chosen\)/);
    await expect(page.getByTestId("term-table")).toContainText("Long run");
    await expect(page.locator(".recharts-line").first()).toBeVisible();
    await page.screenshot({ path: `${SCREENS}/run-volatility.png`, fullPage: true });
  });

  test("the backtest day by day with its zone, exceptions and tests", async ({ page }) => {
    await signInThroughPage(page, ANALYST);
    await page.goto(runUrl);
    await openTab(page, "Backtest");
    await expect(page.getByTestId("backtest-zone")).toContainText(/(Green|Yellow|Red) zone/);
    await expect(page.getByTestId("backtest-exceptions")).toContainText("of 250 days");
    await expect(page.getByTestId("backtest-tests")).toContainText("Kupiec test");
    await expect(page.getByTestId("backtest-tests")).toContainText("Christoffersen test of independence");
    await expect(page.getByText(/Daily P&L of today's book \(EUR\)/)).toBeVisible();
    await page.screenshot({ path: `${SCREENS}/run-backtest.png`, fullPage: true });
  });

  test("the change since last period explains the move from October's filed run, step by step", async ({ page }) => {
    // The demo seed walks October 2026 to a filed filing (db/seed-history.ts), so November's run has a comparison.
    await signInThroughPage(page, ANALYST);
    await page.goto(runUrl);
    await openTab(page, "Change since last period");
    const table = page.getByTestId("change-table");
    await expect(table).toBeVisible();
    await expect(table).toContainText("Whole change");
    await expect(page.getByRole("link", { name: /filing run of the period ending 31 Oct 2026/ })).toBeVisible();
    await page.screenshot({ path: `${SCREENS}/run-change.png`, fullPage: true });
  });

  test("reproduce passes on the demo run, and the run is chosen for the filing", async ({ page }) => {
    await signInThroughPage(page, ANALYST);
    await page.goto(runUrl);
    await page.getByRole("button", { name: "Reproduce" }).click();
    await expect(page).not.toHaveURL(new RegExp(`${runUrl}$`));
    await expect(page).toHaveURL(/\/runs\/[0-9a-f-]{36}$/);
    const reproduction = page.getByTestId("reproduction");
    await expect(reproduction).toContainText("Reproduced", { timeout: 45_000 });
    await expect(reproduction).toContainText("Every figure matches the original");
    await page.screenshot({ path: `${SCREENS}/run-reproduced.png`, fullPage: true });

    await page.goto(runUrl);
    await page.getByRole("button", { name: "Use for the filing" }).click();
    await expect(page.getByText("Used for the filing").first()).toBeVisible();
    await expect(page.getByRole("button", { name: "Use for the filing" })).toHaveCount(0);
  });

  for (const [who, email] of [
    ["compliance officer", OFFICER],
    ["auditor", AUDITOR],
  ] as const) {
    test(`the ${who} reads the runs but cannot start or change them`, async ({ page }) => {
      await signInThroughPage(page, email);
      await page.goto(`/periods/${periodId}/runs`);
      await expect(page.getByTestId("run-row").first()).toBeVisible();
      await expect(page.getByRole("button", { name: "Start run" })).toHaveCount(0);
      await expect(page.getByText("Risk analysts start runs")).toBeVisible();
      await page.goto(runUrl);
      await expect(page.getByTestId("var-table")).toBeVisible();
      await expect(page.getByRole("note").filter({ hasText: "Draft computed under the stated method" })).toBeVisible();
      await expect(page.getByRole("button", { name: "Reproduce" })).toHaveCount(0);
      await expect(page.getByRole("button", { name: "Use for the filing" })).toHaveCount(0);
      if (who === "auditor") await page.screenshot({ path: `${SCREENS}/run-summary-auditor.png`, fullPage: true });

      const api = await signedInApi(email);
      const runId = runUrl.split("/").pop()!;
      expect((await api.post(`/api/periods/${periodId}/runs`, { data: { excludeShortHistory: true } })).status()).toBe(403);
      expect((await api.post(`/api/runs/${runId}/reproduce`, { data: {} })).status()).toBe(403);
      expect((await api.post(`/api/runs/${runId}/use-for-filing`, { data: { confirm: true } })).status()).toBe(403);
      expect((await api.get(`/api/runs/${runId}`)).status()).toBe(200);
      await api.dispose();
    });
  }
});
