/**
 * The route-handler wrapper every route.ts under app/api uses: resolves the actor through the gate (or allows
 * public access explicitly), refuses writes from another origin (403), bodies that are not JSON (415) or too large
 * (413), validates params, query and JSON body with zod, and turns errors into the shared JSON shape with honest
 * status codes. Every JSON answer says `Cache-Control: private, no-store` (firm data stays out of shared and disk
 * caches) unless the handler set its own; a GET answered with a plain value carries an ETag, and a request whose
 * If-None-Match names it gets 304 without the body (apiFetch keeps the last body per address in memory and asks so).
 */
import "server-only";
import { createHash } from "node:crypto";
import type { z } from "zod";
import { AppError, toAppError, type FieldErrors } from "@/lib/errors";
import { requireActor, type Actor } from "./actor";
import { assertSameOrigin, readJsonBody } from "./request-guard";
import type { Permission } from "./permissions";

type Schema = z.ZodType;

type Gate = Permission | "member" | "public";

interface RouteOptions<P extends Schema | undefined, Q extends Schema | undefined, B extends Schema | undefined, G extends Gate> {
  /** the permission required; "member" = any signed-in member of the firm; "public" = no sign-in */
  permission: G;
  params?: P;
  query?: Q;
  body?: B;
}

type Infer<S> = S extends Schema ? z.infer<S> : undefined;

/** Who is asking: nobody on a public route, the signed-in member otherwise. */
type ActorOf<G extends Gate> = G extends "public" ? null : Actor;

export interface RouteContext<P, Q, B, A extends Actor | null = Actor> {
  actor: A;
  params: P;
  query: Q;
  body: B;
  request: Request;
}

/** Field errors from a zod error: "path.to.field" → first message. */
export function fieldErrors(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.join(".") || "_";
    fields[key] ??= issue.message;
  }
  return fields;
}

function describe(fields: FieldErrors): string {
  return Object.entries(fields)
    .slice(0, 3)
    .map(([field, message]) => (field === "_" ? message : `${field}: ${message}`))
    .join("; ");
}

/** Wrap a route handler with the gate, validation and the error shape. */
export function route<P extends Schema | undefined = undefined, Q extends Schema | undefined = undefined, B extends Schema | undefined = undefined, G extends Gate = Gate>(
  options: RouteOptions<P, Q, B, G>,
  handler: (ctx: RouteContext<Infer<P>, Infer<Q>, Infer<B>, ActorOf<G>>) => Promise<Response | unknown>,
) {
  return async (request: Request, context: { params: Promise<Record<string, string | string[] | undefined>> }): Promise<Response> => {
    try {
      // Writes from another site are refused before anything else (cross-site request forgery).
      assertSameOrigin(request);
      const actor: Actor | null = options.permission === "public" ? null : await requireActor(options.permission === "member" ? undefined : options.permission);

      let params: unknown = undefined;
      if (options.params) {
        const parsed = options.params.safeParse(await context.params);
        // A malformed id names nothing this firm has: answer as not found.
        if (!parsed.success) throw new AppError("not_found:route");
        params = parsed.data;
      }

      let query: unknown = undefined;
      if (options.query) {
        const url = new URL(request.url);
        const parsed = options.query.safeParse(Object.fromEntries(url.searchParams));
        if (!parsed.success) {
          const fields = fieldErrors(parsed.error);
          throw new AppError("bad_request:query", `Query not valid: ${describe(fields)}`, fields);
        }
        query = parsed.data;
      }

      let body: unknown = undefined;
      if (options.body) {
        const raw = await readJsonBody(request);
        const parsed = options.body.safeParse(raw);
        if (!parsed.success) {
          const fields = fieldErrors(parsed.error);
          throw new AppError("unprocessable:body", `Some values are not valid: ${describe(fields)}`, fields);
        }
        body = parsed.data;
      }

      // params, query and body were parsed by the schemas above; the actor is null exactly on a public route
      const result = await handler({ actor, params, query, body, request } as RouteContext<Infer<P>, Infer<Q>, Infer<B>, ActorOf<G>>);
      if (result instanceof Response) return withCacheControl(result);
      return jsonAnswer(request, result ?? { ok: true });
    } catch (error) {
      return withCacheControl(toAppError(error).toResponse());
    }
  };
}

/** What a JSON answer from route() says about caching when its handler said nothing. */
export const JSON_CACHE_CONTROL = "private, no-store";

/** A JSON Response without its own Cache-Control gets JSON_CACHE_CONTROL; other responses pass unchanged. */
function withCacheControl(response: Response): Response {
  const type = response.headers.get("content-type") ?? "";
  if (!type.includes("json") || response.headers.has("cache-control")) return response;
  try {
    response.headers.set("cache-control", JSON_CACHE_CONTROL);
    return response;
  } catch {
    // Immutable headers (a Response made by Response.redirect or fetch): copy it.
    const headers = new Headers(response.headers);
    headers.set("cache-control", JSON_CACHE_CONTROL);
    return new Response(response.body, { status: response.status, statusText: response.statusText, headers });
  }
}

/** The strong ETag of a JSON body: its SHA-256, shortened. */
export function etagOf(json: string): string {
  return `"${createHash("sha256").update(json).digest("base64url").slice(0, 27)}"`;
}

/** Whether an If-None-Match header names this ETag (a list, weak forms and * included). */
export function matchesEtag(ifNoneMatch: string | null, etag: string): boolean {
  if (!ifNoneMatch) return false;
  return ifNoneMatch.split(",").some((tag) => {
    const t = tag.trim();
    return t === "*" || t === etag || t === `W/${etag}`;
  });
}

function jsonAnswer(request: Request, value: unknown): Response {
  const json = JSON.stringify(value);
  const headers: Record<string, string> = { "content-type": "application/json", "cache-control": JSON_CACHE_CONTROL };
  if (request.method !== "GET") return new Response(json, { headers });
  const etag = etagOf(json);
  headers.etag = etag;
  if (matchesEtag(request.headers.get("if-none-match"), etag)) {
    delete headers["content-type"];
    return new Response(null, { status: 304, headers });
  }
  return new Response(json, { headers });
}
