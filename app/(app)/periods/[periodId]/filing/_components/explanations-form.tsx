"use client";

import { useState } from "react";
import { Field, inputClass, secondaryButtonClass } from "@/app/_components/field";
import { useSend } from "./use-send";
import { Alert } from "./alert";

/** One explanation per backtest exception. */
export function ExplanationsForm({ filingId, exceptions }: { filingId: string; exceptions: { date: string; label: string; explanation: string }[] }) {
  const { send, error, pending } = useSend();
  const initial = Object.fromEntries(exceptions.map((e) => [e.date, e.explanation]));
  const [values, setValues] = useState<Record<string, string>>(initial);
  const [saved, setSaved] = useState(false);
  const changed = Object.fromEntries(Object.entries(values).filter(([d, t]) => t !== initial[d]));
  if (!exceptions.length) return null;
  return (
    <form
      className="mt-4 flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-raised p-4"
      aria-labelledby="explanations-heading"
      onSubmit={async (e) => {
        e.preventDefault();
        setSaved(await send(`/api/filings/${filingId}`, "PATCH", { explanations: changed }));
      }}
    >
      <h4 id="explanations-heading" className="font-medium">
        Explain each exception
      </h4>
      {exceptions.map((x) => (
        <Field key={x.date} id={`explanation-${x.date}`} label={`Exception of ${x.label}`} error={error?.fields[`explanations.${x.date}`]}>
          <textarea
            id={`explanation-${x.date}`}
            rows={2}
            className={inputClass}
            value={values[x.date] ?? ""}
            onChange={(e) => (setValues({ ...values, [x.date]: e.target.value }), setSaved(false))}
          />
        </Field>
      ))}
      <div className="flex items-center gap-3">
        <button type="submit" className={secondaryButtonClass} disabled={pending || Object.keys(changed).length === 0}>
          {pending ? "Saving…" : "Save explanations"}
        </button>
        {saved ? <span className="text-sm text-ok" role="status">Saved.</span> : null}
      </div>
      {error && !Object.keys(error.fields).length ? <Alert message={error.message} /> : null}
    </form>
  );
}
