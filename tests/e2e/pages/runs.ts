import { expect, type Page } from "@playwright/test";

/** A period's runs (the list, starting a run) and a run's own pages (results, tabs, choosing it for the filing). */
export class RunPage {
  constructor(private readonly page: Page) {}

  /** Through the shell's Runs link and the period's link on the runs page. */
  async openPeriod(periodId: string, month: string) {
    await this.page.getByRole("navigation", { name: "Month end" }).getByRole("link", { name: "Runs" }).click();
    await expect(this.page.getByRole("heading", { name: "Runs", level: 1 })).toBeVisible();
    await this.page.getByRole("link", { name: month }).click();
    await expect(this.page).toHaveURL(new RegExp(`/periods/${periodId}/runs$`));
    await expect(this.page.getByRole("heading", { name: `Runs: ${month}` })).toBeVisible();
  }

  rows() {
    return this.page.getByTestId("run-row");
  }

  /**
   * Start a run and end on its page. Factors short of history are named first; `onRefusal` then runs on the refusal
   * before the run is started without them.
   */
  async start(onRefusal: () => Promise<void> = async () => undefined) {
    await this.page.getByRole("button", { name: "Start run" }).click();
    const refusal = this.page.getByTestId("run-refusal");
    // a refusal naming the short factors, or the new run's own page (starting a run opens it)
    const runPage = /\/runs\/[0-9a-f-]{36}$/;
    await expect.poll(async () => runPage.test(this.page.url()) || (await refusal.isVisible())).toBe(true);
    if (!runPage.test(this.page.url())) {
      await expect(refusal).toContainText("no price history up to the period end");
      await onRefusal();
      await this.page.getByRole("button", { name: "Start without these factors" }).click();
    }
    await expect(this.page).toHaveURL(runPage);
  }

  async open(periodId: string, runId: string) {
    await this.page.goto(`/periods/${periodId}/runs/${runId}`);
  }

  /** A tab of the run's pages (Contributions, Backtest, …). */
  async tab(name: string) {
    await this.page.getByRole("navigation", { name: "Run pages" }).getByRole("link", { name, exact: true }).click();
  }

  async useForFiling() {
    await this.page.getByRole("button", { name: "Use for the filing" }).click();
    await expect(this.page.getByText("Used for the filing").first()).toBeVisible();
    await expect(this.page.getByRole("button", { name: "Use for the filing" })).toHaveCount(0);
  }
}
