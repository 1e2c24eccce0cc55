/**
 * The app's two clocks, kept apart on purpose:
 *  - business "today" (`today()`, `businessNow()`): which reporting period is open, what is due, which dates are
 *    in the future. BALLAST_CLOCK (yyyy-mm-dd or a full ISO time) pins it for demos and tests; it is refused in
 *    production unless BALLAST_ALLOW_CLOCK=1.
 *  - the time of an act (`now()`): when something was signed, approved, submitted, computed, confirmed. It is
 *    always the real time. Only a script that writes a history on purpose (the demo seed) may set it, through
 *    `setStampClock`, never through the environment, so a running server always stamps the real time.
 */
import { format } from "date-fns";

const globalForClock: typeof globalThis & { ballastStampClock?: Date | null } = globalThis;

/** The real time of an act, for every stored timestamp (or the time a history-writing script set). */
export function now(): Date {
  const set = globalForClock.ballastStampClock;
  return set ? new Date(set.getTime()) : new Date();
}

/**
 * For scripts that write a past history (the demo seed, tests of it): stamp every act from now on at `at`
 * (an ISO time), or at the real time again with null. Never called while serving requests.
 */
export function setStampClock(at: string | Date | null): void {
  if (at === null) {
    globalForClock.ballastStampClock = null;
    return;
  }
  const date = typeof at === "string" ? new Date(at) : at;
  if (Number.isNaN(date.getTime())) throw new Error(`setStampClock: not a time: ${String(at)}`);
  globalForClock.ballastStampClock = date;
}

/** The business "now": the pinned time (BALLAST_CLOCK) or the real time. For deciding what is due, never for stamps. */
export function businessNow(): Date {
  const pinned = process.env.BALLAST_CLOCK;
  if (pinned && (process.env.NODE_ENV !== "production" || process.env.BALLAST_ALLOW_CLOCK === "1")) {
    const date = new Date(pinned.length === 10 ? `${pinned}T09:00:00Z` : pinned);
    if (!Number.isNaN(date.getTime())) return date;
  }
  return new Date();
}

/** Business today as yyyy-mm-dd (UTC). */
export function today(): string {
  return format(businessNow(), "yyyy-MM-dd");
}
