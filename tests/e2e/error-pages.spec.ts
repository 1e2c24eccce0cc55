import { test, expect } from "@playwright/test";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import AppError from "@/app/(app)/error";
import { signInThroughPage } from "./helpers";

// Reads only: safe anywhere in the suite's file order.
test.describe("not-found and error pages", () => {
  test("an address that matches no page: 404, in the app's look, with a way on", async ({ page }) => {
    const response = await page.goto("/no-such-page-here");
    expect(response?.status()).toBe(404);
    await expect(page.getByRole("heading", { level: 1, name: "There is no page at this address" })).toBeVisible();
    await expect(page).toHaveTitle(/Page not found/);
    await expect(page.getByRole("link", { name: "Go to this month" })).toHaveAttribute("href", "/home");
    await page.screenshot({ path: "test-results/screens/not-found-root.png", fullPage: true });
  });

  test("a record that is not the firm's: 404 inside the signed-in shell", async ({ page }) => {
    await signInThroughPage(page, "tomas.reyne@northmoor.example");
    const response = await page.goto("/periods/00000000-0000-4000-8000-000000000000");
    expect(response?.status()).toBe(404);
    await expect(page.getByRole("heading", { level: 1, name: "Nothing to show here" })).toBeVisible();
    // the shell stays: navigation and the firm are there
    await expect(page.getByRole("link", { name: "This month" }).first()).toBeVisible();
    await expect(page.getByTestId("firm-name")).toHaveText("Northmoor Brokerage Ltd");
    await page.getByRole("link", { name: "All periods" }).focus();
    await page.keyboard.press("Enter");
    await expect(page).toHaveURL(/\/periods$/);
    await page.goBack();
    await page.screenshot({ path: "test-results/screens/not-found-signed-in.png", fullPage: true });
  });

  test("a signed-in page's error, as the shell shows it (the boundary's markup in the live page and stylesheet)", async ({ page }) => {
    // No product page fails on purpose, so the error boundary's own component is rendered by React and put where
    // the boundary puts it (the shell's main), with the app's real stylesheet and font around it.
    const markup = renderToStaticMarkup(createElement(AppError, { error: Object.assign(new Error("hidden"), { digest: "2417093388" }), retry: () => undefined }));
    await signInThroughPage(page, "tomas.reyne@northmoor.example");
    await page.locator("main#main").evaluate((main, html) => { main.innerHTML = html; }, markup);
    await expect(page.getByRole("heading", { level: 1, name: "This page could not be shown" })).toBeVisible();
    await expect(page.getByTestId("error-reference")).toHaveText("2417093388");
    await page.screenshot({ path: "test-results/screens/error-signed-in.png", fullPage: true });
  });
});
