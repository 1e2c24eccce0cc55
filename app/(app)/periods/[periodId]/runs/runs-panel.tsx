"use client";

import Link from "next/link";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { createColumnHelper, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import { apiFetch, ApiError } from "@/app/_components/api";
import { DataTable } from "@/app/_components/data-table";
import { DraftCaution } from "@/app/_components/draft-caution";
import { primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { formatTimestamp } from "@/app/_components/format";
import { LoadError } from "@/app/_components/load-error";
import { StatusBadge } from "@/app/_components/status-badge";
import type { RunListItem } from "@/lib/runs/types";
import { confidence, money } from "./_components/run-format";
import { RunProgress } from "./_components/run-progress";
import { RunStatusBadge, ZoneBadge } from "./_components/run-state";
import { StaleRunBadge } from "./_components/stale-run";
import { isActive } from "./_components/use-run";
import { Panel } from "@/app/_components/panel";

const column = createColumnHelper<RunListItem>();

export function RunsPanel({ periodId, currency, canStart, locked }: { periodId: string; currency: string; canStart: boolean; locked: boolean }) {
  const queryClient = useQueryClient();
  const router = useRouter();
  const key = ["runs", periodId];
  const { data, error, isPending } = useQuery({
    queryKey: key,
    queryFn: () => apiFetch<{ runs: RunListItem[] }>(`/api/periods/${periodId}/runs`),
    refetchInterval: (q) => (q.state.data?.runs.some((r) => isActive(r.status)) ? 1000 : false),
  });
  const [refusal, setRefusal] = useState<ApiError | null>(null);
  const start = useMutation({
    mutationFn: (excludeShortHistory: boolean) => apiFetch<{ run: RunListItem }>(`/api/periods/${periodId}/runs`, { method: "POST", body: { excludeShortHistory } }),
    onMutate: () => setRefusal(null),
    // a started run opens at once: its page follows the progress and shows the figures when it completes
    onSuccess: ({ run }) => {
      void queryClient.invalidateQueries({ queryKey: key });
      router.push(`/periods/${periodId}/runs/${run.id}`);
    },
    onError: (e) => {
      setRefusal(e instanceof ApiError ? e : new ApiError(String(e), 500, "unknown"));
      void queryClient.invalidateQueries({ queryKey: key });
    },
  });

  const runs = data?.runs ?? [];
  const active = runs.find((r) => isActive(r.status));
  const columns = [
    column.accessor("startedAt", {
      header: "Started (UTC)",
      cell: (c) => (
        <Link href={`/periods/${periodId}/runs/${c.row.original.id}`} className="figure whitespace-nowrap font-medium underline">
          {formatTimestamp(c.getValue())}
        </Link>
      ),
    }),
    column.accessor("status", {
      header: "Status",
      cell: (c) => (
        <span className="flex flex-wrap items-center gap-1">
          <RunStatusBadge status={c.getValue()} />
          {c.row.original.isFilingRun ? <StatusBadge tone="ok">Used for the filing</StatusBadge> : null}
          {c.row.original.reproducesRunId ? <StatusBadge tone="neutral">Reproduction</StatusBadge> : null}
          <StaleRunBadge freshness={c.row.original.freshness} />
        </span>
      ),
    }),
    column.accessor("startedByName", { header: "By" }),
    column.display({ id: "method", header: "Method statement", cell: (c) => (c.row.original.methodVersion ? `Version ${c.row.original.methodVersion.version}` : "—") }),
    column.display({
      id: "var",
      header: () => <span className="block text-right">10-day VaR</span>,
      cell: (c) => {
        const h = c.row.original.headline;
        return <span className="figure block text-right">{h ? `${money(h.varHorizon, currency)} (${confidence(h.confidence)})` : "—"}</span>;
      },
    }),
    column.display({
      id: "capital",
      header: () => <span className="block text-right">Capital</span>,
      cell: (c) => <span className="figure block text-right">{money(c.row.original.headline?.capital, currency)}</span>,
    }),
    column.display({ id: "zone", header: "Backtest", cell: (c) => (c.row.original.headline ? <ZoneBadge zone={c.row.original.headline.zone} /> : c.row.original.status === "failed" ? <span className="text-xs text-alert">{c.row.original.error}</span> : "—") }),
  ];
  // TanStack Table returns fresh functions each render; this component does not memoise around them.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({ data: runs, columns, getCoreRowModel: getCoreRowModel() });
  const historyRefusal = refusal?.code === "unprocessable:history" && refusal.fields?.excludeShortHistory && !refusal.message.startsWith("A run cannot start");

  return (
    <div className="flex flex-col gap-6">
      <Panel id="start-run" title={<>{active ? "A run is in progress" : "Start a run"}</>} headingClassName="mb-2 font-semibold">
        {active ? (
          <div className="flex flex-col gap-2">
            <RunProgress stage={active.stage} progress={active.progress} />
            <p className="text-sm text-ink-soft">
              Started by {active.startedByName} at {formatTimestamp(active.startedAt)}. It runs on the server: you can leave this page and come back.{" "}
              <Link className="underline" href={`/periods/${periodId}/runs/${active.id}`}>
                Follow this run
              </Link>
            </p>
          </div>
        ) : canStart ? (
          <div className="flex flex-col gap-3">
            <p className="text-sm text-ink-soft">One run at a time per period. The figures appear on the run&apos;s pages when it completes.</p>
            <div>
              <button type="button" className={primaryButtonClass} disabled={start.isPending} onClick={() => start.mutate(false)}>
                {start.isPending ? "Starting…" : "Start run"}
              </button>
            </div>
          </div>
        ) : (
          <p className="text-sm text-ink-soft">
            {locked ? "This period is signed: its runs can be read but no new run can be started." : "Risk analysts start runs; you can read every run and its figures."}
          </p>
        )}
        {refusal ? (
          <div role="alert" className="mt-3 rounded-md border border-alert/30 bg-alert-bg p-3 text-sm text-alert" data-testid="run-refusal">
            <p>{refusal.message}</p>
            {historyRefusal ? (
              <div className="mt-2 flex flex-col gap-2 text-ink">
                <p>{refusal.fields!.excludeShortHistory}</p>
                <div>
                  <button type="button" className={secondaryButtonClass} disabled={start.isPending} onClick={() => start.mutate(true)}>
                    Start without these factors
                  </button>
                </div>
              </div>
            ) : null}
          </div>
        ) : null}
      </Panel>

      <section aria-labelledby="runs-list">
        <h2 id="runs-list" className="mb-2 text-lg font-semibold">
          Runs of this period
        </h2>
        <DraftCaution className="mb-3" />
        {error ? <LoadError error={error} fallback="Could not load the runs." /> : null}
        <DataTable table={table} caption="Runs of this period, newest first" loading={isPending} loadingText="Loading the runs…" emptyText="No run yet for this period." rowTestId="run-row" />
      </section>
    </div>
  );
}
