import type { Metadata } from "next";
import { pageActor } from "@/lib/auth/page";
import { ChangeView } from "./change-view";

export const metadata: Metadata = { title: "Change since last period" };

export default async function RunChangePage({ params }: { params: Promise<{ periodId: string; runId: string }> }) {
  const { runId } = await params;
  await pageActor("periods.read");
  return <ChangeView runId={runId} />;
}
