/**
 * A real SMTP listener on loopback for the demo, development and tests: smtp-server receives, mailparser parses,
 * and the messages are kept in memory and served as JSON on a second loopback port (GET /messages, DELETE
 * /messages, GET /health). `refuseFirst: n` turns away the first n connections, to exercise retries.
 */
import { createServer as createHttpServer, type Server as HttpServer } from "node:http";
import type { AddressInfo } from "node:net";
import { SMTPServer } from "smtp-server";
import { simpleParser } from "mailparser";
import { timingSafeEqual } from "node:crypto";

/** The SMTP user name the app's transport uses with the listener's secret (SMTP_USER). */
export const MAIL_LISTENER_USER = "ballast";

export interface ReceivedMessage {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  /** the X-Ballast-Firm header: which firm's reminder this is, so each firm's admin sees only its own */
  firmId: string | null;
  messageId: string | null;
}

export interface MailListener {
  smtpPort: number;
  httpPort: number | null;
  messages: ReceivedMessage[];
  /** connections refused so far */
  refused: number;
  close(): Promise<void>;
}

export async function startMailListener(options: {
  host?: string;
  smtpPort?: number;
  /** a port for the JSON endpoint; omit for none */
  httpPort?: number;
  refuseFirst?: number;
  /**
   * When set, only the app's own client is accepted: a session must authenticate (SMTP AUTH, user "ballast",
   * this password) before it may send, so no other local process can file mail under a firm's header.
   */
  secret?: string;
} = {}): Promise<MailListener> {
  const host = options.host ?? "127.0.0.1";
  const messages: ReceivedMessage[] = [];
  let nextId = 1;
  const state = { refused: 0 };

  const secret = options.secret;
  const smtp = new SMTPServer({
    authOptional: !secret,
    // Loopback only, so AUTH in plain text is acceptable here; without a secret any credentials are taken.
    allowInsecureAuth: true,
    authMethods: ["PLAIN", "LOGIN"],
    disabledCommands: ["STARTTLS"],
    onAuth(auth, _session, callback) {
      if (!secret) return callback(null, { user: String(auth.username ?? "") });
      const given = Buffer.from(String(auth.password ?? ""));
      const wanted = Buffer.from(secret ?? "");
      if (secret && auth.username === MAIL_LISTENER_USER && given.length === wanted.length && timingSafeEqual(given, wanted)) {
        return callback(null, { user: MAIL_LISTENER_USER });
      }
      const error = new Error("Authentication refused: only Ballast itself may send here") as Error & { responseCode: number };
      error.responseCode = 535;
      return callback(error);
    },
    logger: false,
    banner: "Ballast local mail listener",
    onConnect(_session, callback) {
      if (state.refused < (options.refuseFirst ?? 0)) {
        state.refused++;
        const error = new Error("Not accepting mail yet (test listener)") as Error & { responseCode: number };
        error.responseCode = 421;
        return callback(error);
      }
      callback();
    },
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const firm = parsed.headers.get("x-ballast-firm");
          messages.push({
            id: nextId++,
            receivedAt: new Date().toISOString(),
            from: parsed.from?.text ?? String(session.envelope.mailFrom && session.envelope.mailFrom.address),
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? "",
            text: parsed.text ?? "",
            html: typeof parsed.html === "string" ? parsed.html : "",
            firmId: typeof firm === "string" ? firm : null,
            messageId: parsed.messageId ?? null,
          });
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  await new Promise<void>((resolve, reject) => {
    smtp.once("error", reject);
    smtp.listen(options.smtpPort ?? 0, host, () => resolve());
  });
  smtp.on("error", (error) => console.error("[mail-listener]", error.message));
  const smtpPort = (smtp.server.address() as AddressInfo).port;

  let http: HttpServer | null = null;
  if (options.httpPort !== undefined) {
    http = createHttpServer((request, response) => {
      const url = new URL(request.url ?? "/", "http://listener");
      const json = (status: number, body: unknown) => {
        response.writeHead(status, { "content-type": "application/json" });
        response.end(JSON.stringify(body));
      };
      if (url.pathname === "/health" && request.method === "GET") return json(200, { status: "ok", smtpPort, messages: messages.length });
      if (url.pathname === "/messages" && request.method === "GET") return json(200, { messages });
      if (url.pathname === "/messages" && request.method === "DELETE") {
        messages.length = 0;
        return json(200, { ok: true });
      }
      json(404, { error: "not found" });
    });
    await new Promise<void>((resolve, reject) => {
      http!.once("error", reject);
      http!.listen(options.httpPort, host, () => resolve());
    });
  }

  return {
    smtpPort,
    httpPort: http ? (http.address() as AddressInfo).port : null,
    messages,
    get refused() {
      return state.refused;
    },
    async close() {
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
      if (http) await new Promise<void>((resolve) => http!.close(() => resolve()));
    },
  };
}
