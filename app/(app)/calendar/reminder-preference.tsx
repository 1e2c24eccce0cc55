"use client";

import { useState } from "react";
import { apiFetch } from "@/app/_components/api";

/** A person's own choice: reminder e-mails on or off (the overdue notice always arrives). */
export function ReminderPreference({ initial }: { initial: boolean }) {
  const [enabled, setEnabled] = useState(initial);
  const [status, setStatus] = useState<{ tone: "ok" | "alert"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function change(next: boolean) {
    // Show the choice at once; put it back if the server refuses it.
    setEnabled(next);
    setBusy(true);
    setStatus(null);
    try {
      const saved = await apiFetch<{ remindersEnabled: boolean }>("/api/calendar/preferences", { method: "PUT", body: { remindersEnabled: next } });
      setEnabled(saved.remindersEnabled);
      setStatus({ tone: "ok", text: saved.remindersEnabled ? "You will receive reminders." : "Reminders are off for you; overdue notices still arrive." });
    } catch (error) {
      setEnabled(!next);
      setStatus({ tone: "alert", text: error instanceof Error ? error.message : "Could not save." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="mt-4 border-t border-ink-line pt-4">
      <label className="flex items-start gap-2">
        <input type="checkbox" className="mt-1" checked={enabled} disabled={busy} onChange={(e) => change(e.target.checked)} />
        <span>
          Send me reminder e-mails for steps I own
          <span className="block text-xs text-ink-muted">The overdue notice is sent to every owner of the step, whatever this says.</span>
        </span>
      </label>
      {status ? (
        <p role="status" className={`mt-2 text-sm ${status.tone === "ok" ? "text-ok" : "text-alert"}`}>
          {status.text}
        </p>
      ) : null}
    </div>
  );
}
