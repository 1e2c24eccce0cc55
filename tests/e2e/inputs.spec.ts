/**
 * Inputs that cannot be misread and runs that go stale: the Data page's column guide, a refused file with positions in
 * SEK (no SEKEUR series) and a market value written in USD, dates read day first when chosen, and a stale run —
 * badge, notice, period step, and the filing choice refused. The stale run is Pellam's November run: its positions
 * are restated here, so that Northmoor's demo period stays as the later specs expect it.
 */
import { test, expect } from "@playwright/test";
import { readFileSync } from "node:fs";
import { DataPage } from "./pages/data";
import { completedRunOf, csv, DEMO_USERS, periodIdEnding, SECOND_FIRM_USERS, signInThroughPage, signedInApi } from "./helpers";

const SCREENS = "test-results/screens";
const OFFICER = DEMO_USERS[1].email; // Northmoor's compliance officer
const PELLAM = SECOND_FIRM_USERS.find((u) => u.email === "june.okafor@pellam.example")!.email; // officer and analyst

test.describe.serial("inputs and stale runs", () => {
  test("the Data page explains every positions column, with units, examples and the asset-class spellings", async ({ page }) => {
    await signInThroughPage(page, OFFICER);
    const data = new DataPage(page);
    await data.open();
    const guide = page.getByTestId("column-guide");
    await expect(guide.getByRole("heading", { name: "Positions file: the columns" })).toBeVisible();
    const rowOf = (column: string) => guide.getByTestId("column-guide-row").filter({ has: page.locator("th code", { hasText: new RegExp(`^${column}$`) }) });
    for (const column of ["as_of", "quantity", "price", "market_value", "market_value_currency", "market_value_note"]) await expect(rowOf(column)).toBeVisible();
    await expect(rowOf("market_value_currency")).toContainText("converts it at the period-end rate");
    await expect(rowOf("market_value")).toContainText("0.5 %");
    await expect(rowOf("price")).toContainText("the instrument's currency per unit");
    await expect(guide.getByTestId("asset-class-row").filter({ hasText: "corporate_bond" })).toContainText("bond");
    await expect(guide.getByTestId("asset-class-row").filter({ hasText: "Equities" })).toContainText("stock");
    await expect(page.getByLabel("Dates in the file").first()).toBeVisible();
    await guide.scrollIntoViewIfNeeded();
    await guide.screenshot({ path: `${SCREENS}/data-column-guide.png` });
  });

  test("a SEK position without a SEKEUR series and a value written in USD are refused, naming the rows; dates read day first", async ({ page }) => {
    await signInThroughPage(page, OFFICER);
    const data = new DataPage(page);
    await data.open();
    await page.getByLabel("Reporting period").selectOption({ label: "November 2026 (ends 2026-11-30)" });
    await page.locator("#positions-upload-date-format").selectOption("day-month-year");
    const file = [
      "as_of,book,instrument_id,instrument_name,asset_class,currency,quantity,price,market_value,delta_exposure",
      "30/11/2026,TRADING,NMB-EQ-SKOGSVIK,Skogsvik Timber AB,stock,SEK,12000,245.50,2946000.00,",
      "30/11/2026,TRADING,NMB-EQ-ORRERY,Orrery Semiconductor Inc.,equity,USD,100,290.00,29000.00,",
      "30/11/2026,TRADING,NMB-CB-CALDER-2029,Calder Fine Chemicals 4% 2029,bond,EUR,100,101.25,10125.00,",
    ].join("\n");
    await data.upload("positions", csv("northmoor-positions-sek.csv", `${file}\n`));
    const problems = data.problems();
    await expect(problems).toContainText("currency SEK has no SEKEUR exchange-rate series");
    await expect(problems).toContainText("it looks like a value in USD: add a market_value_currency column");
    await expect(problems).not.toContainText("is not a date");
    await expect(problems).not.toContainText("is not an asset class");
    await data.cancelRefused(() => page.screenshot({ path: `${SCREENS}/upload-sek-refused.png`, fullPage: true }));
  });

  test("restated positions make the period's runs stale: badge, notice, step, the draft's notice, and the filing choice refused", async ({ page }) => {
    const api = await signedInApi(PELLAM);
    const periodId = await periodIdEnding(api, "2026-11-30");
    const completedRun = async () => {
      return completedRunOf(api, periodId);
    };
    // one run chosen for the filing with a draft assembled from it, and a second one not chosen
    const filingRunId = await completedRun();
    expect((await api.post(`/api/runs/${filingRunId}/use-for-filing`, { data: { confirm: true } })).status()).toBe(200);
    const draft = await api.post(`/api/periods/${periodId}/filing`, { data: {} });
    expect(draft.status(), await draft.text()).toBe(200);
    const runId = await completedRun();
    expect((await (await api.get(`/api/runs/${runId}`)).json()).freshness).toEqual({ stale: false, changes: [] });

    // the officer restates the book: one position resized, its market value left to be computed
    await signInThroughPage(page, PELLAM);
    const data = new DataPage(page);
    const [head, first, ...rest] = readFileSync("templates/demo/pellam-positions-2026-11.csv", "utf8").trimEnd().split("\n");
    const cells = first.split(",");
    cells[6] = String(Number(cells[6]) + 500);
    cells[head.split(",").indexOf("market_value")] = "";
    await data.open();
    await page.getByLabel("Reporting period").selectOption({ label: "November 2026 (ends 2026-11-30)" });
    await data.upload("positions", csv("pellam-positions-2026-11-restated.csv", [head, cells.join(","), ...rest].join("\n") + "\n"));
    await data.confirm();

    await page.goto(`/periods/${periodId}/runs`);
    const row = page.getByTestId("run-row").filter({ has: page.getByTestId("stale-run-badge") }).first();
    await expect(row.getByTestId("stale-run-badge")).toContainText("Stale");
    await page.screenshot({ path: `${SCREENS}/runs-stale-badge.png`, fullPage: true });

    await page.goto(`/periods/${periodId}/runs/${runId}`);
    await expect(page.getByTestId("stale-run-notice")).toContainText('The positions were superseded by "pellam-positions-2026-11-restated.csv"');
    await expect(page.getByRole("button", { name: "Use for the filing" })).toBeDisabled();
    await expect(page.getByTestId("stale-choice-note")).toContainText("A stale run cannot be chosen for the filing");
    await page.screenshot({ path: `${SCREENS}/run-stale-notice.png`, fullPage: true });

    const refused = await api.post(`/api/runs/${runId}/use-for-filing`, { data: { confirm: true } });
    expect(refused.status()).toBe(409);
    expect((await refused.json()).error.message).toContain("This run is stale, so it cannot be chosen for the filing");

    await page.goto(`/periods/${periodId}`);
    await expect(page.getByTestId("step-note-run")).toContainText("Every completed run is stale");
    await expect(page.getByTestId("step-note-filing")).toContainText("The run chosen for the filing is stale");
    await page.screenshot({ path: `${SCREENS}/period-stale-step.png`, fullPage: true });

    await page.goto(`/periods/${periodId}/filing`);
    await expect(page.getByTestId("stale-run-notice")).toContainText("The run this draft (version 1) was assembled from is stale");
    await expect(page.getByTestId("stale-run-notice")).toContainText("pellam-positions-2026-11-restated.csv");
    await page.screenshot({ path: `${SCREENS}/filing-stale-draft.png` });
    await api.dispose();
  });
});
