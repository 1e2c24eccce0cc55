import { expect, type Page } from "@playwright/test";
import { csv, demoFile } from "../helpers";

/** The Data page and the upload preview. */
export class DataPage {
  constructor(private readonly page: Page) {}

  async open() {
    await this.page.goto("/data");
    await expect(this.page.getByRole("heading", { name: "Data", exact: true })).toBeVisible();
  }

  /** Upload a file through the upload service's real button and wait for the preview page (the worker has read it then). */
  async upload(kind: "positions" | "prices", file: { name: string; mimeType: string; buffer: Buffer }) {
    const area = this.page.getByTestId(`${kind}-upload-button`);
    await expect(area.locator("[data-state='ready']").first()).toBeVisible({ timeout: 20_000 });
    await area.locator("input[type=file]").setInputFiles(file);
    await this.page.waitForURL(/\/data\/uploads\/[0-9a-f-]{36}/, { timeout: 60_000 });
    // the job worker reads and checks the file first; the problems appear when it has
    await expect(this.page.getByRole("heading", { name: "Problems" })).toBeVisible({ timeout: 60_000 });
  }

  problems() {
    return this.page.getByTestId("problems-table");
  }

  /** Upload the demo's bad positions file (templates/demo/northmoor-positions-bad.csv); its first problems are named. */
  async uploadBadDemoBook() {
    await this.open();
    await this.upload("positions", csv("northmoor-positions-bad.csv", demoFile("northmoor-positions-bad.csv")));
    const problems = this.problems();
    await expect(problems).toContainText('currency "EUX" is not an ISO 4217 currency code');
    await expect(problems).toContainText('quantity "12O0" is not a number');
    return problems;
  }

  async confirm() {
    const acknowledge = this.page.getByLabel(/I have read the \d+ warnings?/);
    if (await acknowledge.count()) await acknowledge.check();
    await this.page.getByRole("button", { name: "Confirm", exact: true }).click();
    // the job worker stores the rows; the message comes when it has
    await expect(this.page.getByTestId("preview-message")).toContainText("Confirmed", { timeout: 60_000 });
  }

  confirmButton() {
    return this.page.getByRole("button", { name: "Confirm", exact: true });
  }

  /** A refused file's preview: Confirm stays disabled; `screenshot` is taken, then the upload is cancelled. */
  async cancelRefused(screenshot: () => Promise<unknown>) {
    await expect(this.confirmButton()).toBeDisabled();
    await screenshot();
    await this.cancel();
  }

  /** Cancel the upload from its preview: nothing from the file is stored. */
  async cancel() {
    await this.page.getByRole("button", { name: "Cancel upload" }).click();
    await expect(this.page.getByTestId("preview-message")).toHaveText("Cancelled. Nothing from this file was stored.");
  }
}
