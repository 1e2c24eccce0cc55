"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { Field, inputClass, primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { useSend } from "./use-send";
import { Alert } from "./alert";
import { newFilingVersionSchema, type NewFilingVersionInput } from "@/lib/validation/filings";

/** A change after signing: a new version with the reason; the signature of this version is superseded. */
export function NewVersionForm({ filingId, version }: { filingId: string; version: number }) {
  const { send, error, pending } = useSend();
  const [open, setOpen] = useState(false);
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<NewFilingVersionInput>({ resolver: zodResolver(newFilingVersionSchema), defaultValues: { reason: "" } });
  if (!open) {
    return (
      <button type="button" className={secondaryButtonClass} onClick={() => setOpen(true)}>
        Change the signed filing…
      </button>
    );
  }
  return (
    <form className="flex flex-col gap-3" onSubmit={handleSubmit((v) => send(`/api/filings/${filingId}/versions`, "POST", v))} noValidate>
      <p className="text-sm text-ink-soft">
        Version {version} stays as signed. The change is made in version {version + 1}, a new draft that goes through review and sign-off again; the signature on version {version} is
        marked superseded and stays visible.
      </p>
      <Field id="new-version-reason" label="Why does the signed version need to change?" error={errors.reason?.message ?? error?.fields.reason}>
        <textarea id="new-version-reason" rows={3} className={inputClass} {...register("reason")} />
      </Field>
      <div className="flex gap-3">
        <button type="submit" className={primaryButtonClass} disabled={pending}>
          {pending ? "Starting…" : `Start version ${version + 1}`}
        </button>
        <button type="button" className={secondaryButtonClass} onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
      <Alert message={error && !Object.keys(error.fields).length ? error.message : null} />
    </form>
  );
}
