import { expect, type Page } from "@playwright/test";

/** A period's filing page: the draft by section, the review threads, the actions by role, signing, filing. */
export class FilingPage {
  constructor(private readonly page: Page) {}

  async open(periodId: string) {
    await this.page.goto(`/periods/${periodId}/filing`);
  }

  status() {
    return this.page.getByTestId("filing-status").first();
  }

  /** Fill every empty exception explanation with `text(i)`; the counts of explanations and of those filled. */
  async fillEmptyExplanations(text: (i: number) => string): Promise<{ count: number; filled: number }> {
    const explanations = this.page.locator("[id^=explanation-]");
    const count = await explanations.count();
    let filled = 0;
    for (let i = 0; i < count; i++) {
      if (!(await explanations.nth(i).inputValue())) {
        await explanations.nth(i).fill(text(i));
        filled += 1;
      }
    }
    return { count, filled };
  }

  async saveExplanations() {
    await this.page.getByRole("button", { name: "Save explanations" }).click();
    await expect(this.page.getByText("Saved.")).toBeVisible();
  }

  async saveCoverNote(text: string) {
    await this.page.getByLabel("Cover note").fill(text);
    await this.page.getByRole("button", { name: "Save cover note" }).click();
  }

  /** Answer on a section's review thread (`title` as the section is headed). */
  async answerOn(section: string, title: string, text: string) {
    const thread = this.page.getByTestId(`comments-${section}`);
    await thread.getByRole("button", { name: new RegExp(`Answer on ${title}`, "i") }).click();
    await thread.getByLabel(new RegExp(`Answer on ${title}`)).fill(text);
    await thread.getByRole("button", { name: "Add answer" }).click();
    await expect(thread).toContainText(text);
  }

  /** The compliance head sends the filing back with a reason about one section. */
  async requestChanges(section: string, reason: string) {
    await this.page.getByText("Request changes…").click();
    await this.page.getByLabel("About", { exact: true }).selectOption(section);
    await this.page.getByLabel("What needs to change").fill(reason);
    await this.page.getByRole("button", { name: "Request changes", exact: true }).click();
    await expect(this.status()).toHaveText(/Changes requested/);
    await expect(this.page.getByTestId(`comments-${section}`)).toContainText(reason);
  }

  /** Open the sign dialog of a version; the dialog. */
  async openSignDialog(version: number | string) {
    await this.page.getByRole("button", { name: `Sign version ${version}` }).click();
    return this.page.getByRole("dialog", { name: `Sign version ${version} of the filing` });
  }

  /** In the open sign dialog: tick the attestation, the signer's name and (when given) the registration number. */
  async attest(version: number | string, signer: { name: string; reference?: string }) {
    const dialog = this.signDialog(version);
    await dialog.getByRole("checkbox").check();
    await dialog.getByLabel("Your full name").fill(signer.name);
    if (signer.reference !== undefined) await dialog.getByLabel("Registration no.").fill(signer.reference);
  }

  /** In the open sign dialog: the password again, then Sign. */
  async signWith(version: number | string, password: string) {
    const dialog = this.signDialog(version);
    await dialog.getByLabel("Your password, entered again").fill(password);
    await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  }

  signDialog(version: number | string) {
    return this.page.getByRole("dialog", { name: `Sign version ${version} of the filing` });
  }

  /** Verify the signature; the content hash shown as signed. */
  async verifySignature(): Promise<string> {
    const hash = (await this.page.getByTestId("signed-hash").textContent())!;
    expect(hash).toMatch(/^[0-9a-f]{64}$/);
    await this.page.getByRole("button", { name: "Verify signature" }).click();
    await expect(this.page.getByTestId("verify-result")).toContainText("Matches");
    return hash;
  }

  /** The officer records the signed filing as filed with the regulator's reference. */
  async recordFiled(reference: string) {
    await this.page.getByLabel("Regulator's reference").fill(reference);
    await this.page.getByRole("button", { name: "Record as filed" }).click();
    await expect(this.status()).toHaveText(/Filed/);
    await expect(this.page.getByTestId("filed-line")).toContainText(reference);
  }
}
