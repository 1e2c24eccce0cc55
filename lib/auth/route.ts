/**
 * The route-handler wrapper every route.ts under app/api uses: resolves the actor through the gate (or allows
 * public access explicitly), refuses writes from another origin (403), bodies that are not JSON (415) or too large
 * (413), validates params, query and JSON body with zod, and turns errors into the shared JSON shape with honest
 * status codes.
 */
import "server-only";
import type { z } from "zod";
import { AppError, toAppError, type FieldErrors } from "@/lib/errors";
import { requireActor, type Actor } from "./actor";
import { assertSameOrigin, readJsonBody } from "./request-guard";
import type { Permission } from "./permissions";

type Schema = z.ZodType;

interface RouteOptions<P extends Schema | undefined, Q extends Schema | undefined, B extends Schema | undefined> {
  /** the permission required; "member" = any signed-in member of the firm; "public" = no sign-in */
  permission: Permission | "member" | "public";
  params?: P;
  query?: Q;
  body?: B;
}

type Infer<S> = S extends Schema ? z.infer<S> : undefined;

export interface RouteContext<P, Q, B> {
  actor: Actor;
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
export function route<P extends Schema | undefined = undefined, Q extends Schema | undefined = undefined, B extends Schema | undefined = undefined>(
  options: RouteOptions<P, Q, B>,
  handler: (ctx: RouteContext<Infer<P>, Infer<Q>, Infer<B>>) => Promise<Response | unknown>,
) {
  return async (request: Request, context: { params: Promise<Record<string, string | string[] | undefined>> }): Promise<Response> => {
    try {
      // Writes from another site are refused before anything else (cross-site request forgery).
      assertSameOrigin(request);
      const actor =
        options.permission === "public"
          ? (null as unknown as Actor)
          : await requireActor(options.permission === "member" ? undefined : options.permission);

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

      const result = await handler({ actor, params, query, body, request } as RouteContext<Infer<P>, Infer<Q>, Infer<B>>);
      if (result instanceof Response) return result;
      return Response.json(result ?? { ok: true });
    } catch (error) {
      return toAppError(error).toResponse();
    }
  };
}
