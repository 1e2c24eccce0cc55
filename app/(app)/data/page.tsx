import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/app/_components/page-header";
import { UploadStatus } from "@/app/_components/upload-status";
import { formatMonth, formatTimestamp } from "@/app/_components/format";
import { pageActor } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { listPeriods } from "@/lib/data/periods";
import { listUploads } from "@/lib/data/uploads";
import { priceCoverage } from "@/lib/data/prices";
import { FileUpload } from "./file-upload";
import { PositionColumnGuide } from "./column-guide";
import { SimpleTable } from "@/app/_components/simple-table";
import { Panel } from "@/app/_components/panel";

export const metadata: Metadata = { title: "Data" };

export default async function DataPage() {
  const { actor } = await pageActor();
  const [periods, uploads, coverage] = await Promise.all([listPeriods(actor), listUploads(actor), priceCoverage(actor)]);
  const openPeriods = periods.filter((p) => p.state !== "filed").map((p) => ({ id: p.id, label: `${formatMonth(p.periodEnd)} (ends ${p.periodEnd})` }));
  const periodLabel = new Map(periods.map((p) => [p.id, formatMonth(p.periodEnd)]));
  const withHistory = coverage.filter((c) => c.points > 0);

  return (
    <>
      <PageHeader
        title="Data"
        lead="Month-end positions and the firm's price history. Every file is checked row by row and previewed; nothing is used until someone confirms it."
      />
      <div className="grid gap-6 lg:grid-cols-2">
        <Panel id="positions-heading" title="Month-end positions" padding="p-5" headingClassName="text-lg font-semibold">
          <p className="mt-1 text-sm text-ink-soft">
            One file per period: as-of date, book, instrument id and name, asset class, currency, quantity, price, and optionally market value
            (with its currency, or computed), delta-equivalent exposure and a note; <a className="underline" href="#columns-heading">every column is explained below</a>.
            A new confirmed file supersedes the period&apos;s earlier one; both are kept.
          </p>
          <div className="mt-4">
            {can(actor, "positions.upload") ? (
              <FileUpload kind="positions" periods={openPeriods} />
            ) : (
              <p className="text-sm text-ink-muted">Compliance officers upload positions.</p>
            )}
          </div>
          <p className="mt-3 text-sm">
            Template with an example row: <a className="underline" href="/api/templates/positions.csv">positions.csv</a>
          </p>
        </Panel>
        <Panel id="prices-heading" title="Price history" padding="p-5" headingClassName="text-lg font-semibold">
          <p className="mt-1 text-sm text-ink-soft">
            Daily closes, long (date, instrument, close) or wide (date, then one column per instrument). Exchange rates are instruments named by
            currency pair, e.g. USD{actor.reportingCurrency} = {actor.reportingCurrency} per 1 USD. A changed price is kept as a correction.
          </p>
          <div className="mt-4">
            {can(actor, "prices.upload") ? <FileUpload kind="prices" /> : <p className="text-sm text-ink-muted">Risk analysts upload price history.</p>}
          </div>
          <p className="mt-3 text-sm">
            Blank templates: <a className="underline" href="/api/templates/prices-long.csv">prices-long.csv</a> ·{" "}
            <a className="underline" href="/api/templates/prices-wide.csv">prices-wide.csv</a>
          </p>
        </Panel>
      </div>

      <PositionColumnGuide reportingCurrency={actor.reportingCurrency} />

      <section aria-labelledby="uploads-heading" className="mt-8">
        <h2 id="uploads-heading" className="mb-3 text-lg font-semibold">
          Uploads
        </h2>
        {uploads.length === 0 ? (
          <div className="rounded-lg border border-dashed border-ink-line bg-paper-raised p-6 text-ink-soft">
            Nothing uploaded yet. Start with the price history (risk analyst), then the month-end positions (compliance officer); the blank templates
            above show the columns.
          </div>
        ) : (
          <SimpleTable caption="Uploaded files, newest first" columns={["File", "Kind", "Period", "Status", { label: "Rows", align: "right" }, { label: "Errors", align: "right" }, { label: "Warnings", align: "right" }, "Received"]}>
            {uploads.map((u) => (
              <tr key={u.id} className="border-t border-ink-line" data-testid="upload-row">
                <td className="px-3 py-2">
                  <Link href={`/data/uploads/${u.id}`} className="font-medium underline-offset-2 hover:underline">
                    {u.fileName}
                  </Link>
                </td>
                <td className="px-3 py-2">{u.kind === "positions" ? "Positions" : "Price history"}</td>
                <td className="px-3 py-2">{u.periodId ? periodLabel.get(u.periodId) : "—"}</td>
                <td className="px-3 py-2">
                  <UploadStatus status={u.status} />
                </td>
                <td className="figure px-3 py-2 text-right">{u.rowCount.toLocaleString("en")}</td>
                <td className="figure px-3 py-2 text-right">{u.errorCount.toLocaleString("en")}</td>
                <td className="figure px-3 py-2 text-right">{u.warningCount.toLocaleString("en")}</td>
                <td className="figure px-3 py-2 whitespace-nowrap">{formatTimestamp(u.createdAt)}</td>
              </tr>
            ))}
          </SimpleTable>
        )}
      </section>

      <section aria-labelledby="coverage-heading" className="mt-8">
        <h2 id="coverage-heading" className="mb-1 text-lg font-semibold">
          Price history held
        </h2>
        <p className="mb-3 text-sm text-ink-soft">
          {withHistory.length} instrument{withHistory.length === 1 ? "" : "s"} with prices
          {withHistory.length ? `, ${withHistory.reduce((s, c) => s + c.points, 0).toLocaleString("en")} closes in all` : ""}.
        </p>
        {coverage.length === 0 ? null : (
          <SimpleTable
            caption="Price history per instrument"
            scroll={{ label: "Price history per instrument (scrolls)", maxHeight: "max-h-96" }}
            columns={["Instrument", "Asset class", { label: "Closes", align: "right" }, "From", "To", { label: "Corrected", align: "right" }]}
          >
            {coverage.map((c) => (
              <tr key={c.code} className="border-t border-ink-line">
                <td className="px-3 py-1.5">
                  <span className="font-medium">{c.code}</span> <span className="text-ink-muted">{c.name}</span>
                </td>
                <td className="px-3 py-1.5">{c.assetClass}</td>
                <td className="figure px-3 py-1.5 text-right">{c.points.toLocaleString("en")}</td>
                <td className="figure px-3 py-1.5">{c.first ?? "—"}</td>
                <td className="figure px-3 py-1.5">{c.last ?? "—"}</td>
                <td className="figure px-3 py-1.5 text-right">{c.corrections || ""}</td>
              </tr>
            ))}
          </SimpleTable>
        )}
      </section>
    </>
  );
}
