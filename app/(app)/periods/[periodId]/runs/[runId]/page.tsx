import type { Metadata } from "next";
import { pageActor } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { getPeriod } from "@/lib/data/periods";
import { RunSummary } from "./run-summary";

export const metadata: Metadata = { title: "Run summary" };

export default async function RunSummaryPage({ params }: { params: Promise<{ periodId: string; runId: string }> }) {
  const { periodId, runId } = await params;
  const { actor } = await pageActor("periods.read");
  const period = await getPeriod(actor, periodId);
  const locked = period.state === "signed" || period.state === "filed";
  // a reproduction only adds a run that checks an earlier one, so it stays open after sign-off; choosing the filing run does not
  return <RunSummary periodId={periodId} runId={runId} canReproduce={can(actor, "run.start")} canChooseForFiling={can(actor, "run.start") && !locked} />;
}
