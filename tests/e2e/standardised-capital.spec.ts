/**
 * Standardised capital as the demo firm's compliance officer: the capital rule profile in Settings (version 2 files
 * the standardised figure; a change is refused field by field, then saved as a new version; the defaults copied and
 * adapted back), a positions file lacking a bond's maturity refused naming the row and the column, and the run's
 * Capital tab with every building block line by line beside the VaR-based figure. The profile ends as it began
 * (standardised filed, 1996 rates), so the specs after this one see the seeded state's figures.
 */
import { test, expect } from "@playwright/test";
import { readFileSync } from "node:fs";
import { DataPage } from "./pages/data";
import { csv, DEMO_USERS, periodIdEnding, signInThroughPage, signedInApi } from "./helpers";

const OFFICER = DEMO_USERS.find((u) => u.email === "tomas.reyne@northmoor.example")!.email;
const ANALYST = DEMO_USERS.find((u) => u.email === "priya.castell@northmoor.example")!.email;
const SCREENS = "test-results/screens";

test.describe.configure({ mode: "serial" });

test.describe("standardised capital", () => {
  test("the compliance officer reads the profile, is told what is wrong, saves a version, and copies the defaults", async ({ page }) => {
    await signInThroughPage(page, OFFICER);
    await page.goto("/settings");
    const form = page.getByRole("form", { name: "Capital rule profile" });
    await expect(form).toBeVisible();
    await expect(form.getByRole("note")).toContainText("Your local rules and the regulator's current requirements govern");
    await expect(form).toContainText("Version 2 in force");
    await expect(form.getByLabel("Filed figure")).toHaveValue("standardised");
    await expect(form.getByLabel("A run computes")).toHaveValue("both");
    await expect(form.getByLabel("Risk weight, band 1–3 m")).toHaveValue("0.2");
    await page.screenshot({ path: `${SCREENS}/capital-profile-settings.png`, fullPage: true });

    // every version needs a reason, and the filed figure must be one the run computes
    await form.getByLabel("Between zones 1 and 3 (%)").fill("150");
    await form.getByRole("button", { name: "Save as version 3" }).click();
    await expect(form.getByText("Say why this version is made (at least 5 characters).")).toBeVisible();
    await form.getByLabel("Why this version").fill("Local rules: 150 % between zones 1 and 3.");
    await form.getByLabel("A run computes").selectOption("internal_models");
    await form.getByRole("button", { name: "Save as version 3" }).click();
    await expect(form.getByText("The filed figure must be one the run computes.")).toBeVisible();
    await page.screenshot({ path: `${SCREENS}/capital-profile-refused.png`, fullPage: true });
    await form.getByLabel("A run computes").selectOption("both");
    await form.getByRole("button", { name: "Save as version 3" }).click();
    await expect(form.getByRole("status")).toHaveText("Saved as version 3. Runs started from now use it.");
    await expect(form).toContainText("Version 3 in force");
    await expect(form.getByLabel("Between zones 1 and 3 (%)")).toHaveValue("150");
    await expect(form.getByRole("table", { name: "Versions" })).toContainText("Local rules: 150 % between zones 1 and 3.");

    // copy the default profile, adapt it to file the standardised figure again
    await form.getByRole("button", { name: "Start from the default profile" }).click();
    await expect(form.getByLabel("Between zones 1 and 3 (%)")).toHaveValue("100");
    await expect(form.getByLabel("A run computes")).toHaveValue("internal_models");
    await form.getByLabel("A run computes").selectOption("both");
    await form.getByLabel("Filed figure").selectOption("standardised");
    await form.getByLabel("Show the risk-weighted-asset equivalent (capital × 12.5)").check();
    await form.getByLabel("Why this version").fill("Back to the 1996 rates; the standardised figure is filed.");
    await form.getByRole("button", { name: "Save as version 4" }).click();
    await expect(form.getByRole("status")).toHaveText("Saved as version 4. Runs started from now use it.");
    await expect(form.getByRole("table", { name: "Versions" }).getByRole("row")).toHaveCount(5);
    await page.screenshot({ path: `${SCREENS}/capital-profile-versions.png`, fullPage: true });
  });

  test("a positions file lacking a bond's maturity is refused before confirmation, naming the row and the column", async ({ page }) => {
    await signInThroughPage(page, OFFICER);
    const data = new DataPage(page);
    await data.open();
    await page.getByLabel("Reporting period").selectOption({ label: "November 2026 (ends 2026-11-30)" });
    const [head, ...rows] = readFileSync("templates/demo/northmoor-positions-2026-11.csv", "utf8").trimEnd().split("\n");
    const columns = head.split(",");
    const equity = rows.find((r) => r.includes(",NMB-EQ-ALDER,"))!;
    const bond = rows.find((r) => r.includes(",NMB-GB-AUR-2028,"))!.split(",");
    bond[columns.indexOf("maturity_date")] = "";
    const bill = rows.find((r) => r.includes(",NMB-TB-AUR-2027-02,"))!;
    await data.upload("positions", csv("northmoor-positions-no-maturity.csv", [head, equity, bond.join(","), bill].join("\n") + "\n"));
    const problem = data.problems().getByRole("row").filter({ hasText: "maturity_date" });
    await expect(problem).toHaveCount(1);
    await expect(problem.getByRole("cell").first()).toHaveText("3");
    await expect(problem).toContainText("column residual_maturity_years: a bond needs a residual maturity (residual_maturity_years or maturity_date)");
    await expect(problem).toContainText("the firm files the standardised capital figure");
    await data.cancelRefused(() => page.screenshot({ path: `${SCREENS}/capital-positions-refused.png`, fullPage: true }));
  });

  test("the November run's Capital tab shows every building block line by line beside the VaR-based figure", async ({ page }) => {
    const api = await signedInApi(ANALYST);
    const periodId = await periodIdEnding(api, "2026-11-30");
    const started = await api.post(`/api/periods/${periodId}/runs`, { data: { excludeShortHistory: true } });
    expect(started.status(), await started.text()).toBe(202);
    const runId = (await started.json()).run.id as string;
    await expect
      .poll(async () => ((await (await api.get(`/api/runs/${runId}`)).json()).run?.status as string | undefined) ?? "", { timeout: 120_000, intervals: [1000] })
      .toBe("completed");
    await api.dispose();

    await signInThroughPage(page, OFFICER);
    await page.goto(`/periods/${periodId}/runs/${runId}`);
    await page.getByRole("navigation", { name: "Run pages" }).getByRole("link", { name: "Capital", exact: true }).click();
    await expect(page).toHaveURL(new RegExp(`/runs/${runId}/capital$`));
    await expect(page.getByRole("note").filter({ hasText: "Draft computed under the stated method" })).toBeVisible();
    const filed = page.getByTestId("filed-figure");
    await expect(filed).toContainText("Filed figure · Standardised 1996 building blocks");
    await expect(filed).toContainText("€");
    await expect(filed).toContainText("Risk-weighted-asset equivalent (× 12.5)");
    await expect(page.getByTestId("comparison-figure")).toContainText("Comparison · Internal models (value-at-risk based)");
    await expect(page.getByText("Capital rule profile version 4")).toBeVisible();

    const blocks = page.getByTestId("blocks-table");
    for (const label of ["Interest rate: specific risk", "Interest rate: general market risk", "Equities: specific risk", "Equities: general market risk", "Foreign exchange and gold", "Commodities", "Options (carve-out)", "Total market-risk capital"]) {
      await expect(blocks).toContainText(label);
    }
    const eur = page.getByTestId("ladder-EUR");
    await expect(eur.getByRole("table").first().getByRole("row")).toHaveCount(16); // header + the 15 bands of the 1996 ladder
    await expect(eur).toContainText("Zone 1 against zone 2");
    await expect(eur).toContainText("Residual net position");
    await expect(page.getByTestId("ladder-GBP")).toBeVisible();
    await expect(page.getByTestId("ladder-USD")).toBeVisible();
    await expect(page.getByTestId("equity-table")).toContainText("DE");
    await expect(page.getByTestId("equity-table")).toContainText("US");
    await expect(page.getByTestId("fx-table")).toContainText("USD");
    await expect(page.getByTestId("commodity-table")).toContainText("crude oil");
    await expect(page.getByText("What went on the ladders")).toBeVisible();
    await page.screenshot({ path: `${SCREENS}/capital-tab.png`, fullPage: true });
    await page.getByTestId("ladder-EUR").screenshot({ path: `${SCREENS}/capital-tab-eur-ladder.png` });
  });
});
