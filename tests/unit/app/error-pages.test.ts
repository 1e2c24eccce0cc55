/**
 * The error pages' markup (app/(app)/error.tsx, app/global-error.tsx), rendered by React's own server renderer: they
 * say what happened, offer a retry and a way on, show a server error's reference and never its message.
 */
import { describe, expect, it, vi } from "vitest";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";

// next/font is compiled away by Next's build; outside it the loader gives nothing, so stand in its result.
vi.mock("next/font/local", () => ({ default: () => ({ variable: "font-ballast-test", className: "font-ballast-test" }) }));

const serverError = Object.assign(new Error("SQLITE_BUSY: secret table name"), { digest: "1234567890" });

describe("error pages", () => {
  it("a signed-in page's error: title, retry, a way on, the reference, not the message", async () => {
    const { default: AppError } = await import("@/app/(app)/error");
    const html = renderToStaticMarkup(createElement(AppError, { error: serverError, retry: () => undefined }));
    expect(html).toContain("This page could not be shown");
    expect(html).toMatch(/<button type="button"[^>]*>Try again<\/button>/);
    expect(html).toContain('href="/home"');
    expect(html).toContain(">1234567890</code>");
    expect(html).not.toContain("SQLITE_BUSY");
    expect(html).toContain('role="alert"');
  });

  it("a thrown value that is not an Error gets no reference line", async () => {
    const { default: AppError } = await import("@/app/(app)/error");
    const html = renderToStaticMarkup(createElement(AppError, { error: "plain string", retry: () => undefined }));
    expect(html).not.toContain("Reference for support");
  });

  it("the global error page is a whole document with the app's font and a title", async () => {
    const { default: GlobalError } = await import("@/app/global-error");
    const html = renderToStaticMarkup(createElement(GlobalError, { error: serverError, retry: () => undefined }));
    expect(html).toMatch(/^<html lang="en" class="font-ballast-test">/);
    expect(html).toContain("<body");
    expect(html).toContain("<title>Ballast could not start this page</title>");
    expect(html).toContain("Ballast could not show this page");
    expect(html).toContain(">1234567890</code>");
    expect(html).not.toContain("SQLITE_BUSY");
  });
});
