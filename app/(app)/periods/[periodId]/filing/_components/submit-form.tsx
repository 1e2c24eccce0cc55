"use client";

import { useForm } from "react-hook-form";
import type { z } from "zod";
import { zodResolver } from "@hookform/resolvers/zod";
import { Field, inputClass, primaryButtonClass } from "@/app/_components/field";
import { useSend } from "./use-send";
import { Alert } from "./alert";
import { submitFilingSchema, type SubmitFilingInput } from "@/lib/validation/filings";

/** Send the draft to the compliance head, with an optional answer to the review. */
export function SubmitForm({ filingId, resubmit, unexplained }: { filingId: string; resubmit: boolean; unexplained: number }) {
  const { send, error, pending } = useSend();
  const { register, handleSubmit } = useForm<z.input<typeof submitFilingSchema>, unknown, SubmitFilingInput>({ resolver: zodResolver(submitFilingSchema), defaultValues: { note: "" } });
  return (
    <form className="flex flex-col gap-3" onSubmit={handleSubmit((v) => send(`/api/filings/${filingId}/submit`, "POST", v))} noValidate>
      {unexplained > 0 ? (
        <p className="text-sm text-caution">
          {unexplained} backtest exception{unexplained === 1 ? " has" : "s have"} no explanation yet.
        </p>
      ) : null}
      <Field id="submit-note" label={resubmit ? "Your answer to the review (optional)" : "Note to the reviewer (optional)"} error={error?.fields.note}>
        <textarea id="submit-note" rows={2} className={inputClass} {...register("note")} />
      </Field>
      <button type="submit" className={primaryButtonClass} disabled={pending}>
        {pending ? "Sending…" : resubmit ? "Resubmit for review" : "Submit for review"}
      </button>
      <Alert message={error && !error.fields.note ? error.message : null} testId="submit-error" />
    </form>
  );
}
