import type { Metadata } from "next";
import { pageActor } from "@/lib/auth/page";
import { BacktestView } from "./backtest-view";

export const metadata: Metadata = { title: "Backtest" };

export default async function RunBacktestPage({ params }: { params: Promise<{ periodId: string; runId: string }> }) {
  const { runId } = await params;
  await pageActor("periods.read");
  return <BacktestView runId={runId} />;
}
