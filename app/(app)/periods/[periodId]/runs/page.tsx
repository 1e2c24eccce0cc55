import type { Metadata } from "next";
import { BackLink } from "@/app/_components/back-link";
import { PageHeader } from "@/app/_components/page-header";
import { QueryProvider } from "@/app/_components/query-provider";
import { formatDate, formatMonth } from "@/app/_components/format";
import { orNotFound, pageActor } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { getPeriod } from "@/lib/data/periods";
import { RunsPanel } from "./runs-panel";

export const metadata: Metadata = { title: "Runs" };

export default async function RunsPage({ params }: { params: Promise<{ periodId: string }> }) {
  const { periodId } = await params;
  const { actor } = await pageActor("periods.read");
  const period = await orNotFound(getPeriod(actor, periodId));
  const locked = period.state === "signed" || period.state === "filed";
  return (
    <>
      <BackLink href={`/periods/${period.id}`}>{formatMonth(period.periodEnd)}</BackLink>
      <PageHeader
        title={`Runs: ${formatMonth(period.periodEnd)}`}
        lead={
          <>
            Each run computes every figure of the period ending {formatDate(period.periodEnd)} from the confirmed positions, the price history up to that date, the approved method statement and the
            firm&apos;s capital rule profile, and keeps those inputs so it can be reproduced. A run is never edited: running again makes a new run.
          </>
        }
      />
      <QueryProvider>
        <RunsPanel periodId={period.id} currency={actor.reportingCurrency} canStart={can(actor, "run.start") && !locked} locked={locked} />
      </QueryProvider>
    </>
  );
}
