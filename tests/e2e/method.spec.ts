import { test, expect } from "@playwright/test";
import { DEMO_USERS, signInThroughPage, signedInApi } from "./helpers";
import { MethodPage } from "./pages/method";

const ANALYST = DEMO_USERS.find((u) => u.email === "priya.castell@northmoor.example")!.email;
const OFFICER = DEMO_USERS.find((u) => u.email === "tomas.reyne@northmoor.example")!.email;
const AUDITOR = DEMO_USERS.find((u) => u.email === "oskar.lind@northmoor.example")!.email;
const HEAD = DEMO_USERS.find((u) => u.email === "helen.marsh@northmoor.example")!.email;

test.describe.configure({ mode: "serial" });

test.describe("method statement", () => {
  let draftId = "";

  test("the risk analyst reads the approved version, starts a new one, is refused λ = 1.2, fixes it, attaches evidence and approves; the compliance head co-approves", async ({ page, browser }) => {
    test.setTimeout(150_000); // two people's sessions in one test on a shared machine
    await signInThroughPage(page, ANALYST);
    const method = new MethodPage(page);
    await method.open();
    await expect(method.approvedHeading(1)).toBeVisible();
    await expect(page.getByRole("cell", { name: /GARCH\(1,1\), Student-t errors, zero mean, falls back to EWMA/ })).toBeVisible();
    await expect(page.getByText("99 %, 97.5 %")).toBeVisible();
    await expect(page.getByTestId("evidence-summary")).toContainText("prices up to 15 Sep 2026"); // the demo approved version 1 in mid-September (db/seed.ts)
    await expect(page.getByText(/Equities: QLIKE of each estimator above the best/)).toBeVisible();
    await expect(page.getByTestId("version-1").getByText("Approved")).toBeVisible();
    await page.screenshot({ path: "test-results/screens/method-page.png", fullPage: true });

    await method.startNewVersion(1, "Slower EWMA decay after the quarterly review.");
    draftId = page.url().split("/").pop()!;

    const defaults = method.defaults();
    await defaults.getByLabel("λ value").fill("1.2");
    await method.saveDraft();
    await expect(defaults.getByText("λ must be below 1.")).toBeVisible();
    await expect(defaults.getByLabel("λ value")).toHaveAttribute("aria-invalid", "true");
    await page.screenshot({ path: "test-results/screens/method-draft-error.png", fullPage: true });

    // The server checks the same schema again: the same value sent directly is refused field by field, nothing stored.
    const api = await signedInApi(ANALYST);
    const stored = (await (await api.get(`/api/method/${draftId}`)).json()).version;
    const refused = await api.put(`/api/method/${draftId}`, {
      data: { content: { ...stored.content, defaultEstimator: { kind: "ewma", lambdaMode: "fixed", lambda: 1.2 } }, rationale: stored.rationale, analystLimitations: stored.analystLimitations, reason: stored.reason },
    });
    expect(refused.status()).toBe(422);
    expect((await refused.json()).error.fields["content.defaultEstimator.lambda"]).toBe("λ must be below 1.");
    expect((await (await api.get(`/api/method/${draftId}`)).json()).version.content.defaultEstimator.lambda).toBe(0.94);
    await api.dispose();

    await defaults.getByLabel("λ value").fill("0.97");
    await method.saveDraft();
    await expect(method.savedNotice()).toBeVisible();
    await expect(defaults.getByText("λ must be below 1.")).toHaveCount(0);

    await expect(method.approveButton(2)).toBeDisabled();
    // computed at the real time of the act (the business day is pinned to 2026-12-01, the stamp is not)
    await method.attachEvidence();
    await expect(page.getByRole("button", { name: "Recompute evidence" })).toBeEnabled();
    await expect(page.getByText(/Government bonds: QLIKE of each estimator above the best/)).toBeVisible();
    await page.screenshot({ path: "test-results/screens/method-draft-evidence.png", fullPage: true });

    // approving asks for confirmation; the firm needs a second person, so the draft then waits for them
    await method.approve(2, {
      note: "Checked the bond evidence.",
      beforeConfirm: async () => {
        await page.screenshot({ path: "test-results/screens/method-approve-confirm.png", fullPage: true });
      },
    });
    await expect(page.getByText("Approved by Priya Castell; waiting for a compliance head to co-approve.")).toBeVisible();
    await expect(page.getByRole("button", { name: /^Co-approve/ })).toHaveCount(0);

    const headPage = await browser.newPage();
    await signInThroughPage(headPage, HEAD);
    await headPage.goto(page.url());
    await new MethodPage(headPage).coApprove(2, "Priya Castell", {
      beforeConfirm: async () => {
        await headPage.screenshot({ path: "test-results/screens/method-co-approve-confirm.png", fullPage: true });
      },
    });
    await headPage.close();

    await page.reload();
    await expect(method.versionHeading(2)).toBeVisible();
    await expect(page.getByRole("button", { name: "Save draft" })).toHaveCount(0);
    await page.goto("/method");
    await expect(method.approvedHeading(2)).toBeVisible();
    await expect(page.getByTestId("version-1").getByText("Superseded")).toBeVisible();
    await expect(page.getByText("EWMA, λ 0.97 (fixed)")).toBeVisible();
  });

  test("the differences between the two versions, field by field", async ({ page }) => {
    await signInThroughPage(page, ANALYST);
    await page.goto("/method");
    await page.getByTestId("version-2").getByRole("link", { name: "Changes" }).click();
    await expect(page.getByRole("heading", { name: "Compare method statement versions" })).toBeVisible();
    const row = page.getByRole("row", { name: /Firm-wide default · λ value/ });
    await expect(row.getByRole("cell").nth(0)).toHaveText("0.94");
    await expect(row.getByRole("cell").nth(1)).toHaveText("0.97");
    await expect(page.getByText("reason for version 2: Slower EWMA decay after the quarterly review.")).toBeVisible();
    await expect(page.getByRole("heading", { name: "Rationale" })).toBeVisible();
    await page.screenshot({ path: "test-results/screens/method-diff.png", fullPage: true });
  });

  for (const [who, email] of [
    ["compliance officer", OFFICER],
    ["auditor", AUDITOR],
  ] as const) {
    test(`the ${who} reads the method statement but cannot change it`, async ({ page }) => {
      await signInThroughPage(page, email);
      await page.goto("/method");
      const method = new MethodPage(page);
      await expect(method.approvedHeading(2)).toBeVisible();
      await expect(page.getByRole("button", { name: "Start a new version" })).toHaveCount(0);
      await page.getByTestId("version-2").getByRole("link", { name: "Version 2" }).click();
      await expect(method.versionHeading(2)).toBeVisible();
      await expect(page.getByRole("textbox")).toHaveCount(0);
      await expect(page.getByRole("button", { name: /Save|Approve|Discard|evidence/ })).toHaveCount(0);
      if (who === "auditor") await page.screenshot({ path: "test-results/screens/method-read-only.png", fullPage: true });

      const api = await signedInApi(email);
      expect((await api.post("/api/method", { data: { reason: "An attempt." } })).status()).toBe(403);
      expect((await api.put(`/api/method/${draftId}`, { data: {} })).status()).toBe(403);
      expect((await api.post(`/api/method/${draftId}/approve`, { data: {} })).status()).toBe(403);
      expect((await api.post(`/api/method/${draftId}/evidence`, { data: {} })).status()).toBe(403);
      expect((await api.post(`/api/method/${draftId}/discard`, { data: {} })).status()).toBe(403);
      expect((await api.get("/api/method")).status()).toBe(200);
      await api.dispose();
    });
  }
});
