import { describe, expect, it } from "vitest";
import { safeNextPath } from "@/lib/auth/safe-redirect";

/** Hostile `next` values, as the page receives them (already percent-decoded once by the query parser). */
const HOSTILE = [
  "//evil.example",
  "//evil.example/phish",
  "/\\evil.example/phish", // from ?next=/%5Cevil.example/phish
  "\\\\evil.example",
  "/\t/evil.example", // from ?next=/%09/evil.example
  "/\n/evil.example",
  "/\r\n/evil.example",
  "/\u0000/evil.example",
  "https://evil.example",
  "http:/evil.example",
  "javascript:alert(1)",
  "evil.example",
  " /home",
  "/\\/evil.example",
  "///evil.example",
  "",
  "/sign-in?next=//evil.example",
  "/api/auth/signout",
  "/".padEnd(3000, "a"),
];

describe("the safe-redirect helper", () => {
  it.each(HOSTILE)("sends %j to /home", (value) => {
    expect(safeNextPath(value)).toBe("/home");
  });

  it("keeps a same-site path with its query and fragment", () => {
    expect(safeNextPath("/periods")).toBe("/periods");
    expect(safeNextPath("/periods/abc/runs?tab=summary#top")).toBe("/periods/abc/runs?tab=summary#top");
    // A percent-encoded slash stays encoded: the browser reads it as a path segment, not as "//".
    expect(safeNextPath("/%2F%2Fevil.example")).toBe("/%2F%2Fevil.example");
    expect(safeNextPath("/a/../home")).toBe("/home");
  });

  it("takes the first of repeated values, and a fallback of the caller's choosing", () => {
    expect(safeNextPath(["/data", "//evil.example"])).toBe("/data");
    expect(safeNextPath(undefined, "/periods")).toBe("/periods");
    expect(safeNextPath(null)).toBe("/home");
  });
});
