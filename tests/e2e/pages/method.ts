import { expect, type Page } from "@playwright/test";

/** The method statement: the approved version and its history, a draft version's form, approval and co-approval. */
export class MethodPage {
  constructor(private readonly page: Page) {}

  /** Through the shell's Method link. */
  async open() {
    await this.page.getByRole("navigation", { name: "Month end" }).getByRole("link", { name: "Method" }).click();
    await expect(this.page.getByRole("heading", { name: "Method statement", level: 1 })).toBeVisible();
  }

  /** The heading of the approved version (any version when none is given). */
  approvedHeading(version?: number) {
    return this.page.getByRole("heading", { name: version === undefined ? /^Approved version \d+$/ : `Approved version ${version}` });
  }

  /** Start a draft of the next version with its reason; ends on the draft's own page. */
  async startNewVersion(current: number, reason: string) {
    await this.page.getByRole("button", { name: "Start a new version" }).click();
    await this.page.getByLabel(`Why does version ${current} need to change?`).fill(reason);
    await this.page.getByRole("button", { name: "Start the draft" }).click();
    await expect(this.page).toHaveURL(/\/method\/[0-9a-f-]{36}$/);
    await expect(this.page.getByRole("heading", { name: `Method statement · draft version ${current + 1}` })).toBeVisible();
  }

  /** The draft form's firm-wide default estimator. */
  defaults() {
    return this.page.getByRole("group", { name: "Firm-wide default" });
  }

  async saveDraft() {
    await this.page.getByRole("button", { name: "Save draft" }).click();
  }

  savedNotice() {
    return this.page.getByRole("status").filter({ hasText: "Draft saved." });
  }

  approveButton(version: number) {
    return this.page.getByRole("button", { name: `Approve version ${version}…` });
  }

  /** Attach evidence and wait for it: a real computation over the firm's history ("Computing…" meanwhile). */
  async attachEvidence() {
    await this.page.getByRole("button", { name: "Attach evidence" }).click();
    // a limit for a busy machine
    await expect(this.page.getByTestId("evidence-summary")).toContainText(/Computed \d{4}-\d{2}-\d{2}/, { timeout: 60_000 });
  }

  /** Approve the draft (the firm asks a compliance head to co-approve after). `beforeConfirm` runs on the open confirmation. */
  async approve(version: number, options: { note?: string; beforeConfirm?: () => Promise<void> } = {}) {
    await this.approveButton(version).click();
    const confirm = this.page.getByRole("group", { name: new RegExp(`Approve version ${version}\\? A compliance head then co-approves`) });
    await expect(confirm).toBeVisible();
    if (options.note !== undefined) await confirm.getByLabel("Note for the audit trail (optional)").fill(options.note);
    await options.beforeConfirm?.();
    await confirm.getByRole("button", { name: "Yes, approve" }).click();
  }

  /** Co-approve a version approved by `approvedBy` (on the version's page); ends on the approved version. */
  async coApprove(version: number, approvedBy: string, options: { beforeConfirm?: () => Promise<void> } = {}) {
    await this.page.getByRole("button", { name: `Co-approve version ${version}…` }).click();
    const confirm = this.page.getByRole("group", { name: `Co-approve version ${version}, approved by ${approvedBy}?` });
    await expect(confirm).toBeVisible();
    await options.beforeConfirm?.();
    await confirm.getByRole("button", { name: "Yes, co-approve" }).click();
    await expect(this.versionHeading(version)).toBeVisible();
  }

  /** The heading of a version's own page. */
  versionHeading(version: number) {
    return this.page.getByRole("heading", { name: `Method statement · version ${version}` });
  }
}
