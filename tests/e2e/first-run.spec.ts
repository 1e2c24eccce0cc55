/**
 * The first run of an empty install: a server of its own (the same build) on an empty, migrated database, since
 * the shared browser-test server holds the demo. The landing page leads to the set-up screen, which creates the
 * firm and its first administrator once and is refused after.
 */
import { test, expect } from "@playwright/test";
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { rmSync } from "node:fs";
import path from "node:path";
import { E2E_ENV } from "../../playwright.config";

const PORT = Number(process.env.E2E_PORT ?? 3100) + 9;
const BASE = `http://localhost:${PORT}`;
const DB_FILE = `data/e2e-first-run-${PORT}.db`;
let server: ChildProcess | null = null;

test.describe.configure({ mode: "serial" });

test.beforeAll(async () => {
  test.setTimeout(120_000);
  for (const suffix of ["", "-wal", "-shm"]) rmSync(path.resolve(DB_FILE + suffix), { force: true });
  const env = { ...process.env, ...E2E_ENV, DATABASE_URL: `file:./${DB_FILE}`, BALLAST_URL: BASE, PORT: String(PORT) };
  const migrated = spawnSync(process.execPath, ["--import", "tsx", "db/migrate.ts"], { env, encoding: "utf8" });
  expect(migrated.status, migrated.stderr).toBe(0);
  server = spawn(process.execPath, ["node_modules/next/dist/bin/next", "start", "-p", String(PORT)], { env, stdio: "ignore" });
  await expect.poll(async () => (await fetch(`${BASE}/api/health`).catch(() => null))?.status ?? 0, { timeout: 90_000, intervals: [500] }).toBe(200);
});

test.afterAll(async () => {
  server?.kill();
});

test("an empty install starts with its first-run screen, which creates the firm and its administrator once", async ({ page }) => {
  await page.goto(`${BASE}/`);
  await expect(page).toHaveURL(`${BASE}/setup`);
  await expect(page.getByRole("heading", { name: "Set up Ballast" })).toBeVisible();
  await page.getByRole("button", { name: "Create the firm" }).click();
  await expect(page.getByText("Enter the firm's name (at least 2 characters).")).toBeVisible();
  await page.getByLabel("Firm name").fill("Harrow Lane Securities");
  await page.getByLabel("Reporting currency").selectOption("GBP");
  await page.getByLabel("Your name").fill("Mara Quinn");
  await page.getByLabel("Your e-mail").fill("mara.quinn@harrow.example");
  await page.getByLabel("Password", { exact: true }).fill("harrow-first-long-phrase-71");
  await page.getByLabel("The same password again").fill("harrow-first-long-phrase-71");
  await page.screenshot({ path: "test-results/screens/first-run.png", fullPage: true });
  await page.getByRole("button", { name: "Create the firm" }).click();
  await expect(page.getByRole("status")).toContainText("The firm is created. Sign in as mara.quinn@harrow.example");

  await page.getByRole("link", { name: "Sign in" }).click();
  await page.getByLabel("E-mail").fill("mara.quinn@harrow.example");
  await page.getByLabel("Password").fill("harrow-first-long-phrase-71");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(`${BASE}/home`);
  await expect(page.getByText("Harrow Lane Securities").first()).toBeVisible();
  await page.screenshot({ path: "test-results/screens/first-run-home.png", fullPage: true });

  // once only: the screen says so, and the route refuses
  const signedOut = await page.context().browser()!.newPage();
  await signedOut.goto(`${BASE}/setup`);
  await expect(signedOut.getByRole("heading", { name: "Ballast is set up" })).toBeVisible();
  const again = await fetch(`${BASE}/api/setup`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: BASE },
    body: JSON.stringify({ firmName: "Second Firm", reportingCurrency: "EUR", adminName: "Al Second", adminEmail: "al@second.example", password: "second-long-phrase-72", confirm: "second-long-phrase-72" }),
  });
  expect(again.status).toBe(409);
  expect((await again.json()).error.message).toBe("This installation is already set up; sign in instead.");
  await signedOut.close();
});
