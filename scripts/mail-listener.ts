/**
 * The local SMTP listener for the demo, development and browser tests: SMTP on MAIL_LISTENER_SMTP_PORT (2525) and
 * what it received as JSON on MAIL_LISTENER_HTTP_PORT (2526), both on 127.0.0.1 only. Point the app at it with
 * SMTP_HOST=127.0.0.1 SMTP_PORT=2525 MAIL_LISTENER_URL=http://127.0.0.1:2526.
 */
import { startMailListener } from "../lib/mail/listener";

const smtpPort = Number(process.env.MAIL_LISTENER_SMTP_PORT ?? 2525);
const httpPort = Number(process.env.MAIL_LISTENER_HTTP_PORT ?? 2526);

startMailListener({ smtpPort, httpPort })
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
