import { beforeAll, describe, expect, it } from "vitest";
import { freshDatabase } from "../helpers/db";
import {
  backoffSeconds,
  clientAddress,
  isSignInBlocked,
  recordSignInAttempt,
  signInVerdict,
  BACKOFF_BASE_SECONDS,
  MAX_FAILURES_PER_ACCOUNT,
  MAX_FAILURES_PER_ACCOUNT_ALL_ADDRESSES,
  MAX_FAILURES_PER_ADDRESS,
  UNKNOWN_ADDRESS,
} from "@/lib/auth/rate-limit";
import type { Database } from "@/db/client";

let db: Database;
const at = new Date("2026-12-01T10:00:00Z");
const plus = (seconds: number) => new Date(at.getTime() + seconds * 1000);

beforeAll(async () => {
  db = await freshDatabase();
});

describe("the client address comes only from the trusted proxy hop", () => {
  const headers = (xff: string) => new Headers({ "x-forwarded-for": xff });
  it("ignores X-Forwarded-For when no proxy is configured", () => {
    expect(clientAddress(headers("203.0.113.9"), {})).toBe(UNKNOWN_ADDRESS);
    expect(clientAddress(headers("203.0.113.9"), { BALLAST_TRUSTED_PROXY_HOPS: "0" })).toBe(UNKNOWN_ADDRESS);
  });
  it("takes the entry the trusted proxy appended, not what the client wrote before it", () => {
    // The client sent "1.2.3.4" itself; the one proxy appended the address it saw.
    expect(clientAddress(headers("1.2.3.4, 198.51.100.20"), { BALLAST_TRUSTED_PROXY_HOPS: "1" })).toBe("198.51.100.20");
    expect(clientAddress(headers("1.2.3.4, 198.51.100.20, 10.0.0.2"), { BALLAST_TRUSTED_PROXY_HOPS: "2" })).toBe("198.51.100.20");
    expect(clientAddress(headers("2001:db8::1"), { BALLAST_TRUSTED_PROXY_HOPS: "1" })).toBe("2001:db8::1");
  });
  it("answers unknown for a short chain or a value that is not an address", () => {
    expect(clientAddress(headers("198.51.100.20"), { BALLAST_TRUSTED_PROXY_HOPS: "2" })).toBe(UNKNOWN_ADDRESS);
    expect(clientAddress(headers("<script>"), { BALLAST_TRUSTED_PROXY_HOPS: "1" })).toBe(UNKNOWN_ADDRESS);
    expect(clientAddress(undefined, { BALLAST_TRUSTED_PROXY_HOPS: "1" })).toBe(UNKNOWN_ADDRESS);
  });
});

describe("sign-in limits per account and address pair, with backoff", () => {
  it("doubles the wait after the limit, up to the window (common practice, no source)", () => {
    expect(backoffSeconds(MAX_FAILURES_PER_ACCOUNT - 1)).toBe(0);
    expect(backoffSeconds(MAX_FAILURES_PER_ACCOUNT)).toBe(BACKOFF_BASE_SECONDS);
    expect(backoffSeconds(MAX_FAILURES_PER_ACCOUNT + 1)).toBe(2 * BACKOFF_BASE_SECONDS);
    expect(backoffSeconds(100)).toBe(15 * 60);
  });

  it("slows the attacking pair only: the owner from another address signs in at once", async () => {
    for (let i = 0; i < MAX_FAILURES_PER_ACCOUNT; i++) await recordSignInAttempt("helen.marsh@northmoor.example", "203.0.113.66", false, at);
    expect(await signInVerdict("helen.marsh@northmoor.example", "203.0.113.66", plus(1))).toMatchObject({ blocked: true, reason: "pair", waitSeconds: BACKOFF_BASE_SECONDS - 1 });
    expect(await isSignInBlocked("helen.marsh@northmoor.example", "198.51.100.7", plus(1))).toBe(false);
    // After the wait the pair may try once more; a further failure doubles the wait.
    expect(await isSignInBlocked("helen.marsh@northmoor.example", "203.0.113.66", plus(BACKOFF_BASE_SECONDS))).toBe(false);
    await recordSignInAttempt("helen.marsh@northmoor.example", "203.0.113.66", false, plus(BACKOFF_BASE_SECONDS));
    expect(await signInVerdict("helen.marsh@northmoor.example", "203.0.113.66", plus(BACKOFF_BASE_SECONDS + 1))).toMatchObject({ waitSeconds: 2 * BACKOFF_BASE_SECONDS - 1 });
  });

  it("writes the slowdown to the account's firm audit trail once", async () => {
    const rows = await db.$client.execute("SELECT action, summary FROM audit_events WHERE action = 'auth.sign_in_slowed'");
    expect(rows.rows).toHaveLength(1);
    expect(String(rows.rows[0].summary)).toContain("203.0.113.66");
  });

  it("one address failing against many accounts is blocked (spraying), but never the shared unknown address", async () => {
    for (let i = 0; i < MAX_FAILURES_PER_ADDRESS; i++) await recordSignInAttempt(`user${i}@y.example`, "192.0.2.7", false, at);
    expect(await signInVerdict("fresh@y.example", "192.0.2.7", plus(1))).toMatchObject({ blocked: true, reason: "address" });
    for (let i = 0; i < MAX_FAILURES_PER_ADDRESS; i++) await recordSignInAttempt(`other${i}@y.example`, UNKNOWN_ADDRESS, false, at);
    expect(await isSignInBlocked("fresh@y.example", UNKNOWN_ADDRESS, plus(1))).toBe(false);
  });

  it("many addresses against one account block new addresses, not one it signed in from before", async () => {
    await recordSignInAttempt("ada.quayle@northmoor.example", "198.51.100.1", true, plus(-24 * 3600));
    for (let i = 0; i < MAX_FAILURES_PER_ACCOUNT_ALL_ADDRESSES; i++) await recordSignInAttempt("ada.quayle@northmoor.example", `10.1.${Math.floor(i / 250)}.${i % 250}`, false, at);
    expect(await signInVerdict("ada.quayle@northmoor.example", "10.9.9.9", plus(1))).toMatchObject({ blocked: true, reason: "account" });
    expect(await isSignInBlocked("ada.quayle@northmoor.example", "198.51.100.1", plus(1))).toBe(false);
  });

  it("forgets failures after the window", async () => {
    expect(await isSignInBlocked("helen.marsh@northmoor.example", "203.0.113.66", plus(16 * 60 + BACKOFF_BASE_SECONDS))).toBe(false);
    expect(await isSignInBlocked("fresh@y.example", "192.0.2.7", plus(16 * 60))).toBe(false);
  });
});
