import { test, expect } from "@playwright/test";
import { DEMO_USERS, signInThroughPage, signedInApi } from "./helpers";

const ANALYST = DEMO_USERS.find((u) => u.email === "priya.castell@northmoor.example")!;
const AUDITOR = DEMO_USERS.find((u) => u.email === "oskar.lind@northmoor.example")!;
const ADMIN = DEMO_USERS[0];

test.describe.configure({ mode: "serial" });

test.describe("governance", () => {
  test("a data-quality finding that asks for confirmation is confirmed with a reason: who, when and why are shown and audited", async ({ page }) => {
    const api = await signedInApi(ANALYST.email);
    const { periods } = await (await api.get("/api/periods")).json();
    const period = (periods as { id: string; periodEnd: string }[]).find((p) => p.periodEnd === "2026-11-30")!;
    await api.dispose();

    await signInThroughPage(page, ANALYST.email);
    await page.goto(`/periods/${period.id}/data-quality?check=extreme-return`);
    const item = page.getByTestId("quality-item").first();
    await expect(item).toContainText("confirm they are real");
    const instrument = (await item.getByRole("cell").nth(2).textContent())!.trim();
    await item.getByRole("button", { name: "Confirm…" }).click();
    const reason = item.getByLabel("Why these moves are real (recorded with your name and the time)");
    await reason.fill("short");
    await item.getByRole("button", { name: "Confirm finding" }).click();
    await expect(item.getByRole("alert")).toContainText("at least 10 characters");
    await reason.fill("Checked against the exchange's closing prices: the moves are real (results day).");
    await page.screenshot({ path: "test-results/screens/quality-confirm-form.png", fullPage: true });
    await item.getByRole("button", { name: "Confirm finding" }).click();
    const confirmation = page.getByTestId("quality-item").filter({ hasText: instrument }).getByTestId("quality-confirmation");
    await expect(confirmation).toContainText("Confirmed by Priya Castell on");
    await expect(confirmation).toContainText("the moves are real (results day).");
    await page.screenshot({ path: "test-results/screens/quality-confirmed.png", fullPage: true });

    // read-only for the auditor: the confirmation is shown, no way to confirm
    const auditorPage = await page.context().browser()!.newPage();
    await signInThroughPage(auditorPage, AUDITOR.email);
    await auditorPage.goto(`/periods/${period.id}/data-quality?check=extreme-return`);
    await expect(auditorPage.getByTestId("quality-confirmation").first()).toBeVisible();
    await expect(auditorPage.getByRole("button", { name: "Confirm…" })).toHaveCount(0);
    await auditorPage.goto("/audit");
    await expect(auditorPage.getByTestId("audit-row").filter({ hasText: `Confirmed "Extreme return to confirm" for ${instrument}` })).toBeVisible();
    await auditorPage.close();
  });

  test("one-person method approval needs a stated reason in the firm's settings", async ({ page }) => {
    await signInThroughPage(page, ADMIN.email);
    await page.goto("/settings");
    const box = page.getByLabel(/A compliance head must co-approve each method statement version/);
    await expect(box).toBeChecked();
    await box.uncheck();
    await page.getByRole("button", { name: "Save settings" }).click();
    await expect(page.getByText("Say why one person may approve the method statement")).toBeVisible();
    await page.screenshot({ path: "test-results/screens/settings-one-person-approval.png", fullPage: true });
    // nothing was stored: co-approval is still required
    const api = await signedInApi(ADMIN.email);
    expect((await (await api.get("/api/firm")).json()).methodCoApproval).toBe(true);
    await api.dispose();
  });
});
