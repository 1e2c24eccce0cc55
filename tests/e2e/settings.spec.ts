import { test, expect } from "@playwright/test";
import { DEMO_USERS, signInThroughPage, signedInApi, DEMO_PASSWORD, submitSignIn, signInError } from "./helpers";

test.describe("firm administration", () => {
  test("settings reject bad input field by field and keep what was stored", async ({ page }) => {
    await signInThroughPage(page, DEMO_USERS[0].email);
    await page.getByRole("link", { name: "Settings" }).click();
    await expect(page.getByRole("heading", { name: "Settings" })).toBeVisible();
    await page.getByLabel("Firm name").fill("N");
    await page.getByLabel("Business days").fill("61");
    await page.getByRole("button", { name: "Save settings" }).click();
    await expect(page.getByText("Enter the firm's name (at least 2 characters).")).toBeVisible();
    await expect(page.getByText("Between 1 and 60.")).toBeVisible();
    await page.screenshot({ path: "test-results/screens/settings-errors.png", fullPage: true });
    // The server checks the same schema: a direct call with the same values is refused and stores nothing.
    const api = await signedInApi(DEMO_USERS[0].email);
    const response = await api.patch("/api/firm", {
      data: { name: "N", reportingCurrency: "EUR", regulatorName: "", licenceLabel: "Reg", methodCoApproval: false, deadlineRule: "business-days-after", deadlineValue: 61 },
    });
    expect(response.status()).toBe(422);
    const body = await response.json();
    expect(body.error.fields).toMatchObject({ name: expect.any(String), deadlineValue: "Between 1 and 60." });
    expect((await (await api.get("/api/firm")).json()).name).toBe("Northmoor Brokerage Ltd");
    await api.dispose();
  });

  test("an administrator adds a person, and a deactivated person cannot sign in", async ({ page, browser }) => {
    await signInThroughPage(page, DEMO_USERS[0].email);
    await page.goto("/settings");
    await page.getByLabel("Name", { exact: true }).fill("Wren Ashby");
    await page.getByLabel("E-mail", { exact: true }).fill("wren.ashby@northmoor.example");
    await page.getByLabel("First password").fill("a-long-enough-secret-42");
    await page.locator("#new-role-auditor").check();
    await page.getByRole("button", { name: "Add person" }).click();
    await expect(page.getByRole("status")).toContainText("Wren Ashby was added");
    const row = page.getByTestId("member-row").filter({ hasText: "wren.ashby@northmoor.example" });
    await expect(row.getByText("Active")).toBeVisible();

    // The new person can sign in; once deactivated, their open session stops at the next request.
    const other = await browser.newContext();
    const wren = await other.newPage();
    await signInThroughPage(wren, "wren.ashby@northmoor.example", "a-long-enough-secret-42");
    await row.getByRole("button", { name: "Deactivate" }).click();
    await expect(row.getByText("Deactivated")).toBeVisible();
    await page.screenshot({ path: "test-results/screens/settings-members.png", fullPage: true });
    expect((await wren.request.get("/api/firm")).status()).toBe(401);
    await submitSignIn(wren, "wren.ashby@northmoor.example", "a-long-enough-secret-42");
    await expect(signInError(wren)).toHaveText("That e-mail and password do not match an active account.");
    await other.close();

    // The audit trail shows both changes.
    await page.goto("/audit");
    await expect(page.getByTestId("audit-row").filter({ hasText: "Wren Ashby: deactivated" })).toBeVisible();
    await expect(page.getByTestId("audit-row").filter({ hasText: "Added Wren Ashby" })).toBeVisible();
    await page.screenshot({ path: "test-results/screens/audit-trail.png", fullPage: true });
  });

  test("the last administrator cannot remove their own role", async () => {
    const api = await signedInApi(DEMO_USERS[0].email, DEMO_PASSWORD);
    const { members } = await (await api.get("/api/members")).json();
    const self = members.find((m: { email: string }) => m.email === DEMO_USERS[0].email);
    const response = await api.patch(`/api/members/${self.id}`, { data: { roles: ["auditor"] } });
    expect(response.status()).toBe(409);
    expect((await response.json()).error.message).toContain("at least one active administrator");
    await api.dispose();
  });
});
