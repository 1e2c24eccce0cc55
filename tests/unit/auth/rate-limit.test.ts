import { beforeAll, describe, expect, it } from "vitest";
import { freshDatabase } from "../helpers/db";
import { isSignInBlocked, recordSignInAttempt, MAX_FAILURES_PER_ACCOUNT, MAX_FAILURES_PER_ADDRESS } from "@/lib/auth/rate-limit";

describe("sign-in rate limit", () => {
  beforeAll(async () => {
    await freshDatabase();
  });
  const at = new Date("2026-12-01T10:00:00Z");

  it("blocks an account after repeated failures, from any address", async () => {
    for (let i = 0; i < MAX_FAILURES_PER_ACCOUNT; i++) await recordSignInAttempt("a@x.example", `10.0.0.${i}`, false, at);
    expect(await isSignInBlocked("a@x.example", "10.9.9.9", at)).toBe(true);
    expect(await isSignInBlocked("b@x.example", "10.9.9.9", at)).toBe(false);
  });

  it("blocks an address after failures across many accounts", async () => {
    for (let i = 0; i < MAX_FAILURES_PER_ADDRESS; i++) await recordSignInAttempt(`user${i}@y.example`, "192.0.2.7", false, at);
    expect(await isSignInBlocked("fresh@y.example", "192.0.2.7", at)).toBe(true);
  });

  it("forgets failures after the window", async () => {
    const later = new Date(at.getTime() + 16 * 60_000);
    expect(await isSignInBlocked("a@x.example", "10.9.9.9", later)).toBe(false);
  });
});
