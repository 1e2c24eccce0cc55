import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createServer } from "node:net";
import { renderTemplate, readTemplate, TemplateError } from "@/lib/templates/render";
import { createMailer, describeMailError, mailConfigFromEnv } from "@/lib/mail/transport";
import { startMailListener, type MailListener } from "@/lib/mail/listener";

/** A loopback port with nothing listening on it. */
async function closedPort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const port = (server.address() as { port: number }).port;
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

describe("renderTemplate", () => {
  it("fills placeholders and throws naming every missing key", () => {
    expect(renderTemplate("Hello {{name}}, {{ days }} left", { name: "Tomas", days: 5 })).toBe("Hello Tomas, 5 left");
    expect(() => renderTemplate("{{a}} {{b}} {{c}}", { a: "x" })).toThrow(new TemplateError("The template needs a value for: b, c."));
  });

  it("escapes values for HTML when asked, and only the values", () => {
    expect(renderTemplate('<p title="{{t}}">{{t}}</p>', { t: `<b>"O'Neil" & co</b>` }, { html: true })).toBe(
      '<p title="&lt;b&gt;&quot;O&#39;Neil&quot; &amp; co&lt;/b&gt;">&lt;b&gt;&quot;O&#39;Neil&quot; &amp; co&lt;/b&gt;</p>',
    );
  });

  it("the reminder templates use only keys the reminder provides", () => {
    const keys = new Set<string>();
    for (const name of ["email/reminder.txt", "email/reminder.html", "email/reminder-subject.txt"]) {
      for (const m of readTemplate(name).matchAll(/\{\{\s*(\w+)\s*\}\}/g)) keys.add(m[1]);
    }
    expect([...keys].sort()).toEqual(["deadline", "firmName", "footer", "lead", "link", "ownerLabel", "periodEnd", "periodLabel", "recipientName", "stepLabel", "timing", "timingTitle"]);
  });
});

describe("SMTP transport and the local listener", () => {
  let listener: MailListener;
  beforeAll(async () => {
    listener = await startMailListener({ smtpPort: 0, httpPort: 0 });
  });
  afterAll(async () => {
    await listener.close();
  });

  it("reads its settings from the environment", () => {
    expect(mailConfigFromEnv({})).toBeNull();
    expect(mailConfigFromEnv({ SMTP_HOST: "127.0.0.1", SMTP_PORT: "2525" })).toEqual({ host: "127.0.0.1", port: 2525, user: undefined, pass: undefined, from: "Ballast reminders <reminders@ballast.example>" });
    expect(mailConfigFromEnv({ SMTP_HOST: "mail.example", SMTP_USER: "u", SMTP_PASS: "p", SMTP_FROM: "x@example.org" })).toMatchObject({ port: 587, user: "u", pass: "p", from: "x@example.org" });
  });

  it("a message sent through nodemailer arrives intact and is served as JSON", async () => {
    const mailer = createMailer({ host: "127.0.0.1", port: listener.smtpPort, from: "Ballast <reminders@ballast.example>" });
    await mailer.send({ to: "Tomas Reyne <tomas.reyne@northmoor.example>", subject: "Deadline — ünïcode", text: "Line one\nLine two", html: "<p>Line one</p>", headers: { "X-Ballast-Firm": "firm-1" } });
    mailer.close();
    const response = await fetch(`http://127.0.0.1:${listener.httpPort}/messages`);
    const { messages } = await response.json();
    expect(messages).toHaveLength(1);
    expect(messages[0]).toMatchObject({ to: ["tomas.reyne@northmoor.example"], subject: "Deadline — ünïcode", html: "<p>Line one</p>", firmId: "firm-1", from: '"Ballast" <reminders@ballast.example>' });
    expect(messages[0].text.trim()).toBe("Line one\nLine two");
    await fetch(`http://127.0.0.1:${listener.httpPort}/messages`, { method: "DELETE" });
    expect(listener.messages).toHaveLength(0);
  });

  it("an unreachable server gives a clear message, not a crash", async () => {
    const port = await closedPort();
    const mailer = createMailer({ host: "127.0.0.1", port, from: "x@ballast.example" });
    const error = await mailer.send({ to: "a@northmoor.example", subject: "s", text: "t", html: "<p>t</p>" }).catch((e: unknown) => e);
    mailer.close();
    expect(error).toBeInstanceOf(Error);
    expect(describeMailError(error, `127.0.0.1:${port}`)).toBe(`Could not reach the mail server at 127.0.0.1:${port} (connection refused).`);
  });
});
