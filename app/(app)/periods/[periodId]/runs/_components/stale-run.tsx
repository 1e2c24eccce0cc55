import { StatusBadge } from "@/app/_components/status-badge";
import type { RunFreshness } from "@/lib/runs/freshness";
import { Bullets } from "./bullets";

/** "Stale" with what changed as its title, for a run whose inputs are no longer the period's current ones. */
export function StaleRunBadge({ freshness }: { freshness: RunFreshness | null | undefined }) {
  if (!freshness?.stale) return null;
  return (
    <span title={freshness.changes.map((c) => c.message).join(" ")} data-testid="stale-run-badge">
      <StatusBadge tone="caution">Stale: inputs changed</StatusBadge>
    </span>
  );
}

/** A notice listing what changed since a stale run, and what to do. */
export function StaleRunNotice({
  freshness,
  what = "This run",
  advice = "Its figures stay as computed, but a stale run cannot be chosen for the filing. Start a new run on the current inputs.",
}: {
  freshness: RunFreshness | null | undefined;
  what?: string;
  advice?: string;
}) {
  if (!freshness?.stale) return null;
  return (
    <div role="status" className="mb-4 rounded-md border border-caution/30 bg-caution-bg p-3 text-sm text-ink" data-testid="stale-run-notice">
      <p className="font-semibold">{what} is stale: its inputs are no longer the period&apos;s current ones.</p>
      <Bullets items={freshness.changes.map((c) => c.message)} className="mt-1 list-disc pl-5" />
      <p className="mt-1 text-ink-soft">{advice}</p>
    </div>
  );
}
