"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { apiFetch, ApiError } from "@/app/_components/api";
import { inputClass, primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { StatusBadge } from "@/app/_components/status-badge";

type Confirmation = { by: string; at: string; reason: string };

/** Confirm one finding that asks for it: a reason, then who and when are recorded (audited). */
export function ConfirmItem({ periodId, check, instrument, dates }: { periodId: string; check: string; instrument: string; dates: string[] }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState<Confirmation | null>(null);
  const id = `confirm-${instrument}-${check}`.replace(/[^A-Za-z0-9_-]/g, "-");

  async function submit(event: React.FormEvent) {
    event.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const { confirmation } = await apiFetch<{ confirmation: Confirmation }>(`/api/periods/${periodId}/data-quality/confirmations`, { method: "POST", body: { check, instrument, dates, reason } });
      // the server's record of it, shown at once; the refreshed page then shows the same from the report
      setDone(confirmation);
      setOpen(false);
      router.refresh();
    } catch (e) {
      setError(e instanceof ApiError && e.fields?.reason ? e.fields.reason : e instanceof Error ? e.message : "Could not confirm.");
    } finally {
      setBusy(false);
    }
  }

  if (done) {
    return (
      <p className="mt-1 text-ink-soft" data-testid="quality-confirmation">
        <StatusBadge tone="ok">Confirmed</StatusBadge> by {done.by} on {done.at.slice(0, 16).replace("T", " ")} UTC: {done.reason}
      </p>
    );
  }
  if (!open) {
    return (
      <div className="mt-2">
        <button type="button" className={`${secondaryButtonClass} px-3 py-1 text-sm`} onClick={() => setOpen(true)}>
          Confirm…
        </button>
      </div>
    );
  }
  return (
    <form onSubmit={submit} className="mt-2 flex flex-col gap-2" aria-label={`Confirm the finding for ${instrument}`}>
      <label htmlFor={id} className="text-sm font-medium">
        Why these moves are real (recorded with your name and the time)
      </label>
      <textarea
        id={id}
        rows={2}
        autoFocus
        className={inputClass}
        value={reason}
        onChange={(e) => setReason(e.target.value)}
        aria-invalid={Boolean(error)}
        aria-describedby={error ? `${id}-error` : undefined}
      />
      {error ? (
        <p id={`${id}-error`} role="alert" className="text-sm text-alert">
          {error}
        </p>
      ) : null}
      <div className="flex gap-2">
        <button type="submit" className={`${primaryButtonClass} px-3 py-1 text-sm`} disabled={busy}>
          {busy ? "Confirming…" : "Confirm finding"}
        </button>
        <button type="button" className={`${secondaryButtonClass} px-3 py-1 text-sm`} onClick={() => setOpen(false)} disabled={busy}>
          Cancel
        </button>
      </div>
    </form>
  );
}
