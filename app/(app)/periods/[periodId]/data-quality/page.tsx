import type { Metadata } from "next";
import Link from "next/link";
import { BackLink } from "@/app/_components/back-link";
import { PageHeader } from "@/app/_components/page-header";
import { StatusBadge } from "@/app/_components/status-badge";
import { formatMonth } from "@/app/_components/format";
import { orNotFound, pageActor } from "@/lib/auth/page";
import { getDataQuality } from "@/lib/data/data-quality";
import { can } from "@/lib/auth/permissions";
import { CONFIRMABLE_CHECKS } from "@/lib/uploads/data-quality";
import { ConfirmItem } from "./confirm-item";
import { SimpleTable } from "@/app/_components/simple-table";

export const metadata: Metadata = { title: "Data quality" };

const tone = { error: "alert", warning: "caution", info: "neutral" } as const;
const word = { error: "Error", warning: "Warning", info: "Note" } as const;

export default async function DataQualityPage({ params, searchParams }: { params: Promise<{ periodId: string }>; searchParams: Promise<{ check?: string }> }) {
  const { periodId } = await params;
  const { check } = await searchParams;
  const { actor } = await pageActor();
  const data = await orNotFound(getDataQuality(actor, periodId));
  const { report } = data;
  const items = check ? report.items.filter((i) => i.check === check) : report.items;
  const canConfirm = can(actor, "quality.confirm");
  return (
    <>
      <BackLink href={`/periods/${periodId}`}>{formatMonth(data.periodEnd)}</BackLink>
      <PageHeader
        title="Data-quality report"
        lead={
          data.uploadId
            ? `${data.positions} confirmed positions from "${data.fileName}" checked against the firm's price history up to ${data.periodEnd}. Each item goes into the run and the filing pack; a finding confirmed here reaches the pack through the next run started after it.`
            : "No positions are confirmed for this period yet: the report covers a period's confirmed positions."
        }
      />
      <section aria-label="Counts" className="mb-6 grid gap-3 sm:grid-cols-3">
        {(["error", "warning", "info"] as const).map((s) => (
          <div key={s} className="rounded-lg border border-ink-line bg-paper-raised p-4">
            <p className="text-sm text-ink-soft">{word[s]}s</p>
            <p className="figure text-2xl font-semibold" data-testid={`count-${s}`}>
              {report.counts[s]}
            </p>
          </div>
        ))}
      </section>
      {report.byCheck.length > 0 ? (
        <nav aria-label="Checks" className="mb-4 flex flex-wrap gap-2 text-sm">
          <Link href={`/periods/${periodId}/data-quality`} aria-current={!check ? "page" : undefined} className={`rounded-full border px-3 py-1 ${!check ? "border-brass font-semibold" : "border-ink-line"}`}>
            All ({report.items.length})
          </Link>
          {report.byCheck.map((c) => (
            <Link
              key={c.check}
              href={`/periods/${periodId}/data-quality?check=${c.check}`}
              aria-current={check === c.check ? "page" : undefined}
              className={`rounded-full border px-3 py-1 ${check === c.check ? "border-brass font-semibold" : "border-ink-line"}`}
              data-testid={`check-${c.check}`}
            >
              {c.label} ({c.count})
            </Link>
          ))}
        </nav>
      ) : null}
      {items.length === 0 ? (
        <p className="rounded-lg border border-ink-line bg-paper-raised p-6 text-ink-soft">{data.uploadId ? "No problems found." : "Nothing to check yet."}</p>
      ) : (
        <SimpleTable caption="Data-quality items" columns={["Severity", "Check", "Instrument", "Finding"]}>
          {items.map((item, i) => (
            <tr key={i} className="border-t border-ink-line align-top" data-testid="quality-item">
              <td className="px-3 py-2">
                <StatusBadge tone={tone[item.severity]}>{word[item.severity]}</StatusBadge>
              </td>
              <td className="px-3 py-2 whitespace-nowrap">{report.byCheck.find((c) => c.check === item.check)?.label}</td>
              <td className="px-3 py-2 font-medium">{item.instrument}</td>
              <td className="px-3 py-2">
                {item.message}
                {item.confirmation ? (
                  <p className="mt-1 text-ink-soft" data-testid="quality-confirmation">
                    <StatusBadge tone="ok">Confirmed</StatusBadge> by {item.confirmation.by} on {item.confirmation.at.slice(0, 16).replace("T", " ")} UTC: {item.confirmation.reason}
                  </p>
                ) : CONFIRMABLE_CHECKS.includes(item.check) ? (
                  canConfirm ? (
                    <ConfirmItem periodId={periodId} check={item.check} instrument={item.instrument} dates={item.dates ?? []} />
                  ) : (
                    <p className="mt-1 text-ink-muted">Not confirmed yet: a risk analyst or the compliance officer confirms it.</p>
                  )
                ) : null}
              </td>
            </tr>
          ))}
        </SimpleTable>
      )}
      <p className="mt-4 text-xs text-ink-muted">
        Settings: at least {report.settings.minReturns} returns; gaps over {report.settings.maxGapBusinessDays} business days; {report.settings.staleDays}+ unchanged
        closes are stale; moves beyond {report.settings.extremeZ} robust standard deviations are listed; market value within {(report.settings.valueTolerance * 100).toFixed(1)} %.
      </p>
    </>
  );
}
