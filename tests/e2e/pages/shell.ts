import { expect, type Page } from "@playwright/test";

/** The signed-in shell: firm, person, navigation, sign-out. */
export class Shell {
  constructor(private readonly page: Page) {}

  async expectSignedInAs(name: string, firm: string) {
    await expect(this.page.getByTestId("user-name")).toHaveText(name);
    await expect(this.page.getByTestId("firm-name")).toHaveText(firm);
    await expect(this.page.getByRole("navigation", { name: "Month end" })).toBeVisible();
  }

  nav(label: string) {
    return this.page.getByRole("navigation", { name: "Month end" }).getByRole("link", { name: label });
  }

  async signOut() {
    await this.page.getByRole("button", { name: "Sign out" }).click();
    await expect(this.page).toHaveURL(/\/sign-in/);
  }
}
