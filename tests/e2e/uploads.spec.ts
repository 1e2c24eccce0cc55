import { test, expect } from "@playwright/test";
import { DataPage } from "./pages/data";
import { csv, demoFile, DEMO_USERS, resizedDemoBook, SECOND_FIRM_USERS, signInThroughPage, signedInApi } from "./helpers";

const officer = DEMO_USERS[1].email;
const analyst = DEMO_USERS[2].email;

test.describe.serial("month-end data intake", () => {
  test("the compliance officer sees a bad file's problems, cancels it, then confirms a good one", async ({ page }) => {
    await signInThroughPage(page, officer);
    const data = new DataPage(page);
    const problems = await data.uploadBadDemoBook();
    await expect(problems).toContainText("2026-02-30 does not exist");
    await expect(problems).toContainText("is in the future");
    await expect(problems).toContainText("duplicate position");
    await data.cancelRefused(() => page.screenshot({ path: "test-results/screens/upload-bad-positions.png", fullPage: true }));

    // A corrected book for the month: the demo file with one position resized (so it is a new file).
    const book = resizedDemoBook(10);
    await data.open();
    await data.upload("positions", csv("northmoor-positions-2026-11-v2.csv", book.text));
    await expect(page.getByTestId("total-positions")).toHaveText(String(book.positions));
    await expect(page.getByTestId("rows-table")).toBeVisible();
    await page.screenshot({ path: "test-results/screens/upload-preview.png", fullPage: true });
    await data.confirm();

    await data.open();
    const rows = page.getByTestId("upload-row");
    await expect(rows.filter({ hasText: "northmoor-positions-2026-11-v2.csv" })).toContainText("Confirmed");
    await expect(rows.filter({ hasText: "northmoor-positions-2026-11.csv" }).first()).toContainText("Superseded");
    await expect(rows.filter({ hasText: "northmoor-positions-bad.csv" })).toContainText("Cancelled");
    await page.screenshot({ path: "test-results/screens/data-page.png", fullPage: true });
  });

  test("the risk analyst extends the price history; a changed close is kept as a correction", async ({ page }) => {
    await signInThroughPage(page, analyst);
    const data = new DataPage(page);
    await data.open();
    const extension = demoFile("northmoor-prices-extension.csv");
    await data.upload("prices", csv("northmoor-prices-extension.csv", extension));
    await data.confirm();
    await expect(page.getByTestId("corrected-count")).toHaveText("1");
    // The same file again is recognised by its SHA-256 and not stored twice.
    await data.open();
    await data.upload("prices", csv("northmoor-prices-extension (copy).csv", extension));
    await expect(page).toHaveURL(/duplicate=1/);
    await expect(page.getByText("This exact file (same SHA-256) was uploaded before")).toBeVisible();
  });

  test("the data-quality report shows the planted problems of the demo data", async ({ page }) => {
    await signInThroughPage(page, officer);
    await page.goto("/periods");
    await page.getByRole("link", { name: "November 2026" }).click();
    await page.getByRole("link", { name: "Data-quality report" }).click();
    for (const check of ["stale", "gap", "extreme-return", "no-history", "missing-fx"]) {
      await expect(page.getByTestId(`check-${check}`)).toBeVisible();
    }
    await page.screenshot({ path: "test-results/screens/data-quality.png", fullPage: true });
    await page.getByTestId("check-missing-fx").click();
    await expect(page.getByTestId("quality-item").first()).toContainText("NOKEUR");
  });

  test("the upload routes run the gate: role, firm and size", async () => {
    const admin = await signedInApi(DEMO_USERS[0].email);
    const periodId = (await (await admin.get("/api/periods")).json()).periods[0].id as string;
    await admin.dispose();
    const body = (input: unknown, size = 1000) => ({ files: [{ name: "p.csv", size, type: "text/csv", lastModified: 0 }], input });
    const url = "/api/uploadthing?actionType=upload&slug=positions";

    const wrongRole = await signedInApi(analyst);
    const refused = await wrongRole.post(url, { data: body({ periodId, numberFormat: "plain" }) });
    expect(refused.status()).toBe(403);
    expect((await refused.json()).message).toBe("Your role does not allow this.");
    await wrongRole.dispose();

    const otherFirm = await signedInApi(SECOND_FIRM_USERS[1].email);
    const absent = await otherFirm.post(url, { data: body({ periodId, numberFormat: "plain" }) });
    expect(absent.status()).toBe(404);
    expect((await absent.json()).message).toBe("No such reporting period.");
    await otherFirm.dispose();

    const right = await signedInApi(officer);
    const tooBig = await right.post(url, { data: body({ periodId, numberFormat: "plain" }, 40 * 1024 * 1024) });
    expect(tooBig.status()).toBeGreaterThanOrEqual(400);
    expect(JSON.stringify(await tooBig.json())).toMatch(/too large|larger than|size|exceed/i);
    const signedOut = await signedInApi(null);
    expect((await signedOut.post(url, { data: body({ periodId, numberFormat: "plain" }) })).status()).toBe(403);
    await right.dispose();
    await signedOut.dispose();
  });
});
