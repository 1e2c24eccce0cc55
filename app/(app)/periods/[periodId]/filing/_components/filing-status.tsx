import { StatusBadge } from "@/app/_components/status-badge";

export type FilingState = "draft" | "in_review" | "changes_requested" | "signed" | "filed" | "superseded";

export const FILING_STATE_LABELS: Record<FilingState, string> = {
  draft: "Draft",
  in_review: "In review",
  changes_requested: "Changes requested",
  signed: "Signed",
  filed: "Filed",
  superseded: "Superseded",
};

/** A filing version's state in words with an icon (never colour alone). */
export function FilingStatus({ status }: { status: FilingState }) {
  const tone = status === "signed" || status === "filed" ? "ok" : status === "changes_requested" ? "alert" : status === "superseded" ? "neutral" : "caution";
  return (
    <span data-testid="filing-status">
      <StatusBadge tone={tone}>{FILING_STATE_LABELS[status]}</StatusBadge>
    </span>
  );
}
