import type { Metadata } from "next";
import { pageActor } from "@/lib/auth/page";
import { Contributions } from "./contributions";

export const metadata: Metadata = { title: "Contributions" };

export default async function RunContributionsPage({ params }: { params: Promise<{ periodId: string; runId: string }> }) {
  const { runId } = await params;
  await pageActor("periods.read");
  return <Contributions runId={runId} />;
}
