import { StatusBadge } from "@/app/_components/status-badge";
import type { MethodStatus } from "@/lib/data/method";

/** A version's status in words with an icon. */
export function VersionStatus({ status, awaitingCoApproval }: { status: MethodStatus; awaitingCoApproval: boolean }) {
  if (status === "approved") return <StatusBadge tone="ok">Approved</StatusBadge>;
  if (status === "draft" && awaitingCoApproval) return <StatusBadge tone="caution">Awaiting co-approval</StatusBadge>;
  if (status === "draft") return <StatusBadge tone="caution">Draft</StatusBadge>;
  if (status === "superseded") return <StatusBadge tone="neutral">Superseded</StatusBadge>;
  return <StatusBadge tone="neutral">Discarded</StatusBadge>;
}
