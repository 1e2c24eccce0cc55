"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { apiFetch, ApiError } from "@/app/_components/api";
import { Field, inputClass, primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import type { MethodVersion } from "@/lib/data/method";

/** Start a new draft: from the approved version with a reason, or from the defaults when none is approved. */
export function NewVersionButton({ currentVersion }: { currentVersion: number | null }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState("");
  const [error, setError] = useState<{ message: string; field?: string } | null>(null);
  const [pending, setPending] = useState(false);

  async function start() {
    setPending(true);
    setError(null);
    try {
      const { version } = await apiFetch<{ version: MethodVersion }>("/api/method", { method: "POST", body: { reason } });
      router.push(`/method/${version.id}`);
    } catch (e) {
      setError({ message: e instanceof Error ? e.message : "Could not start a new version.", field: e instanceof ApiError ? e.fields?.reason : undefined });
      setPending(false);
    }
  }

  if (currentVersion === null) {
    return (
      <div className="flex flex-col items-end gap-1">
        <button type="button" className={primaryButtonClass} onClick={start} disabled={pending}>
          {pending ? "Starting…" : "Start a new version"}
        </button>
        {error ? <p role="alert" className="text-sm text-alert">{error.message}</p> : null}
      </div>
    );
  }
  if (!open) {
    return (
      <button type="button" className={primaryButtonClass} onClick={() => setOpen(true)}>
        Start a new version
      </button>
    );
  }
  return (
    <form
      className="flex w-[28rem] max-w-full flex-col gap-3 rounded-lg border border-ink-line bg-paper-raised p-4"
      onSubmit={(e) => {
        e.preventDefault();
        void start();
      }}
    >
      <Field id="new-version-reason" label={`Why does version ${currentVersion} need to change?`} hint="Kept with the new version and in the audit trail." error={error?.field}>
        <textarea
          id="new-version-reason"
          rows={3}
          className={inputClass}
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          aria-invalid={Boolean(error?.field)}
          aria-describedby={error?.field ? "new-version-reason-error" : "new-version-reason-hint"}
          autoFocus
        />
      </Field>
      {error && !error.field ? <p role="alert" className="text-sm text-alert">{error.message}</p> : null}
      <div className="flex justify-end gap-2">
        <button type="button" className={secondaryButtonClass} onClick={() => setOpen(false)} disabled={pending}>
          Cancel
        </button>
        <button type="submit" className={primaryButtonClass} disabled={pending}>
          {pending ? "Starting…" : "Start the draft"}
        </button>
      </div>
    </form>
  );
}
