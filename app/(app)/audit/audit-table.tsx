"use client";

import { useMemo, useState } from "react";
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { createColumnHelper, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import { apiFetch } from "@/app/_components/api";
import { DataTable } from "@/app/_components/data-table";
import { inputClass } from "@/app/_components/field";
import { Pager } from "@/app/_components/pager";
import { formatTimestamp } from "@/app/_components/format";
import { LoadError } from "@/app/_components/load-error";

interface AuditRow {
  id: string;
  at: string;
  actorName: string;
  action: string;
  entityType: string;
  entityId: string | null;
  summary: string;
}
interface AuditPage {
  events: AuditRow[];
  total: number;
  page: number;
  pageSize: number;
  actions: string[];
}

const column = createColumnHelper<AuditRow>();
const columns = [
  column.accessor("at", { header: "When (UTC)", cell: (c) => <span className="figure whitespace-nowrap">{formatTimestamp(c.getValue())}</span> }),
  column.accessor("actorName", { header: "Who", cell: (c) => c.getValue() || "System" }),
  column.accessor("action", { header: "Action", cell: (c) => <code className="text-xs">{c.getValue()}</code> }),
  column.accessor("summary", { header: "What" }),
  column.accessor("entityType", {
    header: "Record",
    cell: (c) => (
      <span className="text-xs text-ink-muted">
        {c.getValue()}
        {c.row.original.entityId ? ` ${c.row.original.entityId.slice(0, 8)}` : ""}
      </span>
    ),
  }),
];

export function AuditTable() {
  const [filters, setFilters] = useState({ action: "", from: "", to: "", q: "" });
  const [page, setPage] = useState(1);
  const pageSize = 50;
  const queryString = useMemo(() => {
    const params = new URLSearchParams({ page: String(page), pageSize: String(pageSize) });
    for (const [key, value] of Object.entries(filters)) if (value) params.set(key, value);
    return params.toString();
  }, [filters, page]);
  const { data, error, isPending, isFetching } = useQuery({
    queryKey: ["audit", queryString],
    queryFn: () => apiFetch<AuditPage>(`/api/audit?${queryString}`),
    placeholderData: keepPreviousData,
  });
  // TanStack Table returns fresh functions each render; this component does not memoise around them.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({ data: data?.events ?? [], columns, getCoreRowModel: getCoreRowModel(), manualPagination: true });
  const pages = data ? Math.max(1, Math.ceil(data.total / pageSize)) : 1;

  function update(key: keyof typeof filters, value: string) {
    setFilters((f) => ({ ...f, [key]: value }));
    setPage(1);
  }

  return (
    <div className="flex flex-col gap-4">
      <form role="search" aria-label="Filter the audit trail" className="flex flex-wrap items-end gap-3" onSubmit={(e) => e.preventDefault()}>
        <label className="flex flex-col gap-1 text-sm">
          Action
          <select className={inputClass} value={filters.action} onChange={(e) => update("action", e.target.value)}>
            <option value="">All actions</option>
            {data?.actions.map((a) => (
              <option key={a} value={a}>
                {a}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm">
          From
          <input type="date" className={inputClass} value={filters.from} onChange={(e) => update("from", e.target.value)} />
        </label>
        <label className="flex flex-col gap-1 text-sm">
          To
          <input type="date" className={inputClass} value={filters.to} onChange={(e) => update("to", e.target.value)} />
        </label>
        <label className="flex flex-col gap-1 text-sm">
          Search
          <input type="search" placeholder="Person or text" className={inputClass} value={filters.q} onChange={(e) => update("q", e.target.value)} />
        </label>
        <p className="pb-2 text-sm text-ink-muted" aria-live="polite">
          {isFetching ? "Loading…" : data ? `${data.total} event${data.total === 1 ? "" : "s"}` : ""}
        </p>
      </form>
      {error ? <LoadError error={error} fallback="Could not load the audit trail." /> : null}
      <DataTable table={table} caption="Audit events, newest first" loading={isPending} loadingText="Loading the audit trail…" emptyText="No event matches these filters." rowTestId="audit-row" />
      <Pager page={page} pages={pages} setPage={setPage} previous="Newer" next="Older" />
    </div>
  );
}
