/**
 * Sends signed-out visitors of signed-in pages to sign-in. It only redirects: authorization lives in the gate
 * (lib/auth/actor.ts), which every page, route handler and server action goes through.
 */
import { NextResponse } from "next/server";
import { auth } from "@/lib/auth";

export const proxy = auth((request) => {
  if (!request.auth) {
    const url = new URL("/sign-in", request.nextUrl.origin);
    url.searchParams.set("next", request.nextUrl.pathname + request.nextUrl.search);
    return NextResponse.redirect(url);
  }
  return NextResponse.next();
});

export const config = {
  matcher: ["/home/:path*", "/data/:path*", "/periods/:path*", "/settings/:path*", "/audit/:path*", "/method/:path*", "/runs/:path*", "/calendar/:path*"],
};
