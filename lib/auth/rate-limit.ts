/**
 * Sign-in rate limiting, kept in the database (not in memory) so that it holds across restarts and instances.
 *
 * The caller's address comes only from a trusted proxy hop: with BALLAST_TRUSTED_PROXY_HOPS=N (N proxies in front
 * of Ballast, each appending to X-Forwarded-For) it is the N-th entry from the right; without it the header is
 * ignored (anyone can write it) and every caller counts as one "unknown" address.
 *
 * Limits slow an attacker without locking the owner out:
 * - per account and address pair: after 5 failures in 15 minutes each further try waits 30 s, 1, 2, 4, 8 minutes…
 *   (at most the window) after the last failure; nobody else's tries count against the pair;
 * - per address across accounts (password spraying): 20 failures in 15 minutes block that address (not "unknown");
 * - per account across addresses (many addresses guessing one password): 50 failures in 15 minutes block the
 *   account for addresses that have never signed in to it; an address it signed in from before keeps its own pair.
 * Crossing a limit is written to the audit trail of every firm the account belongs to.
 */
import { and, eq, gte, count, max } from "drizzle-orm";
import { getDb } from "@/db/client";
import { memberships, signInAttempts, users, auditEvents } from "@/db/schema";

export const RATE_WINDOW_MINUTES = 15;
/** Failures of one account from one address before the backoff starts (also the signing dialog's limit). */
export const MAX_FAILURES_PER_ACCOUNT = 5;
export const MAX_FAILURES_PER_ADDRESS = 20;
export const MAX_FAILURES_PER_ACCOUNT_ALL_ADDRESSES = 50;
/** The first wait once the pair limit is reached; it doubles with each further failure. */
export const BACKOFF_BASE_SECONDS = 30;
/** How long an address that signed in to an account stays "known" for it. */
export const KNOWN_ADDRESS_DAYS = 30;
export const UNKNOWN_ADDRESS = "unknown";

/** The client's address from the configured trusted proxy hop (see above), or "unknown". */
export function clientAddress(headers: Headers | undefined, env: Record<string, string | undefined> = process.env): string {
  const hops = Number.parseInt(env.BALLAST_TRUSTED_PROXY_HOPS ?? "0", 10);
  if (!headers || !Number.isFinite(hops) || hops < 1) return UNKNOWN_ADDRESS;
  const chain = (headers.get("x-forwarded-for") ?? "")
    .split(",")
    .map((part) => part.trim())
    .filter(Boolean);
  const address = chain[chain.length - hops];
  // Only something shaped like an IPv4 or IPv6 address is kept; anything else is the proxy's mistake.
  return address && /^[0-9a-fA-F:.]{2,45}$/.test(address) ? address : UNKNOWN_ADDRESS;
}

/** What the limits say about a sign-in try now: allowed, or the seconds to wait and why. */
export interface SignInVerdict {
  blocked: boolean;
  waitSeconds: number;
  reason: "pair" | "address" | "account" | null;
}

const since = (now: Date, minutes: number) => new Date(now.getTime() - minutes * 60_000).toISOString();

async function failures(where: ReturnType<typeof and>): Promise<{ n: number; last: string | null }> {
  const [row] = await getDb().select({ n: count(), last: max(signInAttempts.at) }).from(signInAttempts).where(where);
  return { n: row?.n ?? 0, last: row?.last ?? null };
}

/** The backoff after `n` failures of a pair (0 before the limit). */
export function backoffSeconds(n: number): number {
  if (n < MAX_FAILURES_PER_ACCOUNT) return 0;
  return Math.min(RATE_WINDOW_MINUTES * 60, BACKOFF_BASE_SECONDS * 2 ** (n - MAX_FAILURES_PER_ACCOUNT));
}

/** Whether a sign-in try for this e-mail from this address must wait, and how long. */
export async function signInVerdict(email: string, address: string, now = new Date()): Promise<SignInVerdict> {
  const windowStart = since(now, RATE_WINDOW_MINUTES);
  const failed = and(eq(signInAttempts.succeeded, false), gte(signInAttempts.at, windowStart));
  const pair = await failures(and(failed, eq(signInAttempts.email, email), eq(signInAttempts.address, address)));
  const wait = backoffSeconds(pair.n);
  if (wait > 0 && pair.last) {
    const until = new Date(pair.last).getTime() + wait * 1000;
    if (until > now.getTime()) return { blocked: true, waitSeconds: Math.ceil((until - now.getTime()) / 1000), reason: "pair" };
  }
  if (address !== UNKNOWN_ADDRESS) {
    const byAddress = await failures(and(failed, eq(signInAttempts.address, address)));
    if (byAddress.n >= MAX_FAILURES_PER_ADDRESS) return { blocked: true, waitSeconds: secondsLeft(byAddress.last, now), reason: "address" };
  }
  const byAccount = await failures(and(failed, eq(signInAttempts.email, email)));
  if (byAccount.n >= MAX_FAILURES_PER_ACCOUNT_ALL_ADDRESSES && !(await isKnownAddress(email, address, now))) {
    return { blocked: true, waitSeconds: secondsLeft(byAccount.last, now), reason: "account" };
  }
  return { blocked: false, waitSeconds: 0, reason: null };
}

function secondsLeft(last: string | null, now: Date): number {
  if (!last) return 0;
  return Math.max(1, Math.ceil((new Date(last).getTime() + RATE_WINDOW_MINUTES * 60_000 - now.getTime()) / 1000));
}

async function isKnownAddress(email: string, address: string, now: Date): Promise<boolean> {
  if (address === UNKNOWN_ADDRESS) return false;
  const [row] = await getDb()
    .select({ n: count() })
    .from(signInAttempts)
    .where(and(eq(signInAttempts.email, email), eq(signInAttempts.address, address), eq(signInAttempts.succeeded, true), gte(signInAttempts.at, since(now, KNOWN_ADDRESS_DAYS * 24 * 60))));
  return (row?.n ?? 0) > 0;
}

/** Whether sign-in is currently refused for this e-mail from this address. */
export async function isSignInBlocked(email: string, address: string, now = new Date()): Promise<boolean> {
  return (await signInVerdict(email, address, now)).blocked;
}

/** Record one sign-in attempt; a failure that reaches a limit is written to the account's firms' audit trails. */
export async function recordSignInAttempt(email: string, address: string, succeeded: boolean, now = new Date()): Promise<void> {
  const db = getDb();
  await db.insert(signInAttempts).values({ email, address, succeeded, at: now.toISOString() });
  if (succeeded) return;
  const windowStart = since(now, RATE_WINDOW_MINUTES);
  const failed = and(eq(signInAttempts.succeeded, false), gte(signInAttempts.at, windowStart));
  const pair = await failures(and(failed, eq(signInAttempts.email, email), eq(signInAttempts.address, address)));
  const byAccount = await failures(and(failed, eq(signInAttempts.email, email)));
  const crossed =
    pair.n === MAX_FAILURES_PER_ACCOUNT
      ? `from address ${address} after ${pair.n} failed tries in ${RATE_WINDOW_MINUTES} minutes: further tries from there wait ${BACKOFF_BASE_SECONDS} s, doubling`
      : byAccount.n === MAX_FAILURES_PER_ACCOUNT_ALL_ADDRESSES
        ? `after ${byAccount.n} failed tries from several addresses in ${RATE_WINDOW_MINUTES} minutes: addresses it never signed in from wait until the window passes`
        : null;
  if (!crossed) return;
  const [user] = await db.select({ id: users.id, name: users.name }).from(users).where(eq(users.email, email));
  if (!user) return;
  const firms = await db.select({ firmId: memberships.firmId }).from(memberships).where(eq(memberships.userId, user.id));
  for (const { firmId } of firms) {
    await db.insert(auditEvents).values({
      firmId,
      actorId: user.id,
      actorName: user.name,
      at: now.toISOString(),
      action: "auth.sign_in_slowed",
      entityType: "user",
      entityId: user.id,
      summary: `Sign-in for ${email} slowed ${crossed}`,
      detail: { email, address, pairFailures: pair.n, accountFailures: byAccount.n },
    });
  }
}
