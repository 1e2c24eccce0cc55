import type { Metadata } from "next";
import { pageActor } from "@/lib/auth/page";
import { FactorsTable } from "./factors-table";

export const metadata: Metadata = { title: "Risk factors" };

export default async function RunFactorsPage({ params }: { params: Promise<{ periodId: string; runId: string }> }) {
  const { runId } = await params;
  await pageActor("periods.read");
  return <FactorsTable runId={runId} />;
}
