import { StatusBadge } from "./status-badge";

/** Business days left to a deadline, in words, with a tone that also reads without colour. */
export function DeadlineBadge({ businessDaysLeft, overdue, done }: { businessDaysLeft: number; overdue: boolean; done: boolean }) {
  if (done) return <StatusBadge tone="ok">Filed</StatusBadge>;
  if (overdue) return <StatusBadge tone="alert">Overdue by {Math.abs(businessDaysLeft)} business day{Math.abs(businessDaysLeft) === 1 ? "" : "s"}</StatusBadge>;
  if (businessDaysLeft <= 0) return <StatusBadge tone="alert">Due today</StatusBadge>;
  const tone = businessDaysLeft <= 5 ? "caution" : "neutral";
  return (
    <StatusBadge tone={tone}>
      {businessDaysLeft} business day{businessDaysLeft === 1 ? "" : "s"} left
    </StatusBadge>
  );
}
