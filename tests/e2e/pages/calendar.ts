import { expect, type Page } from "@playwright/test";

/** The Calendar page: open periods with deadlines, coming deadlines, reminders and (for admins) delivery. */
export class CalendarPage {
  constructor(private readonly page: Page) {}

  async open() {
    await this.page.getByRole("navigation", { name: "Month end" }).getByRole("link", { name: "Calendar" }).click();
    await expect(this.page.getByRole("heading", { name: "Calendar", level: 1 })).toBeVisible();
  }

  deadlineRow(month: string) {
    return this.page.getByTestId("deadline-row").filter({ hasText: month });
  }

  comingDeadlines() {
    return this.page.getByTestId("coming-deadlines");
  }

  reminderRows() {
    return this.page.getByTestId("reminder-row");
  }

  downloadLink() {
    return this.page.getByRole("link", { name: "Download deadlines (.ics)" });
  }
}

/** Settings → Mail received: what the local listener received for the firm. */
export class MailPage {
  constructor(private readonly page: Page) {}

  async open() {
    await this.page.goto("/settings/mail");
    await expect(this.page.getByRole("heading", { name: "Mail received", level: 1 })).toBeVisible();
  }

  items() {
    return this.page.getByTestId("mail-item");
  }
}
