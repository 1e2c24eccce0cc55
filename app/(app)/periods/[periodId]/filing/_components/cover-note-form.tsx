"use client";

import { useState } from "react";
import { Field, inputClass, secondaryButtonClass } from "@/app/_components/field";
import { useSend } from "./use-send";
import { Alert } from "./alert";

/** The compliance officer's cover note. */
export function CoverNoteForm({ filingId, coverNote }: { filingId: string; coverNote: string }) {
  const { send, error, pending } = useSend();
  const [value, setValue] = useState(coverNote);
  const [saved, setSaved] = useState(false);
  return (
    <form
      className="mt-4 flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-raised p-4"
      onSubmit={async (e) => {
        e.preventDefault();
        setSaved(await send(`/api/filings/${filingId}`, "PATCH", { coverNote: value }));
      }}
    >
      <Field id="cover-note" label="Cover note" hint="Free text at the front of the filing: what the reader should know first." error={error?.fields.coverNote}>
        <textarea id="cover-note" rows={5} className={inputClass} value={value} onChange={(e) => (setValue(e.target.value), setSaved(false))} aria-invalid={Boolean(error?.fields.coverNote)} />
      </Field>
      <div className="flex items-center gap-3">
        <button type="submit" className={secondaryButtonClass} disabled={pending || value === coverNote}>
          {pending ? "Saving…" : "Save cover note"}
        </button>
        {saved ? <span className="text-sm text-ok" role="status">Saved.</span> : null}
      </div>
      {error && !error.fields.coverNote ? <Alert message={error.message} /> : null}
    </form>
  );
}
