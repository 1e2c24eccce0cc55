/**
 * `npm run reminders`: run the reminder scheduler once against the configured database and mail server, for a
 * system scheduler (cron, a systemd timer). Opens due periods, sends due reminders, prints what it did as JSON, and
 * exits non-zero when a reminder could not be sent. `--as-of yyyy-mm-dd` acts as of another day (test-only, like
 * BALLAST_CLOCK: refused in production unless BALLAST_ALLOW_CLOCK=1).
 *
 * Runs with `node --conditions=react-server` so that the app's server-only modules load outside Next.js.
 */
import { existsSync } from "node:fs";
import path from "node:path";

async function main() {
  const index = process.argv.indexOf("--as-of");
  const asOf = index > 0 ? process.argv[index + 1] : undefined;
  if (asOf !== undefined) {
    const { dateProblem } = await import("../lib/calendar/validation");
    const problem = dateProblem(asOf ?? "");
    if (problem) throw new Error(`--as-of: ${problem}`);
    if (process.env.NODE_ENV === "production" && process.env.BALLAST_ALLOW_CLOCK !== "1") throw new Error("--as-of is test-only; set BALLAST_ALLOW_CLOCK=1 to allow it.");
  }
  const { runReminders } = await import("../lib/data/reminders");
  const { getMailer } = await import("../lib/mail/transport");
  const result = await runReminders({ asOf });
  getMailer()?.close();
  console.log(JSON.stringify(result, null, 2));
  process.exit(result.failed > 0 || result.mail !== "ok" ? 1 : 0);
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(__filename)) {
  if (existsSync(".env.local")) process.loadEnvFile(".env.local");
  main().catch((error) => {
    console.error(`reminders: ${error instanceof Error ? error.message : error}`);
    process.exit(2);
  });
}
