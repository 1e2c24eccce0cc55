import { StatusBadge } from "@/app/_components/status-badge";
import { formatMonth, formatTimestamp } from "@/app/_components/format";
import type { ReminderLogEntry } from "@/lib/data/reminder-log";
import { SimpleTable } from "@/app/_components/simple-table";

const STATUS: Record<ReminderLogEntry["status"], { tone: "ok" | "caution" | "alert" | "neutral"; label: string }> = {
  sent: { tone: "ok", label: "Sent" },
  pending: { tone: "neutral", label: "Waiting" },
  retry: { tone: "caution", label: "Will retry" },
  failed: { tone: "alert", label: "Failed" },
  sending: { tone: "caution", label: "Unconfirmed" },
  skipped: { tone: "neutral", label: "Not needed" },
};

/** What the scheduler sent, what waits and what failed, with the mail server's answer. */
export function ReminderLog({ entries }: { entries: ReminderLogEntry[] }) {
  if (entries.length === 0) {
    return <p className="rounded-lg border border-dashed border-ink-line bg-paper-raised p-6 text-sm text-ink-soft">No reminder has been due yet.</p>;
  }
  const problems = entries.filter((e) => e.status === "failed" || e.status === "retry" || e.status === "sending");
  return (
    <>
      {problems.length ? (
        <p role="alert" className="mb-3 rounded-md border border-alert/30 bg-alert-bg px-3 py-2 text-sm text-alert">
          <span aria-hidden="true">! </span>
          {problems.length} reminder{problems.length === 1 ? " has" : "s have"} not been confirmed as sent. {problems[0].lastError ?? ""}
        </p>
      ) : null}
      <SimpleTable caption="Reminder delivery" testId="reminder-log" padding="px-4 py-2" columns={["To", "Period", "When", "Status", "Detail"]}>
        {entries.map((e) => {
          const s = STATUS[e.status];
          return (
            <tr key={e.id} className="border-t border-ink-line" data-testid="reminder-row">
              <td className="px-4 py-2">
                {e.name}
                <span className="block text-xs text-ink-muted">{e.email}</span>
              </td>
              <td className="px-4 py-2">{formatMonth(e.periodEnd)}</td>
              <td className="px-4 py-2">{e.offsetDays < 0 ? "Overdue" : `${e.offsetDays} business day${e.offsetDays === 1 ? "" : "s"} before`}</td>
              <td className="px-4 py-2">
                <StatusBadge tone={s.tone}>{s.label}</StatusBadge>
              </td>
              <td className="px-4 py-2 text-xs text-ink-soft">
                {e.status === "sent" && e.sentAt ? `Sent ${formatTimestamp(e.sentAt)}` : null}
                {e.status === "sending" ? "Sending started but was not confirmed (the scheduler stopped). It is not sent again automatically; check with the person." : null}
                {e.lastError && e.status !== "sent" ? <span className="block">{e.lastError}</span> : null}
                {e.status === "retry" && e.nextAttemptAt ? <span className="block">Next try after {formatTimestamp(e.nextAttemptAt)}</span> : null}
                {e.attempts > 1 ? <span className="block">{e.attempts} tries</span> : null}
              </td>
            </tr>
          );
        })}
      </SimpleTable>
    </>
  );
}
