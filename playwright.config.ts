import { defineConfig } from "@playwright/test";
import { randomBytes } from "node:crypto";

/**
 * Browser tests against a production build (`next start`) on loopback, driving Debian's Chromium. The server gets
 * its own database (data/e2e.db, seeded fresh) and a clock pinned to 2026-12-01 so that deadlines are stable.
 */
const PORT = Number(process.env.E2E_PORT ?? 3100);
const UPLOAD_PORT = Number(process.env.E2E_UPLOAD_PORT ?? 4110);
const uploadToken =
  process.env.E2E_UPLOADTHING_TOKEN ??
  Buffer.from(JSON.stringify({ apiKey: `sk_e2e_${randomBytes(12).toString("hex")}`, appId: "ballast-e2e", regions: ["local"] })).toString("base64");
process.env.E2E_UPLOADTHING_TOKEN = uploadToken;
/** The browser tests' own database file (E2E_DB_FILE lets side-by-side runs keep theirs apart; scripts/e2e-slot.sh). */
export const E2E_DB_FILE = process.env.E2E_DB_FILE ?? "data/e2e.db";
process.env.E2E_DB_FILE = E2E_DB_FILE;
/** The job worker's health port (scripts/worker.ts), so that the suite waits for it. */
const WORKER_PORT = Number(process.env.E2E_WORKER_PORT ?? UPLOAD_PORT + 5);
const MAIL_SMTP_PORT = Number(process.env.E2E_MAIL_SMTP_PORT ?? 4125);
const MAIL_HTTP_PORT = Number(process.env.E2E_MAIL_HTTP_PORT ?? 4126);
process.env.E2E_REMINDERS_SECRET ??= randomBytes(24).toString("base64url");
process.env.E2E_MAIL_SECRET ??= randomBytes(24).toString("base64url");
export const E2E_ENV = {
  UPLOADTHING_TOKEN: uploadToken,
  UPLOADTHING_INGEST_URL: `http://127.0.0.1:${UPLOAD_PORT}`,
  UPLOADTHING_API_URL: `http://127.0.0.1:${UPLOAD_PORT}`,
  UPLOAD_STANDIN_PORT: String(UPLOAD_PORT),
  UPLOAD_STANDIN_DIR: process.env.E2E_UPLOAD_DIR ?? "data/e2e-uploads",
  DATABASE_URL: `file:./${E2E_DB_FILE}`,
  AUTH_SECRET: process.env.E2E_AUTH_SECRET ?? randomBytes(32).toString("base64url"),
  AUTH_TRUST_HOST: "true",
  BALLAST_CLOCK: "2026-12-01",
  BALLAST_ALLOW_CLOCK: "1",
  NEXT_TELEMETRY_DISABLED: "1",
  // E-mail goes to the local listener (scripts/mail-listener.ts), which the app's "Mail received" page reads.
  SMTP_HOST: "127.0.0.1",
  SMTP_PORT: String(MAIL_SMTP_PORT),
  SMTP_FROM: "Ballast reminders <reminders@ballast.example>",
  MAIL_LISTENER_SMTP_PORT: String(MAIL_SMTP_PORT),
  MAIL_LISTENER_HTTP_PORT: String(MAIL_HTTP_PORT),
  MAIL_LISTENER_URL: `http://127.0.0.1:${MAIL_HTTP_PORT}`,
  // Only the app may send to the listener: it authenticates with this run's secret.
  MAIL_LISTENER_SECRET: process.env.E2E_MAIL_SECRET,
  SMTP_USER: "ballast",
  SMTP_PASS: process.env.E2E_MAIL_SECRET,
  REMINDERS_SECRET: process.env.E2E_REMINDERS_SECRET,
  BALLAST_URL: `http://localhost:${PORT}`,
};
process.env.E2E_AUTH_SECRET = E2E_ENV.AUTH_SECRET;

export default defineConfig({
  testDir: "tests/e2e",
  outputDir: process.env.E2E_OUTPUT_DIR ?? "test-results",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [["list"], ["json", { outputFile: ".test-output/e2e.json" }]],
  use: {
    baseURL: `http://localhost:${PORT}`,
    screenshot: "only-on-failure",
    trace: "retain-on-failure",
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      args: [
        "--no-sandbox",
        "--disable-gpu",
        "--disable-dev-shm-usage",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
        "--no-first-run",
        "--disable-quic",
      ],
    },
  },
  webServer: [
    {
      // The upload service's loopback stand-in (scripts/upload-standin.ts), with its own folder for the run.
      command: "node --import tsx scripts/upload-standin.ts",
      url: `http://127.0.0.1:${UPLOAD_PORT}/health`,
      env: E2E_ENV,
      reuseExistingServer: false,
      timeout: 30_000,
      stdout: "ignore",
      stderr: "pipe",
    },
    {
      // The local SMTP listener; tests read and clear it at E2E_ENV.MAIL_LISTENER_URL.
      command: "node --import tsx scripts/mail-listener.ts",
      url: `http://127.0.0.1:${MAIL_HTTP_PORT}/health`,
      env: E2E_ENV,
      reuseExistingServer: false,
      timeout: 30_000,
      stdout: "ignore",
      stderr: "pipe",
    },
    {
      // The production web tier (scripts/serve.ts); E2E_WEB_CONCURRENCY=2 runs two web processes, so that a request may
      // land on either and the suite shows the app keeps no state in one process.
      command: `node --conditions=react-server --import tsx db/seed.ts && node --import tsx scripts/serve.ts`,
      url: `http://localhost:${PORT}/api/health`,
      env: { ...E2E_ENV, PORT: String(PORT), WEB_CONCURRENCY: process.env.E2E_WEB_CONCURRENCY ?? "1" },
      reuseExistingServer: false,
      timeout: 120_000,
      stdout: "ignore",
      stderr: "pipe",
    },
    {
      // One job worker (npm run worker) on the same database and settings, after the seed above: it computes the runs
      // the specs start. The reminder round stays on demand (the specs call the cron route and count the mail).
      command: "node --conditions=react-server --import tsx scripts/worker.ts",
      url: `http://127.0.0.1:${WORKER_PORT}/health`,
      env: { ...E2E_ENV, WORKER_HEALTH_PORT: String(WORKER_PORT), REMINDERS_INTERVAL_MINUTES: "0", WORKER_GRACE_SECONDS: "2" },
      reuseExistingServer: false,
      timeout: 60_000,
      stdout: "ignore",
      stderr: "pipe",
    },
  ],
});
