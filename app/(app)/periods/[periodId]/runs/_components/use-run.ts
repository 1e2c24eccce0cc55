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

/** One run, polled every second while it is queued or running. */
export function useRun(runId: string) {
  return useQuery({
    queryKey: ["run", runId],
    queryFn: () => apiFetch<RunResponse>(`/api/runs/${runId}`),
    refetchInterval: (q) => (isActive(q.state.data?.run.status) ? 1000 : false),
  });
}
