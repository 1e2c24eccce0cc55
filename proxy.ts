/**
 * Runs before every page: sends signed-out visitors of signed-in pages to sign-in, and sets the content security
 * policy with a fresh nonce for Next.js's own scripts. It only redirects: authorization lives in the gate
 * (lib/auth/actor.ts), which every page, route handler and server action goes through.
 */
import { NextResponse, type NextFetchEvent, type NextRequest } from "next/server";
import { auth } from "@/lib/auth";

/** Signed-in areas: a visitor without a session is sent to sign-in first. */
const SIGNED_IN_AREAS = ["/home", "/data", "/periods", "/method", "/runs", "/calendar", "/settings", "/audit"];

/** The policy: scripts only from this origin with the request's nonce; uploads may go to the upload service. */
export function contentSecurityPolicy(nonce: string, dev = process.env.NODE_ENV === "development"): string {
  const uploadOrigins = [process.env.UPLOADTHING_INGEST_URL, process.env.UPLOADTHING_API_URL]
    .filter((u): u is string => Boolean(u))
    .map((u) => new URL(u).origin);
  const connect = ["'self'", ...new Set(uploadOrigins), ...(uploadOrigins.length ? [] : ["https://*.uploadthing.com", "https://*.ufs.sh"])];
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    // React and the chart library set style attributes; inline styles carry no script.
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self'",
    `connect-src ${connect.join(" ")}`,
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

/** Whether a path's percent-encoding is broken (e.g. "/data/uploads/%%%"), which names no page. */
export function isMalformedPath(path: string): boolean {
  try {
    decodeURIComponent(path);
    return false;
  } catch {
    return true;
  }
}

const pages = auth((request) => {
  const path = request.nextUrl.pathname;
  if (!request.auth && SIGNED_IN_AREAS.some((area) => path === area || path.startsWith(`${area}/`))) {
    const url = new URL("/sign-in", request.nextUrl.origin);
    url.searchParams.set("next", path + request.nextUrl.search);
    return NextResponse.redirect(url);
  }
  const nonce = Buffer.from(crypto.randomUUID()).toString("base64");
  const policy = contentSecurityPolicy(nonce);
  const headers = new Headers(request.headers);
  headers.set("x-nonce", nonce);
  headers.set("Content-Security-Policy", policy);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set("Content-Security-Policy", policy);
  return response;
});

/**
 * Every request: an address whose percent-encoding is broken answers 404 here (Next.js would fail decoding it with a
 * server error); API routes then go straight on (they answer JSON, set no scripts and run the gate themselves); pages
 * get the sign-in redirect and the content security policy.
 */
export function proxy(request: NextRequest, event: NextFetchEvent) {
  const path = request.nextUrl.pathname;
  if (isMalformedPath(path)) {
    return path.startsWith("/api/")
      ? Response.json({ error: { code: "not_found:route", message: "Not found: the address is not valid." } }, { status: 404 })
      : new NextResponse("Not found: the address is not valid.", { status: 404, headers: { "content-type": "text/plain; charset=utf-8" } });
  }
  if (path.startsWith("/api/")) return NextResponse.next();
  return pages(request as Parameters<typeof pages>[0], event as never);
}

export const config = {
  // Static files need no policy of their own; API routes pass only the address check.
  matcher: ["/((?!_next/static|_next/image|favicon.ico).*)"],
};
