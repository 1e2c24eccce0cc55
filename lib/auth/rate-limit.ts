/**
 * Sign-in rate limiting, kept in the database (not in memory) so that it holds across restarts and instances.
 * A window of 15 minutes; at most 5 failures per account and 20 per address.
 */
import { and, eq, gte, count } from "drizzle-orm";
import { getDb } from "@/db/client";
import { signInAttempts } from "@/db/schema";

export const RATE_WINDOW_MINUTES = 15;
export const MAX_FAILURES_PER_ACCOUNT = 5;
export const MAX_FAILURES_PER_ADDRESS = 20;

/** Whether sign-in is currently blocked for this e-mail or address. */
export async function isSignInBlocked(email: string, address: string, now = new Date()): Promise<boolean> {
  const db = getDb();
  const since = new Date(now.getTime() - RATE_WINDOW_MINUTES * 60_000).toISOString();
  const [byAccount] = await db
    .select({ n: count() })
    .from(signInAttempts)
    .where(and(eq(signInAttempts.email, email), eq(signInAttempts.succeeded, false), gte(signInAttempts.at, since)));
  if (byAccount.n >= MAX_FAILURES_PER_ACCOUNT) return true;
  const [byAddress] = await db
    .select({ n: count() })
    .from(signInAttempts)
    .where(and(eq(signInAttempts.address, address), eq(signInAttempts.succeeded, false), gte(signInAttempts.at, since)));
  return byAddress.n >= MAX_FAILURES_PER_ADDRESS;
}

/** Record one sign-in attempt. */
export async function recordSignInAttempt(email: string, address: string, succeeded: boolean, now = new Date()): Promise<void> {
  await getDb().insert(signInAttempts).values({ email, address, succeeded, at: now.toISOString() });
}
