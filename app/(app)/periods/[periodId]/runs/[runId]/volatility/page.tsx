import type { Metadata } from "next";
import { pageActor } from "@/lib/auth/page";
import { VolatilityView } from "./volatility-view";

export const metadata: Metadata = { title: "Volatility" };

export default async function RunVolatilityPage({ params, searchParams }: { params: Promise<{ periodId: string; runId: string }>; searchParams: Promise<{ factor?: string }> }) {
  const { runId } = await params;
  const { factor } = await searchParams;
  await pageActor("periods.read");
  return <VolatilityView runId={runId} initialFactor={factor ?? null} />;
}
