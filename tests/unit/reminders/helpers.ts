/** Shared pieces for the scheduler tests: a mailer to a listener, a delay recorder, reading the log. */
import { createServer } from "node:net";
import { createMailer, type Mailer } from "@/lib/mail/transport";
import type { MailListener } from "@/lib/mail/listener";
import { getDb } from "@/db/client";
import { reminderLog } from "@/db/schema";

export const mailerFor = (listener: MailListener | number): Mailer =>
  createMailer({ host: "127.0.0.1", port: typeof listener === "number" ? listener : listener.smtpPort, from: "Ballast reminders <reminders@ballast.example>" });

/** Records the waits asked for instead of sleeping. */
export function delayRecorder(): { delay: (ms: number) => Promise<void>; waits: number[] } {
  const waits: number[] = [];
  return { waits, delay: async (ms) => void waits.push(ms) };
}

export async function logRows() {
  return getDb().select().from(reminderLog);
}

/** A loopback port with nothing listening on it. */
export async function closedPort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const port = (server.address() as { port: number }).port;
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

export const RUN = { asOf: "2026-12-14", now: new Date("2026-12-14T06:00:00Z"), appUrl: "http://ballast.test" };
