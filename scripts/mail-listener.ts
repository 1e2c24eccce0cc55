/**
 * The local SMTP listener for the demo, development and browser tests: SMTP on MAIL_LISTENER_SMTP_PORT (2525) and
 * what it received as JSON on MAIL_LISTENER_HTTP_PORT (2526), both on 127.0.0.1 only. Mail is accepted only from a
 * client that authenticates with MAIL_LISTENER_SECRET (the app, as SMTP_USER=ballast / SMTP_PASS).
 *
 *   npm run mail-listener        run it on its own (the browser tests do)
 *   startLocalMail()             start it inside the demo or dev process and point the app at it
 */
import path from "node:path";
import { randomBytes } from "node:crypto";
import { MAIL_LISTENER_USER, startMailListener } from "../lib/mail/listener";

const smtpPort = () => Number(process.env.MAIL_LISTENER_SMTP_PORT ?? 2525);
const httpPort = () => Number(process.env.MAIL_LISTENER_HTTP_PORT ?? 2526);

/**
 * For the demo and development: unless SMTP_HOST names a real mail server, start the listener in this process and
 * set SMTP_HOST/SMTP_PORT/MAIL_LISTENER_URL for the app it spawns. Also makes sure the scheduler has a secret.
 */
export async function startLocalMail(): Promise<void> {
  process.env.REMINDERS_SECRET ||= randomBytes(24).toString("base64url");
  if (process.env.SMTP_HOST && !process.env.MAIL_LISTENER_URL) {
    console.log(`Mail goes to ${process.env.SMTP_HOST}:${process.env.SMTP_PORT ?? 587} (SMTP_HOST is set); no local listener.`);
    return;
  }
  // Only the app's own transport may send: it authenticates with a secret made here for this run.
  process.env.MAIL_LISTENER_SECRET ||= randomBytes(24).toString("base64url");
  const listener = await startMailListener({ smtpPort: smtpPort(), httpPort: httpPort(), secret: process.env.MAIL_LISTENER_SECRET });
  process.env.SMTP_HOST = "127.0.0.1";
  process.env.SMTP_PORT = String(listener.smtpPort);
  process.env.SMTP_USER = MAIL_LISTENER_USER;
  process.env.SMTP_PASS = process.env.MAIL_LISTENER_SECRET;
  process.env.MAIL_LISTENER_URL = `http://127.0.0.1:${listener.httpPort}`;
  process.env.SMTP_FROM ||= "Ballast reminders <reminders@ballast.example>";
  console.log(`Local mail listener: SMTP on 127.0.0.1:${listener.smtpPort}; an administrator sees what it received under Settings → Mail received.`);
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(__filename)) {
  // On its own (the browser tests): MAIL_LISTENER_SECRET, shared with the app as SMTP_PASS, is required to send.
  if (!process.env.MAIL_LISTENER_SECRET) console.warn("mail listener: MAIL_LISTENER_SECRET is not set; any local process may send mail to it.");
  startMailListener({ smtpPort: smtpPort(), httpPort: httpPort(), secret: process.env.MAIL_LISTENER_SECRET || undefined })
    .then((listener) => {
      console.log(`mail listener: SMTP on 127.0.0.1:${listener.smtpPort}, messages at http://127.0.0.1:${listener.httpPort}/messages`);
      for (const signal of ["SIGINT", "SIGTERM"] as const) {
        process.on(signal, () => {
          listener.close().finally(() => process.exit(0));
        });
      }
    })
    .catch((error: Error) => {
      console.error(`mail listener could not start: ${error.message}`);
      process.exit(1);
    });
}
