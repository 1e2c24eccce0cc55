import { test, expect, type Page } from "@playwright/test";
import { readdirSync, readFileSync, statSync, existsSync } from "node:fs";
import path from "node:path";
import { DEMO_USERS, signInThroughPage } from "./helpers";

/** Collect the browser's reports of content-security-policy violations on a page. */
function watchViolations(page: Page): string[] {
  const violations: string[] = [];
  page.on("console", (message) => {
    const text = message.text();
    if (/Content Security Policy|Refused to (load|execute|apply|connect)/i.test(text)) violations.push(`${page.url()}: ${text}`);
  });
  return violations;
}

test("every page carries the security headers and passes its own content security policy", async ({ page }) => {
  const violations = watchViolations(page);
  for (const url of ["/", "/sign-in"]) {
    const response = await page.goto(url);
    const headers = response!.headers();
    expect(headers["content-security-policy"]).toContain("frame-ancestors 'none'");
    expect(headers["content-security-policy"]).toMatch(/script-src 'self' 'nonce-[^']+' 'strict-dynamic'/);
    expect(headers["x-content-type-options"]).toBe("nosniff");
    expect(headers["referrer-policy"]).toBe("strict-origin-when-cross-origin");
    expect(headers["x-frame-options"]).toBe("DENY");
  }
  await signInThroughPage(page, DEMO_USERS[0].email);
  for (const link of ["Data", "Periods", "Calendar", "Settings", "Audit trail", "This month"]) {
    await page.getByRole("navigation", { name: "Month end" }).getByRole("link", { name: link }).click();
    await expect(page.locator("h1")).toBeVisible();
  }
  await page.goto("/periods");
  await page.getByRole("link", { name: "November 2026" }).click();
  await page.getByRole("link", { name: "Data-quality report" }).click();
  await expect(page.locator("h1")).toHaveText("Data-quality report");
  // A fresh nonce each time.
  const first = (await page.request.get("/sign-in")).headers()["content-security-policy"];
  const second = (await page.request.get("/sign-in")).headers()["content-security-policy"];
  expect(first).not.toBe(second);
  expect(violations).toEqual([]);
});

test("no secret reaches the browser's files", () => {
  const secrets = [process.env.E2E_AUTH_SECRET, process.env.E2E_UPLOADTHING_TOKEN].filter((s): s is string => Boolean(s));
  if (existsSync(".env.local")) {
    for (const line of readFileSync(".env.local", "utf8").split("\n")) {
      const [key, ...rest] = line.split("=");
      if (/SECRET|TOKEN|PASS/.test(key ?? "") && rest.join("=").length >= 8) secrets.push(rest.join("="));
    }
  }
  const apiKey = process.env.E2E_UPLOADTHING_TOKEN ? JSON.parse(Buffer.from(process.env.E2E_UPLOADTHING_TOKEN, "base64").toString()).apiKey : null;
  if (apiKey) secrets.push(apiKey);
  const files: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const full = path.join(dir, name);
      if (statSync(full).isDirectory()) walk(full);
      else if (/\.(js|css|html|json|map)$/.test(name)) files.push(full);
    }
  };
  walk(path.join(".next", "static"));
  expect(files.length).toBeGreaterThan(5);
  for (const file of files) {
    const text = readFileSync(file, "utf8");
    for (const secret of secrets) expect(text.includes(secret), `${file} contains a secret`).toBe(false);
    expect(text, file).not.toMatch(/AUTH_SECRET|UPLOADTHING_TOKEN|REMINDERS_SECRET|DATABASE_AUTH_TOKEN/);
  }
});
