"use client";

import { useEffect, useMemo, useRef, useState } from "react";
import { describeAttributes } from "@/lib/uploads/attribute-words";
import type { PositionAttributes } from "@/lib/uploads/position-attributes";
import { useRouter } from "next/navigation";
import { keepPreviousData, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/app/_components/api";
import { PageHeader } from "@/app/_components/page-header";
import { UploadStatus } from "@/app/_components/upload-status";
import { StatusBadge } from "@/app/_components/status-badge";
import { inputClass, primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { Pager } from "@/app/_components/pager";
import type { DateFormat, NumberFormat, Problem } from "@/lib/uploads/types";
import { FormatSelect } from "../../_components/format-select";
import { SimpleTable } from "@/app/_components/simple-table";
import type { PositionTotals } from "@/lib/uploads/parse-positions";
import type { UploadSummary } from "@/lib/uploads/summary";

type Group = PositionTotals["byAssetClass"][number];
interface Preview {
  upload: {
    id: string;
    kind: "positions" | "prices";
    fileName: string;
    status: string;
    rowCount: number;
    errorCount: number;
    warningCount: number;
    sha256: string;
    sizeBytes: number;
    options: { numberFormat: NumberFormat; dateFormat?: DateFormat; mapping?: Record<string, string> } | null;
    summary: UploadSummary | null;
  };
  canConfirm: boolean;
  reportingCurrency: string;
  problems: Problem[];
  header: string[];
  missingColumns: string[];
  fields: { key: string; label: string; required: boolean }[];
  summary: UploadSummary | null;
  /** the worker's reading or confirming job, while the upload is "reading" or "confirming" */
  job: { state: string; stage: string | null; progress: number | null; error: string | null } | null;
}

/** The states in which a worker is busy with the upload: the preview asks again every second. */
const WORKING = new Set(["reading", "confirming"]);

/** What a finished confirmation stored, in words. */
function confirmedText(kind: "positions" | "prices", summary: UploadSummary | null): string {
  const done: { stored?: number; added?: number; corrected?: number } = summary?.confirmed ?? summary ?? {};
  const n = (v: number | undefined) => (v ?? 0).toLocaleString("en");
  return kind === "positions" ? `Confirmed: ${n(done.stored)} positions stored in the period.` : `Confirmed: ${n(done.added)} new closes, ${n(done.corrected)} corrections.`;
}

/** The worker's progress on the upload: what it is doing, how far, and a failed attempt it is retrying. */
function WorkProgress({ status, job, sizeBytes }: { status: string; job: Preview["job"]; sizeBytes: number }) {
  const reading = status === "reading";
  const title = reading ? "Reading and checking the file" : "Storing the rows";
  const fraction = job?.progress ?? 0;
  const stage = job?.state === "queued" ? (job.error ? "Waiting to try again" : "Waiting for a worker") : (job?.stage ?? "Starting");
  return (
    <section aria-labelledby="work-heading" className="rounded-lg border border-ink-line bg-paper-raised p-4" data-testid="upload-progress">
      <h2 id="work-heading" className="font-semibold">
        {title}
      </h2>
      <p className="mt-1 text-sm text-ink-soft">
        {reading
          ? `The file (${(sizeBytes / 1024).toFixed(1)} KB) is read and every row checked before anything is shown; nothing is stored in the period or the price history yet.`
          : "The rows are stored first where nothing reads them; the last step makes them count, all at once. You can leave this page and come back."}
      </p>
      <div role="progressbar" aria-label={title} aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(fraction * 100)} className="mt-3 h-2 w-full overflow-hidden rounded-full bg-paper-sunk">
        <div className="h-full bg-brass transition-[width]" style={{ width: `${Math.round(fraction * 100)}%` }} />
      </div>
      <p role="status" className="mt-1 text-sm">
        {stage} · {Math.round(fraction * 100)} %
      </p>
      {job?.error ? <p className="mt-1 text-sm text-alert">An attempt failed ({job.error}); it is tried again.</p> : null}
    </section>
  );
}

const COLUMN_LABELS: Record<string, string> = {
  row: "Row",
  asOf: "As of",
  book: "Book",
  instrumentName: "Name",
  assetClass: "Asset class",
  currency: "Ccy",
  quantity: "Quantity",
  price: "Price",
  marketValue: "Market value",
  deltaExposure: "Delta exposure",
  date: "Date",
  instrument: "Instrument",
  close: "Close",
  attributes: "Standardised attributes",
};

/** A cell of the preview: numbers grouped, with their decimals kept. */
function cellText(value: unknown, column: string): string {
  if (value === null || value === undefined) return "—";
  if (column === "attributes" && typeof value === "object") return describeAttributes(value as PositionAttributes);
  if (typeof value === "number" && column !== "row") return value.toLocaleString("en", { maximumFractionDigits: 6 });
  return String(value);
}

const money = (n: number) => n.toLocaleString("en", { maximumFractionDigits: 0 });

function Totals({ summary, kind, reportingCurrency }: { summary: UploadSummary | null; kind: "positions" | "prices"; reportingCurrency: string }) {
  if (!summary) return null;
  if (kind === "positions") {
    const totals = summary.totals;
    if (!totals || totals.positions === 0) return null;
    const rates = summary.rates ?? [];
    const table = (title: string, groups: Group[]) => (
      <table className="w-full text-sm">
        <caption className="mb-1 text-left font-medium">{title}</caption>
        <thead className="text-left text-ink-soft">
          <tr>
            <th scope="col" className="py-1 font-medium"></th>
            <th scope="col" className="py-1 text-right font-medium">Positions</th>
            <th scope="col" className="py-1 text-right font-medium">Gross</th>
            <th scope="col" className="py-1 text-right font-medium">Net</th>
          </tr>
        </thead>
        <tbody>
          {groups.map((g) => (
            <tr key={g.key} className="border-t border-ink-line">
              <th scope="row" className="py-1 text-left font-normal">{g.key}</th>
              <td className="figure py-1 text-right">{g.count}</td>
              <td className="figure py-1 text-right">{money(g.gross)}</td>
              <td className="figure py-1 text-right">{money(g.net)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    );
    return (
      <section aria-label="Totals" className="grid gap-6 rounded-lg border border-ink-line bg-paper-raised p-4 md:grid-cols-3">
        <div className="text-sm">
          <dl className="grid grid-cols-2 content-start gap-y-1">
            <dt className="text-ink-soft">Positions</dt>
            <dd className="figure text-right" data-testid="total-positions">{totals.positions}</dd>
            <dt className="text-ink-soft">Gross market value</dt>
            <dd className="figure text-right">{money(totals.grossMarketValue)}</dd>
            <dt className="text-ink-soft">Net market value</dt>
            <dd className="figure text-right">{money(totals.netMarketValue)}</dd>
          </dl>
          <p className="mt-1 text-xs text-ink-muted" data-testid="values-note">
            Market values in {reportingCurrency}: as given in {reportingCurrency}, converted from the row&apos;s market_value_currency, or computed as
            quantity × price × rate, at the rates below.
          </p>
          {rates.length > 0 ? (
            <>
              <p className="mt-2 font-medium">Exchange rates used</p>
              <ul>
                {rates.map((r) => (
                  <li key={r.pair} className="flex justify-between gap-2 text-xs" data-testid="rate-used">
                    <span>
                      {r.pair} {r.date ? `(${r.date})` : ""}
                      {r.periodEnd ? "" : " · before the period end"}
                    </span>
                    <span className="figure">{r.rate.toLocaleString("en", { maximumFractionDigits: 6 })}</span>
                  </li>
                ))}
              </ul>
            </>
          ) : null}
        </div>
        {table("By asset class", totals.byAssetClass)}
        {table("By currency", totals.byCurrency)}
      </section>
    );
  }
  const s = summary;
  return (
    <section aria-label="Totals" className="rounded-lg border border-ink-line bg-paper-raised p-4 text-sm">
      <p>
        <span className="figure" data-testid="total-points">{(s.points ?? 0).toLocaleString("en")}</span> closes for {s.instruments ?? 0} instruments, {s.firstDate ?? "—"} to {s.lastDate ?? "—"} ({s.layout ?? "—"} layout).
      </p>
      {s.added !== undefined ? (
        <p className="mt-1">
          Stored: {s.added.toLocaleString("en")} new, <span data-testid="corrected-count">{(s.corrected ?? 0).toLocaleString("en")}</span> corrected (old prices kept), {(s.unchanged ?? 0).toLocaleString("en")} unchanged.
        </p>
      ) : null}
    </section>
  );
}

export function UploadPreview({ uploadId }: { uploadId: string }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [page, setPage] = useState(1);
  const [severity, setSeverity] = useState<"all" | "error" | "warning">("all");
  const [acknowledged, setAcknowledged] = useState(false);
  const [mapping, setMapping] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ tone: "ok" | "alert"; text: string } | null>(null);

  const preview = useQuery({
    queryKey: ["upload", uploadId],
    queryFn: () => apiFetch<Preview>(`/api/uploads/${uploadId}`),
    refetchInterval: (query) => (WORKING.has(query.state.data?.upload.status ?? "") ? 1000 : false),
  });
  const status = preview.data?.upload.status;
  const pending = status === "pending";
  // Say what the worker finished while this page watched it (a reload shows the state itself).
  const previous = useRef<string | undefined>(undefined);
  // what this page asked the worker for, so its answer is told even when the worker finished between two looks
  const asked = useRef<"confirm" | "options" | null>(null);
  useEffect(() => {
    const data = preview.data;
    if (!data) return;
    const before = previous.current;
    previous.current = data.upload.status;
    if (data.upload.status === "duplicate") {
      const earlier = data.upload.summary?.duplicateOf;
      if (earlier) router.replace(`/data/uploads/${earlier}?duplicate=1`);
      return;
    }
    if ((before === "confirming" || asked.current === "confirm") && data.upload.status === "confirmed") {
      asked.current = null;
      setMessage({ tone: "ok", text: confirmedText(data.upload.kind, data.upload.summary) });
      router.refresh();
    }
    if (before === "confirming" && data.upload.status === "pending") {
      const why = data.upload.summary?.confirmError;
      setMessage({ tone: "alert", text: why ?? "Confirming did not finish; nothing of the file counts yet. Confirm again." });
    }
    if ((before === "reading" || asked.current === "options") && data.upload.status === "pending") {
      const reread = asked.current === "options";
      asked.current = null;
      if (reread) setMessage({ tone: "ok", text: "Re-read with the new settings." });
      setPage(1);
      void queryClient.invalidateQueries({ queryKey: ["upload-rows", uploadId] });
    }
  }, [preview.data, router, queryClient, uploadId]);
  const rows = useQuery({
    queryKey: ["upload-rows", uploadId, page],
    queryFn: () => apiFetch<{ total: number; rows: Record<string, unknown>[] }>(`/api/uploads/${uploadId}/rows?page=${page}&pageSize=25`),
    enabled: pending,
    placeholderData: keepPreviousData,
  });

  const kind = preview.data?.upload.kind ?? "positions";
  const act = useMutation({
    mutationFn: (input: { path: string; method: string; body: unknown }) => apiFetch<Record<string, unknown>>(`/api/uploads/${kind}/${uploadId}/${input.path}`, { method: input.method, body: input.body }),
    onSuccess: (data, input) => {
      asked.current = input.path === "confirm" || input.path === "options" ? input.path : null;
      if (input.path === "confirm") setMessage(data.status === "confirmed" ? { tone: "ok", text: confirmedText(kind, data) } : null);
      if (input.path === "cancel") setMessage({ tone: "ok", text: "Cancelled. Nothing from this file was stored." });
      if (input.path === "options") setMessage({ tone: "ok", text: "Reading the file again with the new settings." });
      setPage(1);
      void queryClient.invalidateQueries({ queryKey: ["upload", uploadId] });
      void queryClient.invalidateQueries({ queryKey: ["upload-rows", uploadId] });
      router.refresh();
    },
    onError: (error) => setMessage({ tone: "alert", text: error instanceof Error ? error.message : "That did not work." }),
  });

  const problems = useMemo(() => (preview.data?.problems ?? []).filter((p) => severity === "all" || p.severity === severity), [preview.data, severity]);

  if (preview.isPending) return <p className="text-ink-muted">Reading the file…</p>;
  if (preview.error || !preview.data) {
    return (
      <p role="alert" className="rounded-md border border-alert/30 bg-alert-bg p-3 text-alert">
        {preview.error instanceof Error ? preview.error.message : "This upload could not be loaded."}
      </p>
    );
  }
  const { upload, problems: allProblems, header, missingColumns, fields, summary, canConfirm } = preview.data;
  const errors = allProblems.filter((p) => p.severity === "error").length;
  const warnings = allProblems.length - errors;
  // every key of the page's rows, in first-seen order (a row without standardised attributes has no such key)
  const columns = [...new Set((rows.data?.rows ?? []).flatMap((r) => Object.keys(r)))].filter((c) => c !== "marketValueGiven");
  const pages = rows.data ? Math.max(1, Math.ceil(rows.data.total / 25)) : 1;

  return (
    <>
      <PageHeader
        title={upload.fileName}
        lead={
          <>
            {upload.kind === "positions" ? "Positions" : "Price history"} · {(upload.sizeBytes / 1024).toFixed(1)} KB
            {upload.sha256 ? (
              <>
                {" "}
                · SHA-256 <code className="text-xs">{upload.sha256.slice(0, 16)}…</code>
              </>
            ) : null}
          </>
        }
        actions={<UploadStatus status={upload.status} />}
      />
      {message ? (
        <p role="status" data-testid="preview-message" className={`mb-4 rounded-md border px-3 py-2 text-sm ${message.tone === "ok" ? "border-ok/30 bg-ok-bg text-ok" : "border-alert/30 bg-alert-bg text-alert"}`}>
          {message.text}
        </p>
      ) : null}

      <div className="flex flex-col gap-6">
        {WORKING.has(upload.status) ? <WorkProgress status={upload.status} job={preview.data.job} sizeBytes={upload.sizeBytes} /> : null}
        {upload.status === "failed" ? (
          <section aria-labelledby="failed-heading" className="rounded-lg border border-alert/30 bg-alert-bg p-4 text-alert">
            <h2 id="failed-heading" className="font-semibold">
              This file could not be read
            </h2>
            <p className="mt-1 text-sm">{summary?.rejected ?? "The reading stopped."} Nothing was stored.</p>
            {canConfirm ? (
              <div className="mt-3 flex gap-2">
                <button type="button" className={secondaryButtonClass} disabled={act.isPending} onClick={() => act.mutate({ path: "options", method: "PUT", body: upload.options ?? { numberFormat: "plain" } })}>
                  Read it again
                </button>
                <button type="button" className={secondaryButtonClass} disabled={act.isPending} onClick={() => act.mutate({ path: "cancel", method: "POST", body: {} })}>
                  Cancel upload
                </button>
              </div>
            ) : null}
          </section>
        ) : null}
        {upload.status === "reading" || upload.status === "failed" || upload.status === "duplicate" ? null : (
          <>
        <Totals summary={summary} kind={upload.kind} reportingCurrency={preview.data.reportingCurrency} />

        <section aria-labelledby="problems-heading">
          <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
            <h2 id="problems-heading" className="text-lg font-semibold">
              Problems{" "}
              {errors ? <StatusBadge tone="alert">{errors} error{errors === 1 ? "" : "s"}</StatusBadge> : <StatusBadge tone="ok">No errors</StatusBadge>}{" "}
              {warnings ? <StatusBadge tone="caution">{warnings} warning{warnings === 1 ? "" : "s"}</StatusBadge> : null}
            </h2>
            <label className="flex items-center gap-2 text-sm">
              Show
              <select className={inputClass} value={severity} onChange={(e) => setSeverity(e.target.value as typeof severity)}>
                <option value="all">all</option>
                <option value="error">errors</option>
                <option value="warning">warnings</option>
              </select>
            </label>
          </div>
          {problems.length === 0 ? (
            <p className="rounded-lg border border-ink-line bg-paper-raised p-4 text-sm text-ink-soft">Every row passed the checks.</p>
          ) : (
            <>
              <SimpleTable caption="Problems found in the file" testId="problems-table" scroll={{ label: "Problems found in the file (scrolls)", maxHeight: "max-h-80" }} columns={["Row", "Column", "Problem", "Severity"]}>
                {problems.slice(0, 1000).map((p, i) => (
                  <tr key={i} className="border-t border-ink-line">
                    <td className="figure px-3 py-1.5">{p.row ?? "—"}</td>
                    <td className="px-3 py-1.5">{p.field ?? "—"}</td>
                    <td className="px-3 py-1.5">{p.message}</td>
                    <td className="px-3 py-1.5">{p.severity === "error" ? <StatusBadge tone="alert">Error</StatusBadge> : <StatusBadge tone="caution">Warning</StatusBadge>}</td>
                  </tr>
                ))}
              </SimpleTable>
              {problems.length > 1000 ? <p className="mt-1 text-sm text-ink-muted">Showing the first 1,000 of {problems.length.toLocaleString("en")}.</p> : null}
            </>
          )}
        </section>

        {pending && canConfirm ? (
          <section aria-labelledby="reading-heading" className="rounded-lg border border-ink-line bg-paper-raised p-4">
            <h2 id="reading-heading" className="font-semibold">
              How the file is read
            </h2>
            <form
              className="mt-3 flex flex-col gap-3"
              onSubmit={(e) => {
                e.preventDefault();
                const form = new FormData(e.currentTarget);
                act.mutate({ path: "options", method: "PUT", body: { numberFormat: form.get("numberFormat"), dateFormat: form.get("dateFormat"), mapping: { ...(upload.options?.mapping ?? {}), ...mapping } } });
              }}
            >
              <FormatSelect what="numbers" className="max-w-xs" name="numberFormat" defaultValue={upload.options?.numberFormat ?? "plain"} />
              <FormatSelect what="dates" className="max-w-xs" name="dateFormat" defaultValue={upload.options?.dateFormat ?? "iso"} />
              {missingColumns.length > 0 && header.length > 0 ? (
                <fieldset className="flex flex-col gap-2" data-testid="column-mapping">
                  <legend className="text-sm font-medium">Match the file&apos;s columns to the fields Ballast needs</legend>
                  {fields
                    .filter((f) => missingColumns.includes(f.key) || mapping[f.key])
                    .map((f) => (
                      <label key={f.key} className="flex flex-wrap items-center gap-2 text-sm">
                        <span className="w-48">{f.label}</span>
                        <select className={inputClass} aria-label={`Column for ${f.label}`} value={mapping[f.key] ?? ""} onChange={(e) => setMapping((m) => ({ ...m, [f.key]: e.target.value }))}>
                          <option value="">— choose a column —</option>
                          {header.map((h) => (
                            <option key={h} value={h}>
                              {h}
                            </option>
                          ))}
                        </select>
                      </label>
                    ))}
                </fieldset>
              ) : null}
              <div>
                <button type="submit" className={secondaryButtonClass} disabled={act.isPending}>
                  Re-read the file
                </button>
              </div>
            </form>
          </section>
        ) : null}

        {pending ? (
          <section aria-labelledby="rows-heading">
            <h2 id="rows-heading" className="mb-2 text-lg font-semibold">
              Rows that passed <span className="text-sm font-normal text-ink-muted">({(rows.data?.total ?? 0).toLocaleString("en")})</span>
            </h2>
            {columns.length === 0 ? (
              <p className="rounded-lg border border-ink-line bg-paper-raised p-4 text-sm text-ink-soft">{rows.isPending ? "Loading rows…" : "No row passed the checks."}</p>
            ) : (
              <>
                <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised">
                  <table className="w-full text-sm" data-testid="rows-table">
                    <caption className="sr-only">Parsed rows, page {page}</caption>
                    <thead className="bg-paper-sunk text-left text-ink-soft">
                      <tr>
                        {columns.map((c) => (
                          <th key={c} scope="col" className={`whitespace-nowrap px-3 py-2 font-medium ${typeof rows.data?.rows[0]?.[c] === "number" ? "text-right" : ""}`}>
                            {COLUMN_LABELS[c] ?? c}
                          </th>
                        ))}
                      </tr>
                    </thead>
                    <tbody>
                      {rows.data?.rows.map((r, i) => (
                        <tr key={i} className="border-t border-ink-line">
                          {columns.map((c) => (
                            <td key={c} className={`px-3 py-1.5 ${typeof r[c] === "number" ? "figure whitespace-nowrap text-right" : c === "asOf" || c === "date" || c === "instrument" ? "whitespace-nowrap" : ""}`}>
                              {cellText(r[c], c)}
                            </td>
                          ))}
                        </tr>
                      ))}
                    </tbody>
                  </table>
                </div>
                <Pager page={page} pages={pages} setPage={setPage} className="mt-2 flex items-center justify-between text-sm" />
              </>
            )}
          </section>
        ) : null}

        {pending && canConfirm ? (
          <section aria-labelledby="decide-heading" className="rounded-lg border border-brass bg-paper-raised p-4">
            <h2 id="decide-heading" className="font-semibold">
              Confirm or cancel
            </h2>
            {errors > 0 ? (
              <p className="mt-2 text-sm text-alert">This file has errors and cannot be confirmed. Fix the file and upload it again, or re-read it with other settings.</p>
            ) : (
              <p className="mt-2 text-sm text-ink-soft">
                {upload.kind === "positions"
                  ? "Confirming stores these positions in the period; an earlier confirmed file for the period is kept but marked superseded."
                  : "Confirming adds these closes to the firm's price history; a changed price is stored as a correction and the old one kept."}
              </p>
            )}
            {warnings > 0 && errors === 0 ? (
              <label className="mt-3 flex items-start gap-2 text-sm">
                <input type="checkbox" className="mt-1" checked={acknowledged} onChange={(e) => setAcknowledged(e.target.checked)} />
                <span>I have read the {warnings} warning{warnings === 1 ? "" : "s"} above and accept the file as it is.</span>
              </label>
            ) : null}
            <div className="mt-3 flex gap-2">
              <button
                type="button"
                className={primaryButtonClass}
                disabled={errors > 0 || (warnings > 0 && !acknowledged) || act.isPending}
                onClick={() => act.mutate({ path: "confirm", method: "POST", body: { acknowledgeWarnings: acknowledged } })}
              >
                {act.isPending && act.variables?.path === "confirm" ? "Confirming…" : "Confirm"}
              </button>
              <button type="button" className={secondaryButtonClass} disabled={act.isPending} onClick={() => act.mutate({ path: "cancel", method: "POST", body: {} })}>
                Cancel upload
              </button>
            </div>
          </section>
        ) : null}
          </>
        )}
      </div>
    </>
  );
}
