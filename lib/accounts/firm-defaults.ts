/** What a new firm starts with, shared by the demo seed, the first-run screen and `npm run firm:create`. Pure. */

/** Plus factors by exception count over 250 days (Basel Committee 1996 backtesting framework, Table 2). */
export const BASEL_PLUS_FACTORS: Record<string, number> = { "5": 0.4, "6": 0.5, "7": 0.65, "8": 0.75, "9": 0.85, "10": 1 };

/** A new firm's filing deadline: 15 business days after the period end (common practice, no source; the firm sets its own). */
export const DEFAULT_DEADLINE = { deadlineRule: "business-days-after", deadlineValue: 15 } as const;

/** A URL-safe slug from a firm's name ("Northmoor Brokerage Ltd" → "northmoor-brokerage-ltd"). */
export function slugOf(name: string): string {
  const slug = name
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 48);
  return slug || "firm";
}
