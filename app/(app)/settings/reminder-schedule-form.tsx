"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { apiFetch, ApiError } from "@/app/_components/api";
import { Field, inputClass, primaryButtonClass } from "@/app/_components/field";
import { parseOffsetList, reminderSettingsSchema } from "@/lib/calendar/validation";
import { fieldMessages } from "./field-messages";
import type { ReminderSettings } from "@/lib/calendar/settings";

/** The reminder schedule: business days before the deadline, the overdue notice, and automatic opening. */
export function ReminderScheduleForm({ initial }: { initial: ReminderSettings }) {
  const router = useRouter();
  const [offsets, setOffsets] = useState(initial.reminderOffsets.join(", "));
  const [remindOverdue, setRemindOverdue] = useState(initial.remindOverdue);
  const [autoOpenPeriods, setAutoOpenPeriods] = useState(initial.autoOpenPeriods);
  const [error, setError] = useState<string | null>(null);
  const [status, setStatus] = useState<{ tone: "ok" | "alert"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function onSubmit(event: React.FormEvent) {
    event.preventDefault();
    setStatus(null);
    setError(null);
    const input = { reminderOffsets: parseOffsetList(offsets), remindOverdue, autoOpenPeriods };
    const parsed = reminderSettingsSchema.safeParse(input);
    if (!parsed.success) {
      setError(fieldMessages(parsed.error.issues, "reminderOffsets"));
      return;
    }
    setBusy(true);
    try {
      const saved = await apiFetch<ReminderSettings>("/api/calendar/settings", { method: "PUT", body: parsed.data });
      setOffsets(saved.reminderOffsets.join(", "));
      setStatus({ tone: "ok", text: "Reminder schedule saved." });
      router.refresh();
    } catch (e) {
      if (e instanceof ApiError && e.fields) setError(Object.values(e.fields)[0] ?? e.message);
      setStatus({ tone: "alert", text: e instanceof Error ? e.message : "Could not save." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4 rounded-lg border border-ink-line bg-paper-raised p-5">
      <Field
        id="reminderOffsets"
        label="Reminders before the deadline"
        hint="Business days before it, whole numbers from 1 to 60 separated by commas, e.g. 10, 5, 2, 1. Leave empty for none."
        error={error ?? undefined}
      >
        <input
          id="reminderOffsets"
          className={inputClass}
          value={offsets}
          onChange={(e) => setOffsets(e.target.value)}
          aria-invalid={Boolean(error)}
          aria-describedby={error ? "reminderOffsets-error" : "reminderOffsets-hint"}
        />
      </Field>
      <label className="flex items-start gap-2 text-sm">
        <input type="checkbox" className="mt-1" checked={remindOverdue} onChange={(e) => setRemindOverdue(e.target.checked)} />
        <span>Send an overdue notice the first day a deadline has passed (to every owner of the step, even those who turned reminders off).</span>
      </label>
      <label className="flex items-start gap-2 text-sm">
        <input type="checkbox" className="mt-1" checked={autoOpenPeriods} onChange={(e) => setAutoOpenPeriods(e.target.checked)} />
        <span>Open each month&apos;s reporting period automatically at month end.</span>
      </label>
      <div className="flex items-center gap-3">
        <button type="submit" className={primaryButtonClass} disabled={busy}>
          {busy ? "Saving…" : "Save reminder schedule"}
        </button>
        {status ? (
          <p role="status" className={`text-sm ${status.tone === "ok" ? "text-ok" : "text-alert"}`}>
            {status.text}
          </p>
        ) : null}
      </div>
    </form>
  );
}
