import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { MAIL_LISTENER_USER, startMailListener, type MailListener } from "@/lib/mail/listener";
import { createMailer } from "@/lib/mail/transport";

let listener: MailListener;
const SECRET = "listener-secret-for-this-test";

beforeAll(async () => {
  listener = await startMailListener({ smtpPort: 0, secret: SECRET });
});
afterAll(async () => {
  await listener.close();
});

const message = { to: "ada.quayle@northmoor.example", subject: "Injected", text: "t", html: "<p>t</p>", headers: { "X-Ballast-Firm": "any-firm" } };

describe("the local mail listener accepts only the app's own client", () => {
  it("refuses a client that does not authenticate, or with the wrong secret, and files nothing", async () => {
    for (const auth of [{}, { user: MAIL_LISTENER_USER, pass: "guess" }, { user: "someone", pass: SECRET }]) {
      const mailer = createMailer({ host: "127.0.0.1", port: listener.smtpPort, from: "x@evil.example", ...auth });
      await expect(mailer.send(message)).rejects.toThrow();
      mailer.close();
    }
    expect(listener.messages).toHaveLength(0);
  });

  it("accepts the app's transport with the secret", async () => {
    const mailer = createMailer({ host: "127.0.0.1", port: listener.smtpPort, from: "Ballast <reminders@ballast.example>", user: MAIL_LISTENER_USER, pass: SECRET });
    await mailer.send(message);
    mailer.close();
    expect(listener.messages).toHaveLength(1);
  });
});
