"use client";

import { LoadError } from "@/app/_components/load-error";
import { StatusBadge } from "@/app/_components/status-badge";
import type { RunRecord, RunResults } from "@/lib/runs/types";
import { RunProgress } from "./run-progress";
import { useRun } from "./use-run";

export function RunStatusBadge({ status }: { status: string }) {
  if (status === "completed") return <StatusBadge tone="ok">Completed</StatusBadge>;
  if (status === "failed") return <StatusBadge tone="alert">Failed</StatusBadge>;
  if (status === "running") return <StatusBadge tone="caution">Running</StatusBadge>;
  return <StatusBadge tone="neutral">Waiting</StatusBadge>;
}

/** A backtest's traffic-light zone, in words with its tone. */
export function ZoneBadge({ zone }: { zone: string }) {
  if (zone === "green") return <StatusBadge tone="ok">Green zone</StatusBadge>;
  if (zone === "yellow") return <StatusBadge tone="caution">Yellow zone</StatusBadge>;
  return <StatusBadge tone="alert">Red zone</StatusBadge>;
}

/**
 * Loads a run and shows its loading, error, in-progress and failed states; renders `children` once the run has
 * completed, with its results (with `detail`, each position's contributions too).
 */
export function CompletedRun({ runId, detail, children }: { runId: string; detail?: "contributions"; children: (data: { run: RunRecord; results: RunResults; reportingCurrency: string }) => React.ReactNode }) {
  const { data, error, isPending } = useRun(runId, detail);
  if (isPending) return <p className="text-sm text-ink-muted" role="status">Loading the run…</p>;
  if (error || !data) return <LoadError error={error} fallback="Could not load the run." />;
  const { run } = data;
  if (run.status === "failed") {
    return (
      <div role="alert" className="rounded-md border border-alert/30 bg-alert-bg p-4 text-sm text-alert" data-testid="run-failed">
        <p className="font-semibold">This run failed; it has no figures.</p>
        <p className="mt-1">{run.error}</p>
        <p className="mt-1 text-ink-soft">Earlier runs are unchanged. Start a new run from the runs list.</p>
      </div>
    );
  }
  if (!run.results) {
    return (
      <div className="max-w-xl rounded-lg border border-ink-line bg-paper-raised p-4">
        <p className="mb-3 text-sm text-ink-soft">The run is computing on the server; this page follows it and shows the figures when it completes. You can leave and come back.</p>
        <RunProgress stage={run.stage} progress={run.progress} />
      </div>
    );
  }
  return <>{children({ run, results: run.results, reportingCurrency: data.reportingCurrency })}</>;
}
