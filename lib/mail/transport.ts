/**
 * Outgoing e-mail: one nodemailer SMTP transport configured from the environment (SMTP_HOST, SMTP_PORT, SMTP_USER,
 * SMTP_PASS, SMTP_FROM). In the demo, development and tests SMTP_HOST is the local listener (scripts/mail-listener.ts).
 */
import nodemailer, { type Transporter } from "nodemailer";

export interface MailConfig {
  host: string;
  port: number;
  user?: string;
  pass?: string;
  from: string;
}

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  headers?: Record<string, string>;
}

/** What a mailer does: send one message or throw. */
export interface Mailer {
  /** where it sends, for messages ("127.0.0.1:2525") */
  readonly describe: string;
  send(message: OutgoingMail): Promise<{ messageId: string }>;
  close(): void;
}

/** The mail settings in force, or null when no SMTP_HOST is set (nothing can be sent). */
export function mailConfigFromEnv(env: Record<string, string | undefined> = process.env): MailConfig | null {
  const host = env.SMTP_HOST?.trim();
  if (!host) return null;
  const port = Number(env.SMTP_PORT ?? 587);
  return {
    host,
    port: Number.isInteger(port) && port > 0 ? port : 587,
    user: env.SMTP_USER || undefined,
    pass: env.SMTP_PASS || undefined,
    from: env.SMTP_FROM || "Ballast reminders <reminders@ballast.example>",
  };
}

const isLoopback = (host: string) => host === "127.0.0.1" || host === "localhost" || host === "::1";

/** A mailer over SMTP. Loopback listeners are spoken to in plain text; other servers with STARTTLS when offered (465: TLS). */
export function createMailer(config: MailConfig): Mailer {
  const transport: Transporter = nodemailer.createTransport({
    host: config.host,
    port: config.port,
    secure: config.port === 465,
    ignoreTLS: isLoopback(config.host),
    auth: config.user ? { user: config.user, pass: config.pass ?? "" } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  });
  return {
    describe: `${config.host}:${config.port}`,
    async send(message) {
      const info = await transport.sendMail({ from: config.from, ...message });
      return { messageId: String(info.messageId ?? "") };
    },
    close: () => transport.close(),
  };
}

const globalForMail: typeof globalThis & { ballastMailer?: { key: string; mailer: Mailer } } = globalThis;

/** The process-wide mailer for the configured SMTP settings, or null when none are set. */
export function getMailer(): Mailer | null {
  const config = mailConfigFromEnv();
  if (!config) return null;
  const key = JSON.stringify(config);
  if (globalForMail.ballastMailer?.key !== key) {
    globalForMail.ballastMailer?.mailer.close();
    globalForMail.ballastMailer = { key, mailer: createMailer(config) };
  }
  return globalForMail.ballastMailer.mailer;
}

/** A short, plain account of a send failure ("could not reach the mail server at …"). */
export function describeMailError(error: unknown, where: string): string {
  const e = error as { code?: string; responseCode?: number; response?: string; message?: string };
  // nodemailer reports socket failures as ESOCKET with the system's code in the message.
  const code = e?.code === "ESOCKET" || e?.code === "ECONNECTION" ? (/\b(E[A-Z]{3,})\b/.exec(e.message ?? "")?.[1] ?? e.code) : e?.code;
  if (code === "ECONNREFUSED") return `Could not reach the mail server at ${where} (connection refused).`;
  if (code === "ETIMEDOUT" || code === "ETIMEDOUT_GREETING") return `The mail server at ${where} did not answer in time.`;
  if (code === "ENOTFOUND" || code === "EDNS" || code === "EAI_AGAIN") return `The mail server name in SMTP_HOST (${where}) could not be found.`;
  if (code === "EAUTH") return `The mail server at ${where} refused the SMTP_USER / SMTP_PASS sign-in.`;
  if (e?.responseCode) return `The mail server at ${where} refused the message: ${e.responseCode} ${(e.response ?? "").slice(0, 160)}`;
  return `Sending through ${where} failed: ${(e?.message ?? String(error)).slice(0, 200)}`;
}
