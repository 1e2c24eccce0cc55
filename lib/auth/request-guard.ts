/**
 * Checks every JSON write goes through before it reaches the gate's handler (lib/auth/route.ts): the request comes
 * from the app's own pages (Origin / Sec-Fetch-Site), carries JSON (Content-Type), and is not larger than a sane
 * limit (read as a stream, so a body that lies about its length is cut off too). Pure: no Next.js imports.
 */
import { AppError } from "@/lib/errors";

/** The largest JSON body a route reads (1 MiB; the biggest legitimate one, a holiday CSV, is a few kilobytes). */
export const MAX_JSON_BODY_BYTES = 1024 * 1024;

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * The origins the app answers writes from: the request's own origin (as the server sees it) and those named in
 * BALLAST_ORIGINS (comma-separated, e.g. "https://ballast.example.com" behind a TLS proxy) or AUTH_URL.
 */
export function allowedOrigins(request: Request, env: Record<string, string | undefined> = process.env): Set<string> {
  const origins = new Set<string>([new URL(request.url).origin]);
  for (const value of [...(env.BALLAST_ORIGINS ?? "").split(","), env.AUTH_URL ?? ""]) {
    const trimmed = value.trim();
    if (!trimmed) continue;
    try {
      origins.add(new URL(trimmed).origin);
    } catch {
      // a malformed entry names no origin
    }
  }
  return origins;
}

/**
 * Refuse a write sent from another origin: a browser tells us through Sec-Fetch-Site (anything but same-origin,
 * or none for a typed address) and Origin (must be one of ours; "null" is never). A client that sends neither is
 * not a browser and so carries no one's cookie by accident.
 */
export function assertSameOrigin(request: Request, env: Record<string, string | undefined> = process.env): void {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return;
  const site = request.headers.get("sec-fetch-site");
  if (site && site !== "same-origin" && site !== "none") {
    throw new AppError("forbidden:origin", "This request came from another site and was refused.");
  }
  const origin = request.headers.get("origin");
  if (origin !== null && !allowedOrigins(request, env).has(origin)) {
    throw new AppError("forbidden:origin", "This request came from another site and was refused.");
  }
}

/** Whether a Content-Type header names JSON (application/json, with or without parameters). */
export function isJsonContentType(value: string | null): boolean {
  if (!value) return false;
  const type = value.split(";")[0].trim().toLowerCase();
  return type === "application/json";
}

/** Read a JSON body: 415 unless it says it is JSON, 413 past `limit` bytes (counted as read), 400 when not JSON. */
export async function readJsonBody(request: Request, limit = MAX_JSON_BODY_BYTES): Promise<unknown> {
  if (!isJsonContentType(request.headers.get("content-type"))) {
    throw new AppError("unsupported_media:body", "Send the request body as JSON (Content-Type: application/json).");
  }
  const declared = Number(request.headers.get("content-length") ?? "0");
  const tooLarge = () => new AppError("too_large:body", `The request body is larger than ${Math.round(limit / 1024)} KiB.`);
  if (Number.isFinite(declared) && declared > limit) throw tooLarge();
  const text = await readCapped(request, limit, tooLarge);
  try {
    return JSON.parse(text);
  } catch {
    throw new AppError("bad_request:body", "The request body is not valid JSON.");
  }
}

/**
 * A copy of a request whose body was read whole up to `limit` bytes (413 past it, by Content-Length or as read):
 * for handlers that read the body themselves (the upload service's route).
 */
export async function cappedRequest(request: Request, limit = MAX_JSON_BODY_BYTES): Promise<Request> {
  if (SAFE_METHODS.has(request.method.toUpperCase()) || !request.body) return request;
  const tooLarge = () => new AppError("too_large:body", `The request body is larger than ${Math.round(limit / 1024)} KiB.`);
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (Number.isFinite(declared) && declared > limit) throw tooLarge();
  const text = await readCapped(request, limit, tooLarge);
  return new Request(request, { body: text });
}

async function readCapped(request: Request, limit: number, tooLarge: () => AppError): Promise<string> {
  if (!request.body) return "";
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge();
    }
    chunks.push(value);
  }
  return new TextDecoder("utf-8", { fatal: false }).decode(Buffer.concat(chunks));
}
