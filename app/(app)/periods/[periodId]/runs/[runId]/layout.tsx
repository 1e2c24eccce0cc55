import { BackLink } from "@/app/_components/back-link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/app/_components/page-header";
import { QueryProvider } from "@/app/_components/query-provider";
import { formatMonth, formatTimestamp } from "@/app/_components/format";
import { orNotFound, pageActor } from "@/lib/auth/page";
import { getPeriod } from "@/lib/data/periods";
import { listRuns } from "@/lib/data/runs";
import { RunTabs } from "../_components/run-tabs";
import { StaleRunBadge, StaleRunNotice } from "../_components/stale-run";

/** The frame of one run's pages: where it belongs, when it started, and the tabs. */
export default async function RunLayout({ children, params }: { children: React.ReactNode; params: Promise<{ periodId: string; runId: string }> }) {
  const { periodId, runId } = await params;
  const { actor } = await pageActor("periods.read");
  const period = await orNotFound(getPeriod(actor, periodId));
  const run = (await orNotFound(listRuns(actor, periodId))).find((r) => r.id === runId);
  if (!run) notFound();
  const base = `/periods/${periodId}/runs/${runId}`;
  return (
    <>
      <BackLink href={`/periods/${periodId}/runs`}>Runs of {formatMonth(period.periodEnd)}</BackLink>
      <PageHeader
        title={`Run of ${formatTimestamp(run.startedAt)}`}
        lead={
          <>
            {formatMonth(period.periodEnd)} · started by {run.startedByName}
            {run.methodVersion ? ` · method statement version ${run.methodVersion.version}` : ""}
            {run.reproducesRunId ? " · a reproduction of an earlier run from its stored inputs" : ""}
          </>
        }
        actions={<StaleRunBadge freshness={run.freshness} />}
      />
      <StaleRunNotice freshness={run.freshness} />
      <RunTabs base={base} />
      <QueryProvider>{children}</QueryProvider>
    </>
  );
}
