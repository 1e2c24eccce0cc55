"use client";

import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/app/_components/api";
import type { RunRecord } from "@/lib/runs/types";
import type { RunFreshness } from "@/lib/runs/freshness";

export interface RunResponse {
  run: RunRecord;
  reportingCurrency: string;
  /** whether the run's inputs are still the period's current ones */
  freshness?: RunFreshness;
}

export const isActive = (status: string | undefined) => status === "queued" || status === "running";

/**
 * One run, polled every second while it is queued or running: its figures, and with `detail` each position's
 * contributions too (stored apart, large on a big book: only the page that shows them asks).
 */
export function useRun(runId: string, detail?: "contributions") {
  return useQuery({
    queryKey: detail ? ["run", runId, detail] : ["run", runId],
    queryFn: () => apiFetch<RunResponse>(detail ? `/api/runs/${runId}?detail=${detail}` : `/api/runs/${runId}`),
    refetchInterval: (q) => (isActive(q.state.data?.run.status) ? 1000 : false),
  });
}
