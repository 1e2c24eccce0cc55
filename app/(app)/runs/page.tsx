import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/app/_components/page-header";
import { StatusBadge } from "@/app/_components/status-badge";
import { formatDate, formatMonth, formatTimestamp } from "@/app/_components/format";
import { pageActor } from "@/lib/auth/page";
import { listPeriods } from "@/lib/data/periods";
import { listRuns } from "@/lib/data/runs";
import { StaleRunBadge } from "../periods/[periodId]/runs/_components/stale-run";

export const metadata: Metadata = { title: "Runs" };

/** Every period's runs at a glance: the latest run and the one the filing uses; the open periods first. */
export default async function AllRunsPage() {
  const { actor } = await pageActor("periods.read");
  const periods = await listPeriods(actor);
  const rows = await Promise.all(periods.map(async (p) => ({ period: p, runs: await listRuns(actor, p.id) })));
  return (
    <>
      <PageHeader title="Runs" lead="Each reporting period's runs: the latest and the one its filing uses. Open a period to start a run or read its figures." />
      {rows.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-line bg-paper-raised p-6 text-center text-sm text-ink-soft">No reporting period is open yet.</p>
      ) : (
        <ul className="divide-y divide-ink-line rounded-lg border border-ink-line bg-paper-raised" aria-label="Periods and their runs">
          {rows.map(({ period, runs }) => {
            const latest = runs[0];
            const filing = runs.find((r) => r.isFilingRun);
            return (
              <li key={period.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3">
                <div>
                  <Link href={`/periods/${period.id}/runs`} className="font-medium underline" data-testid="period-runs-link">
                    {formatMonth(period.periodEnd)}
                  </Link>
                  <p className="text-sm text-ink-muted">
                    Period ending {formatDate(period.periodEnd)} · {period.state === "open" ? "open" : period.state} · {runs.length} run{runs.length === 1 ? "" : "s"}
                  </p>
                </div>
                <div className="flex flex-wrap items-center gap-2 text-sm">
                  {latest ? (
                    <span className="text-ink-soft">
                      Latest {formatTimestamp(latest.startedAt)}:{" "}
                      {latest.status === "completed" ? (
                        <StatusBadge tone="ok">Completed</StatusBadge>
                      ) : latest.status === "failed" ? (
                        <StatusBadge tone="alert">Failed</StatusBadge>
                      ) : (
                        <StatusBadge tone="caution">In progress</StatusBadge>
                      )}
                    </span>
                  ) : (
                    <span className="text-ink-muted">No run yet</span>
                  )}
                  {filing ? <StatusBadge tone="ok">Filing run chosen</StatusBadge> : null}
                  {filing?.freshness?.stale ? (
                    <>
                      <span className="text-ink-soft">the filing run is</span> <StaleRunBadge freshness={filing.freshness} />
                    </>
                  ) : latest ? (
                    <StaleRunBadge freshness={latest.freshness} />
                  ) : null}
                </div>
              </li>
            );
          })}
        </ul>
      )}
    </>
  );
}
