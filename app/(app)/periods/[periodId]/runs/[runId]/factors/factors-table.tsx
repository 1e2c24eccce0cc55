"use client";

import { useMemo, useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { createColumnHelper, getCoreRowModel, getFilteredRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { apiFetch } from "@/app/_components/api";
import { DataTable } from "@/app/_components/data-table";
import { DraftCaution } from "@/app/_components/draft-caution";
import { inputClass } from "@/app/_components/field";
import { formatDate } from "@/app/_components/format";
import type { FactorVolatility } from "@/lib/runs/types";
import { ASSET_CLASS_WORDS, num, pct } from "../../_components/run-format";
import { CompletedRun } from "../../_components/run-state";

interface FactorsResponse {
  factors: FactorVolatility[];
  statement: string;
  excludedFactors: { factor: string; reason: string }[];
}

const column = createColumnHelper<FactorVolatility>();
const FAMILY = ["ma", "ewma", "arch", "garch"] as const;
/** Short words for the engine's warning codes in the table; the full sentence is in the factor's detail. */
const WARNING_WORDS: Record<string, string> = {
  "heavy-tails": "heavy tails",
  "near-integrated": "near-integrated",
  "not-converged": "not converged",
  "bound-hit": "parameter at a bound",
  "short-history": "short history",
  "fit-failed": "fit failed",
};
const FAMILY_WORDS = { ma: "Moving average", ewma: "EWMA", arch: "ARCH", garch: "GARCH(1,1)" } as const;

const params = (p: Record<string, number>) =>
  Object.entries(p)
    .map(([k, v]) => `${k} ${Math.abs(v) < 1e-3 && v !== 0 ? v.toExponential(3) : num(v, 4)}`)
    .join(", ");

function Table({ runId }: { runId: string }) {
  const { data, error, isPending } = useQuery({ queryKey: ["run-factors", runId], queryFn: () => apiFetch<FactorsResponse>(`/api/runs/${runId}/factors`) });
  const [sorting, setSorting] = useState<SortingState>([{ id: "chosen", desc: true }]);
  const [search, setSearch] = useState("");
  const [assetClass, setAssetClass] = useState("");
  const [open, setOpen] = useState<string | null>(null);
  const rows = useMemo(() => (data?.factors ?? []).filter((f) => !assetClass || f.assetClass === assetClass), [data, assetClass]);
  const classes = useMemo(() => [...new Set((data?.factors ?? []).map((f) => f.assetClass))].sort(), [data]);
  const columns = [
    column.accessor("factor", {
      header: "Factor",
      cell: (c) => (
        <button type="button" className="whitespace-nowrap text-left font-medium underline decoration-ink-line underline-offset-2" aria-expanded={open === c.getValue()} onClick={() => setOpen(open === c.getValue() ? null : c.getValue())}>
          {c.getValue()}
        </button>
      ),
    }),
    column.accessor((f) => ASSET_CLASS_WORDS[f.assetClass] ?? f.assetClass, { id: "assetClass", header: "Asset class" }),
    column.accessor("returns", { header: "Returns", cell: (c) => <span className="figure block text-right">{c.getValue().toLocaleString("en-GB")}</span> }),
    ...FAMILY.map((k) =>
      column.accessor((f) => f.estimates.find((e) => e.estimator === k)?.annualisedVolatility ?? null, {
        id: k,
        header: `${FAMILY_WORDS[k]} (annual)`,
        sortUndefined: "last",
        cell: (c) => {
          const e = c.row.original.estimates.find((x) => x.estimator === k);
          const chosen = c.row.original.chosen.kind === k;
          return (
            <span className={`figure block text-right ${chosen ? "font-semibold" : ""}`} title={e?.error ?? e?.label}>
              {e?.error ? "not fitted" : pct(c.getValue())}
              {chosen ? <span className="sr-only"> (chosen)</span> : null}
            </span>
          );
        },
      }),
    ),
    column.accessor((f) => f.chosenAnnualisedVolatility, {
      id: "chosen",
      header: "Chosen (annual)",
      sortUndefined: "last",
      cell: (c) => (
        <span className="figure block text-right font-semibold">
          {pct(c.getValue())}
          <span className="block text-xs font-normal text-ink-muted">{c.row.original.estimates.find((e) => e.estimator === c.row.original.chosen.kind)?.label}</span>
        </span>
      ),
    }),
    column.accessor((f) => f.warnings.length + (f.excluded ? 1 : 0), {
      id: "warnings",
      header: "Warnings",
      cell: (c) =>
        c.row.original.excluded ? (
          <span className="text-xs text-alert">Left out: {c.row.original.excluded}</span>
        ) : c.getValue() ? (
          <span className="text-xs text-caution" title={c.row.original.warnings.map((w) => w.message).join(" ")}>
            {c.getValue()} on the chosen fit: {[...new Set(c.row.original.warnings.map((w) => WARNING_WORDS[w.code] ?? w.code))].join(", ")}
          </span>
        ) : (
          <span className="text-xs text-ink-muted">none</span>
        ),
    }),
  ];
  // TanStack Table returns fresh functions each render; this component does not memoise around them.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting, globalFilter: search },
    onSortingChange: setSorting,
    onGlobalFilterChange: setSearch,
    globalFilterFn: (row, _id, value: string) => row.original.factor.toLowerCase().includes(value.toLowerCase()),
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });

  if (isPending) return <p role="status" className="text-sm text-ink-muted">Loading the factors…</p>;
  if (error || !data) return <p role="alert" className="text-sm text-alert">{error instanceof Error ? error.message : "Could not load the factors."}</p>;
  return (
    <div className="flex flex-col gap-4">
      <p className="rounded-md bg-paper-sunk px-3 py-2 text-sm" data-testid="volatility-statement">
        {data.statement} Volatilities are the one-day forecast for the day after the last price, annualised by √252; the bold figure is the estimator the method statement chooses for the factor&apos;s asset class.
        Select a factor for every estimator&apos;s parameters.
      </p>
      <form role="search" aria-label="Filter the factors" className="flex flex-wrap items-end gap-3" onSubmit={(e) => e.preventDefault()}>
        <label className="flex flex-col gap-1 text-sm">
          Factor
          <input type="search" className={inputClass} placeholder="Part of a factor's name" value={search} onChange={(e) => setSearch(e.target.value)} />
        </label>
        <label className="flex flex-col gap-1 text-sm">
          Asset class
          <select className={inputClass} value={assetClass} onChange={(e) => setAssetClass(e.target.value)}>
            <option value="">All asset classes</option>
            {classes.map((c) => (
              <option key={c} value={c}>
                {ASSET_CLASS_WORDS[c] ?? c}
              </option>
            ))}
          </select>
        </label>
        <p className="pb-2 text-sm text-ink-muted" aria-live="polite">
          {table.getRowModel().rows.length} of {data.factors.length} factors
        </p>
      </form>
      <DataTable
        table={table}
        caption="Every factor of the run with its volatility under each estimator; column headers sort"
        sortable
        emptyText="No factor matches."
        rowTestId="factor-row"
        tableTestId="factors-table"
        minWidth="min-w-[1000px]"
        afterRow={(row, span) =>
          open === row.original.factor ? (
            <tr className="bg-paper-sunk/50">
              <td colSpan={span} className="px-3 py-3">
                <p className="mb-2 text-xs text-ink-soft">
                  {row.original.factor}: {row.original.returns.toLocaleString("en-GB")} returns
                  {row.original.firstDate && row.original.lastDate ? ` from ${formatDate(row.original.firstDate)} to ${formatDate(row.original.lastDate)}` : ""}; chosen by{" "}
                  {row.original.chosenFrom === "asset-class" ? "its asset class" : "the firm-wide default"}.
                </p>
                <table className="w-full text-xs">
                  <caption className="sr-only">Every estimator for {row.original.factor}</caption>
                  <thead>
                    <tr className="text-left text-ink-muted">
                      <th scope="col" className="py-1 pr-2">Estimator</th>
                      <th scope="col" className="py-1 pr-2 text-right">Daily</th>
                      <th scope="col" className="py-1 pr-2 text-right">Annual</th>
                      <th scope="col" className="py-1 pr-2 text-right">Long-run daily</th>
                      <th scope="col" className="py-1 pr-2">Parameters</th>
                      <th scope="col" className="py-1 pr-2 text-right">Log-likelihood</th>
                      <th scope="col" className="py-1">Warnings</th>
                    </tr>
                  </thead>
                  <tbody className="figure">
                    {row.original.estimates.map((e) => (
                      <tr key={e.estimator} className={`border-t border-ink-line/60 ${row.original.chosen.kind === e.estimator ? "font-semibold" : ""}`}>
                        <th scope="row" className="py-1 pr-2 text-left font-normal">
                          {e.label}
                          {row.original.chosen.kind === e.estimator ? " (chosen)" : ""}
                        </th>
                        <td className="py-1 pr-2 text-right">{pct(e.currentVolatility, 3)}</td>
                        <td className="py-1 pr-2 text-right">{pct(e.annualisedVolatility)}</td>
                        <td className="py-1 pr-2 text-right">{pct(e.longRunVolatility, 3)}</td>
                        <td className="py-1 pr-2">{e.error ? `not fitted: ${e.error}` : params(e.params)}</td>
                        <td className="py-1 pr-2 text-right">{num(e.logLikelihood, 1)}</td>
                        <td className="py-1">{[...(e.fallbackFrom ? [`fell back from ${e.fallbackFrom.kind}: ${e.fallbackFrom.reason}`] : []), ...e.warnings.map((w) => w.message)].join(" ") || "—"}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </td>
            </tr>
          ) : null
        }
      />
      {data.excludedFactors.length ? (
        <p className="text-sm text-ink-soft">
          Left out of the run: {data.excludedFactors.map((f) => `${f.factor} (${f.reason})`).join("; ")}.
        </p>
      ) : null}
    </div>
  );
}

export function FactorsTable({ runId }: { runId: string }) {
  return (
    <CompletedRun runId={runId}>
      {() => (
        <div className="flex flex-col gap-4">
          <DraftCaution />
          <Table runId={runId} />
        </div>
      )}
    </CompletedRun>
  );
}
