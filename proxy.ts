/**
 * Runs before every page: sends signed-out visitors of signed-in pages to sign-in, and sets the content security
 * policy with a fresh nonce for Next.js's own scripts. It only redirects: authorization lives in the gate
 * (lib/auth/actor.ts), which every page, route handler and server action goes through.
 */
import { NextResponse } from "next/server";
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

export const proxy = auth((request) => {
  const path = request.nextUrl.pathname;
  if (isMalformedPath(path)) return new NextResponse("Not found: the address is not valid.", { status: 404, headers: { "content-type": "text/plain; charset=utf-8" } });
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

export const config = {
  // Pages only: API routes answer JSON and set no scripts; static files need no policy of their own.
  matcher: ["/((?!api/|_next/static|_next/image|favicon.ico).*)"],
};
