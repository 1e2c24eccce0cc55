import { test, expect } from "@playwright/test";
import { Shell } from "./pages/shell";
import { DEMO_USERS, signInThroughPage, signedInApi, SECOND_FIRM_USERS, submitSignIn, signInError } from "./helpers";
import { ROLE_LABELS } from "@/lib/auth/roles";

test.describe("sign-in and the shell", () => {
  for (const user of DEMO_USERS) {
    test(`${user.roles.join(" + ")} signs in and sees the shell`, async ({ page }) => {
      await signInThroughPage(page, user.email);
      const shell = new Shell(page);
      await shell.expectSignedInAs(user.name, "Northmoor Brokerage Ltd");
      await expect(page.getByTestId("user-roles")).toHaveText(user.roles.map((r) => ROLE_LABELS[r]).join(" · "));
      await expect(shell.nav("This month")).toHaveAttribute("aria-current", "page");
      const auditVisible = user.roles.some((r) => r === "admin" || r === "auditor");
      await expect(shell.nav("Audit trail")).toHaveCount(auditVisible ? 1 : 0);
      await page.screenshot({ path: `test-results/screens/shell-${user.roles.join("-")}.png`, fullPage: true });
      await shell.signOut();
    });
  }

  test("a wrong password gets the same generic message as an unknown address", async ({ page }) => {
    await submitSignIn(page, DEMO_USERS[1].email, "not-the-password-at-all");
    await expect(signInError(page)).toHaveText("That e-mail and password do not match an active account.");
    await page.screenshot({ path: "test-results/screens/sign-in-refused.png" });
    await submitSignIn(page, "nobody@northmoor.example", "not-the-password-at-all");
    await expect(signInError(page)).toHaveText("That e-mail and password do not match an active account.");
    await expect(page).toHaveURL(/\/sign-in/);
  });

  test("the sign-in form names the field that is wrong before asking the server", async ({ page }) => {
    await page.goto("/sign-in");
    await page.getByLabel("E-mail").fill("not-an-address");
    await page.getByRole("button", { name: "Sign in" }).click();
    await expect(page.getByText("Enter a valid e-mail address.")).toBeVisible();
    await expect(page.getByText("Enter your password.")).toBeVisible();
    await page.screenshot({ path: "test-results/screens/sign-in-errors.png" });
  });

  test("a signed-out visit to a signed-in page goes to sign-in and comes back after", async ({ page }) => {
    await page.goto("/periods");
    await expect(page).toHaveURL(/\/sign-in\?next=%2Fperiods/);
    await page.screenshot({ path: "test-results/screens/sign-in.png" });
    await page.getByLabel("E-mail").fill(DEMO_USERS[1].email);
    await page.getByLabel("Password").fill("ballast-demo-2026");
    await page.getByRole("button", { name: "Sign in" }).click();
    await expect(page).toHaveURL(/\/periods$/);
    await expect(page.getByRole("heading", { name: "Reporting periods" })).toBeVisible();
  });

  test("signing out ends the session on the server too", async ({ page, context }) => {
    await signInThroughPage(page, DEMO_USERS[4].email);
    const cookies = await context.cookies();
    const session = cookies.find((c) => c.name.includes("authjs.session-token"));
    expect(session?.httpOnly).toBe(true);
    expect(session?.sameSite).toBe("Lax");
    await new Shell(page).signOut();
    // Replaying the old cookie must not bring the session back.
    await context.addCookies([session!]);
    const response = await page.request.get("/api/firm");
    expect(response.status()).toBe(401);
  });

  test("the landing page says what Ballast does", async ({ page }) => {
    await page.goto("/");
    await expect(page.getByRole("heading", { level: 1 })).toContainText("Month-end market risk and capital");
    await expect(page.getByText("licensed compliance officer").first()).toBeVisible();
    await page.screenshot({ path: "test-results/screens/landing.png", fullPage: true });
  });
});

test.describe("tenants", () => {
  test("a member of one firm cannot read the other firm's records through any API route", async () => {
    const northmoor = await signedInApi(DEMO_USERS[0].email);
    const pellam = await signedInApi(SECOND_FIRM_USERS[0].email);
    const { periods } = await (await northmoor.get("/api/periods")).json();
    const { members } = await (await northmoor.get("/api/members")).json();
    expect(periods.length).toBeGreaterThan(0);
    expect((await pellam.get(`/api/periods/${periods[0].id}`)).status()).toBe(404);
    expect((await pellam.patch(`/api/members/${members[0].id}`, { data: { active: false } })).status()).toBe(404);
    const pellamPeriods = (await (await pellam.get("/api/periods")).json()).periods as { id: string }[];
    expect(pellamPeriods.map((p) => p.id)).not.toContain(periods[0].id);
    const pellamAudit = (await (await pellam.get("/api/audit")).json()).events as { summary: string }[];
    expect(pellamAudit.some((e) => e.summary.includes("northmoor"))).toBe(false);
    await northmoor.dispose();
    await pellam.dispose();
  });
});

test("repeated failures for one account are refused with a clear wait message", async ({ page }) => {
  // A person of their own, so that locking them out for 15 minutes touches no other test.
  const admin = await signedInApi(DEMO_USERS[0].email);
  const email = "lockout.test@northmoor.example";
  const password = "a-long-enough-secret-77";
  expect((await admin.post("/api/members", { data: { name: "Lockout Test", email, roles: ["auditor"], password } })).status()).toBe(201);
  await admin.dispose();
  for (let i = 0; i < 5; i++) {
    await submitSignIn(page, email, `wrong-password-${i}`);
    await expect(signInError(page)).toHaveText("That e-mail and password do not match an active account.");
  }
  // Even the right password is refused while this account-and-address pair waits (30 s, doubling).
  await submitSignIn(page, email, password);
  await expect(signInError(page)).toHaveText(/^Too many failed sign-in attempts for this account from here\. Wait a few minutes/);
});
