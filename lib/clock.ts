/**
 * The app's clock. BALLAST_CLOCK (yyyy-mm-dd or a full ISO time) pins "today" for demos and tests; it is
 * refused in production unless BALLAST_ALLOW_CLOCK=1.
 */
import { format } from "date-fns";

/** The current time, or the pinned time. */
export function now(): Date {
  const pinned = process.env.BALLAST_CLOCK;
  if (pinned && (process.env.NODE_ENV !== "production" || process.env.BALLAST_ALLOW_CLOCK === "1")) {
    const date = new Date(pinned.length === 10 ? `${pinned}T09:00:00Z` : pinned);
    if (!Number.isNaN(date.getTime())) return date;
  }
  return new Date();
}

/** Today as yyyy-mm-dd (UTC). */
export function today(): string {
  return format(now(), "yyyy-MM-dd");
}
