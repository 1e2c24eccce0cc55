import { test, expect } from "@playwright/test";
import { E2E_ENV } from "../../playwright.config";
import { DEMO_USERS, signInThroughPage, signedInApi, submitSignIn, signInError } from "./helpers";

/** Works on a person of its own (invited here), so that no demo person's password changes for the specs after it. */
const ISLA = { name: "Isla Ferrow", email: "isla.ferrow@northmoor.example" };
const FIRST = "isla-first-long-phrase-61";
const SECOND = "isla-second-long-phrase-62";
const THIRD = "isla-third-long-phrase-63";

async function mailTo(address: string): Promise<{ to: string[]; subject: string; text: string }[]> {
  const { messages } = await (await fetch(`${E2E_ENV.MAIL_LISTENER_URL}/messages`)).json();
  return (messages as { to: string[]; subject: string; text: string }[]).filter((m) => m.to.includes(address));
}

const linkIn = (text: string, kind: "invitation" | "reset-password") => new URL(new RegExp(`https?://\\S+/${kind}/[A-Za-z0-9_-]{43}`).exec(text)![0]).pathname;

test.describe.configure({ mode: "serial" });

test.describe("accounts", () => {
  test("an invited person sets their password through the e-mailed link", async ({ page }) => {
    const admin = await signedInApi(DEMO_USERS[0].email);
    const invited = await admin.post("/api/members", { data: { name: ISLA.name, email: ISLA.email, roles: ["auditor"] } });
    expect(invited.status(), await invited.text()).toBe(201);
    expect((await invited.json()).invitation).toMatchObject({ mail: { status: "sent" }, link: null });
    await admin.dispose();
    await expect.poll(async () => (await mailTo(ISLA.email)).length).toBe(1);
    await page.goto(linkIn((await mailTo(ISLA.email))[0].text, "invitation"));
    await page.waitForLoadState("networkidle");
    await page.getByLabel("New password").fill(FIRST);
    await page.getByLabel("The same password again").fill(FIRST);
    await page.getByRole("button", { name: "Set password" }).click();
    await expect(page.getByRole("status")).toContainText("Your password is set.");
    await signInThroughPage(page, ISLA.email, FIRST);
  });

  test("a person changes their own password with the current one; every session ends", async ({ page, browser }) => {
    await signInThroughPage(page, ISLA.email, FIRST);
    const elsewhere = await browser.newContext();
    const other = await elsewhere.newPage();
    await signInThroughPage(other, ISLA.email, FIRST);

    await page.goto("/settings");
    await page.getByRole("link", { name: "Your account and password" }).click();
    await expect(page.getByRole("heading", { name: "Your account" })).toBeVisible();
    await page.getByLabel("Current password").fill("not-the-password-at-all");
    await page.getByLabel("New password", { exact: true }).fill(SECOND);
    await page.getByLabel("The new password again").fill(SECOND);
    await page.getByRole("button", { name: "Change password" }).click();
    await expect(page.getByText("The current password is not correct.", { exact: true })).toBeVisible();
    await page.screenshot({ path: "test-results/screens/account-change-password-refused.png", fullPage: true });

    await page.getByLabel("Current password").fill(FIRST);
    await page.getByRole("button", { name: "Change password" }).click();
    await expect(page).toHaveURL(/\/sign-in\?changed=1$/);
    await expect(page.getByText("Your password is changed and your sessions have ended.")).toBeVisible();
    // the other session ended too
    expect((await other.request.get("/api/firm")).status()).toBe(401);
    await elsewhere.close();
    await submitSignIn(page, ISLA.email, FIRST);
    await expect(signInError(page)).toHaveText("That e-mail and password do not match an active account.");
    await signInThroughPage(page, ISLA.email, SECOND);
  });

  test("a forgotten password is reset by e-mail, with one answer for every address", async ({ page }) => {
    await page.goto("/sign-in");
    await page.getByRole("link", { name: "Forgot your password?" }).click();
    await expect(page.getByRole("heading", { name: "Reset your password" })).toBeVisible();
    await page.getByLabel("E-mail").fill("nobody.here@northmoor.example");
    await page.getByRole("button", { name: "Send reset link" }).click();
    const answer = page.getByRole("status").filter({ hasText: "If that address belongs to a Ballast account" });
    await expect(answer).toBeVisible();
    const unknownAnswer = await answer.textContent();

    await page.goto("/reset-password");
    await page.waitForLoadState("networkidle"); // the form answers once the page's script has loaded
    await page.getByLabel("E-mail").fill(ISLA.email);
    await page.getByRole("button", { name: "Send reset link" }).click();
    await expect(answer).toHaveText(unknownAnswer!);
    await page.screenshot({ path: "test-results/screens/reset-requested.png", fullPage: true });
    await expect.poll(async () => (await mailTo(ISLA.email)).filter((m) => m.subject === "Reset your Ballast password").length).toBe(1);
    expect(await mailTo("nobody.here@northmoor.example")).toEqual([]);

    const mail = (await mailTo(ISLA.email)).find((m) => m.subject === "Reset your Ballast password")!;
    await page.goto(linkIn(mail.text, "reset-password"));
    await page.waitForLoadState("networkidle");
    await expect(page.getByRole("heading", { name: "Choose a new password" })).toBeVisible();
    await page.getByLabel("New password").fill(THIRD);
    await page.getByLabel("The same password again").fill(THIRD);
    await page.screenshot({ path: "test-results/screens/reset-choose-password.png", fullPage: true });
    await page.getByRole("button", { name: "Set password" }).click();
    await expect(page.getByRole("status")).toContainText("Your password is set.");
    await signInThroughPage(page, ISLA.email, THIRD);

    // the administrator sees each step in the audit trail
    const admin = await signedInApi(DEMO_USERS[0].email);
    const { events } = await (await admin.get("/api/audit?pageSize=50")).json();
    const actions = (events as { action: string; actorName: string }[]).filter((e) => e.actorName === ISLA.name).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(["account.password_set", "account.password_change", "account.reset_request", "account.password_reset"]));
    await admin.dispose();
  });
});
