/**
 * "reminders": one round of the reminder scheduler (lib/data/reminders.ts: opens due periods, records then sends due
 * reminders). Safe to run again: each reminder is recorded before it is sent and claimed once. The worker keeps one
 * queued, due REMINDERS_INTERVAL_MINUTES (default 10; 0 turns the schedule off) after the last round finished.
 * `npm run reminders` and POST /api/cron/reminders still run a round on demand.
 */
import "server-only";
import type { JobKind } from "../types";

export function remindersIntervalMs(): number {
  const minutes = Number(process.env.REMINDERS_INTERVAL_MINUTES ?? 10);
  return Number.isFinite(minutes) && minutes > 0 ? minutes * 60_000 : 0;
}

export const remindersJob: JobKind = {
  async handle(context) {
    const { runReminders } = await import("@/lib/data/reminders");
    await context.progress("sending", 0);
    const result = await runReminders();
    if (result.failed > 0) console.error(`reminders: ${result.failed} not sent (${result.problems.join(" ")})`);
    return result;
  },
  schedule: { everyMs: remindersIntervalMs, maxAttempts: 3 },
};
