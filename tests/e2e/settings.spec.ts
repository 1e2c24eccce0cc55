import { test, expect } from "@playwright/test";
import { DEMO_USERS, signInThroughPage, signedInApi, DEMO_PASSWORD, submitSignIn, signInError } from "./helpers";
import { E2E_ENV } from "../../playwright.config";

/** The messages the local mail listener received (the app's SMTP transport points at it in the browser tests). */
async function mailTo(address: string): Promise<{ to: string[]; subject: string; text: string }[]> {
  const { messages } = await (await fetch(`${E2E_ENV.MAIL_LISTENER_URL}/messages`)).json();
  return (messages as { to: string[]; subject: string; text: string }[]).filter((m) => m.to.includes(address));
}

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
      data: { name: "N", reportingCurrency: "EUR", regulatorName: "", licenceLabel: "Reg", methodCoApproval: true, deadlineRule: "business-days-after", deadlineValue: 61 },
    });
    expect(response.status()).toBe(422);
    const body = await response.json();
    expect(body.error.fields).toMatchObject({ name: expect.any(String), deadlineValue: "Between 1 and 60." });
    expect((await (await api.get("/api/firm")).json()).name).toBe("Northmoor Brokerage Ltd");
    await api.dispose();
  });

  test("an administrator invites a person by e-mail, who chooses a password and signs in; a deactivated person cannot sign in", async ({ page, browser }) => {
    await signInThroughPage(page, DEMO_USERS[0].email);
    await page.goto("/settings");
    await page.getByLabel("Name", { exact: true }).fill("Wren Ashby");
    await page.getByLabel("E-mail", { exact: true }).fill("wren.ashby@northmoor.example");
    await expect(page.getByLabel("First password")).toHaveCount(0); // administrators no longer set passwords
    await page.locator("#new-role-auditor").check();
    await page.getByRole("button", { name: "Send invitation", exact: true }).click();
    await expect(page.getByTestId("invite-status")).toHaveText("Invitation sent to wren.ashby@northmoor.example.");
    const row = page.getByTestId("member-row").filter({ hasText: "wren.ashby@northmoor.example" });
    await expect(row.getByText("Invited")).toBeVisible();
    await expect(row.getByText(/Has not chosen a password yet; the link works until/)).toBeVisible();
    await page.screenshot({ path: "test-results/screens/settings-invited.png", fullPage: true });

    // The invitation is in the local listener, shown on the administrators' "Mail received" page.
    await expect.poll(async () => (await mailTo("wren.ashby@northmoor.example")).length).toBe(1);
    const [mail] = await mailTo("wren.ashby@northmoor.example");
    expect(mail.subject).toBe("You are invited to Northmoor Brokerage Ltd in Ballast");
    const link = /https?:\/\/\S+\/invitation\/[A-Za-z0-9_-]{43}/.exec(mail.text)![0];
    await page.goto("/settings/mail");
    const item = page.getByTestId("mail-item").filter({ hasText: "You are invited to Northmoor Brokerage Ltd in Ballast" }).filter({ hasText: "wren.ashby@northmoor.example" });
    await item.getByRole("button").click();
    await expect(item).toContainText("/invitation/");
    await page.screenshot({ path: "test-results/screens/mail-invitation.png", fullPage: true });

    // The person opens the link, chooses a password twice (a mismatch is refused), and signs in with it.
    const other = await browser.newContext();
    const wren = await other.newPage();
    await wren.goto(new URL(link).pathname);
    await wren.waitForLoadState("networkidle"); // the form answers once the page's script has loaded
    await expect(wren.getByRole("heading", { name: "Choose your password" })).toBeVisible();
    await expect(wren.getByText("Wren Ashby, you are invited to Northmoor Brokerage Ltd in Ballast as wren.ashby@northmoor.example.")).toBeVisible();
    await wren.getByLabel("New password").fill("a-long-enough-secret-42");
    await wren.getByLabel("The same password again").fill("a-long-enough-secret-43");
    await wren.getByRole("button", { name: "Set password" }).click();
    await expect(wren.getByText("The two passwords differ.")).toBeVisible();
    await wren.getByLabel("The same password again").fill("a-long-enough-secret-42");
    await wren.screenshot({ path: "test-results/screens/invitation-choose-password.png", fullPage: true });
    await wren.getByRole("button", { name: "Set password" }).click();
    await expect(wren.getByRole("status")).toContainText("Your password is set.");
    // the link works once
    await wren.goto(new URL(link).pathname);
    await expect(wren.getByText(/This link has already been used/)).toBeVisible();
    await signInThroughPage(wren, "wren.ashby@northmoor.example", "a-long-enough-secret-42");
    await page.goto("/settings");
    await expect(row.getByText("Active")).toBeVisible();

    // Once deactivated, their open session stops at the next request.
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
    await expect(page.getByTestId("audit-row").filter({ hasText: "Invited Wren Ashby" })).toBeVisible();
    await expect(page.getByTestId("audit-row").filter({ hasText: "Wren Ashby accepted the invitation and chose a password" })).toBeVisible();
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
