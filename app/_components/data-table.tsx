"use client";

import { Fragment, type ReactNode } from "react";
import { flexRender, type Row, type Table } from "@tanstack/react-table";

/**
 * One table on TanStack Table for every list in the app: the scrolling card, a caption for screen readers, header
 * cells that sort by keyboard or pointer when the table sorts (a button per header, `aria-sort` on the cell), a
 * loading row, an empty row, and optionally a detail row after a row (an expanded factor, for instance).
 */
export function DataTable<T>({
  table,
  caption,
  sortable = false,
  loading = false,
  loadingText = "Loading…",
  emptyText,
  rowTestId,
  tableTestId,
  minWidth,
  cellClassName = "px-3 py-2",
  rowClassName = "border-t border-ink-line align-top",
  afterRow,
}: {
  table: Table<T>;
  /** what the table lists, for screen readers (say "column headers sort" when they do) */
  caption: string;
  /** headers are sort buttons (the table has a sorted row model) */
  sortable?: boolean;
  loading?: boolean;
  loadingText?: string;
  /** shown when there is no row (omit to show an empty body) */
  emptyText?: string;
  rowTestId?: string;
  tableTestId?: string;
  /** a Tailwind min-width class for wide tables, e.g. "min-w-[900px]" */
  minWidth?: string;
  cellClassName?: string;
  rowClassName?: string;
  /** a row of detail under a row, spanning the columns, or null */
  afterRow?: (row: Row<T>, columns: number) => ReactNode;
}) {
  const columns = table.getVisibleLeafColumns().length;
  const rows = table.getRowModel().rows;
  const message = (text: string) => (
    <tr>
      <td colSpan={columns} className="px-3 py-6 text-center text-ink-muted">
        {text}
      </td>
    </tr>
  );
  return (
    <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised">
      <table className={`w-full ${minWidth ?? ""} text-sm`.replace(/\s+/g, " ")} data-testid={tableTestId}>
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper-sunk text-left text-ink-soft">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const label = flexRender(header.column.columnDef.header, header.getContext());
                if (!sortable || !header.column.getCanSort()) {
                  return (
                    <th key={header.id} scope="col" className="px-3 py-2 font-medium">
                      {label}
                    </th>
                  );
                }
                const sorted = header.column.getIsSorted();
                return (
                  <th key={header.id} scope="col" className="px-3 py-2 font-medium" aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}>
                    <button type="button" className="inline-flex items-center gap-1 text-left" onClick={header.column.getToggleSortingHandler()}>
                      {label}
                      <span aria-hidden="true">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                    </button>
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {loading
            ? message(loadingText)
            : rows.length === 0 && emptyText
              ? message(emptyText)
              : rows.map((row) => (
                  <Fragment key={row.id}>
                    <tr className={rowClassName} data-testid={rowTestId}>
                      {row.getVisibleCells().map((cell) => (
                        <td key={cell.id} className={cellClassName}>
                          {flexRender(cell.column.columnDef.cell, cell.getContext())}
                        </td>
                      ))}
                    </tr>
                    {afterRow?.(row, columns)}
                  </Fragment>
                ))}
        </tbody>
      </table>
    </div>
  );
}
