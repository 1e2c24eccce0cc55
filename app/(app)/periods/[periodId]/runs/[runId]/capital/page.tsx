import type { Metadata } from "next";
import { pageActor } from "@/lib/auth/page";
import { CapitalView } from "./capital-view";

export const metadata: Metadata = { title: "Capital" };

/** A run's capital: the filed figure, the other beside it, and the standardised building blocks line by line. */
export default async function RunCapitalPage({ params }: { params: Promise<{ periodId: string; runId: string }> }) {
  const { runId } = await params;
  await pageActor("periods.read");
  return <CapitalView runId={runId} />;
}
