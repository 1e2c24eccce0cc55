"use client";

import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { Field, inputClass, primaryButtonClass } from "@/app/_components/field";
import { useSend } from "./use-send";
import { Alert } from "./alert";
import { markFiledSchema, type MarkFiledInput } from "@/lib/validation/filings";

/** Record the filing with the regulator: the date and the regulator's reference. */
export function MarkFiledForm({ filingId, today }: { filingId: string; today: string }) {
  const { send, error, pending } = useSend();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<MarkFiledInput>({ resolver: zodResolver(markFiledSchema), defaultValues: { filedOn: today, reference: "" } });
  return (
    <form className="flex flex-col gap-3" onSubmit={handleSubmit((v) => send(`/api/filings/${filingId}/filed`, "POST", v))} noValidate>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field id="filed-on" label="Filed on" error={errors.filedOn?.message ?? error?.fields.filedOn}>
          <input id="filed-on" type="date" max={today} className={inputClass} {...register("filedOn")} />
        </Field>
        <Field id="filed-reference" label="Regulator's reference" error={errors.reference?.message ?? error?.fields.reference}>
          <input id="filed-reference" className={inputClass} {...register("reference")} />
        </Field>
      </div>
      <button type="submit" className={primaryButtonClass} disabled={pending}>
        {pending ? "Recording…" : "Record as filed"}
      </button>
      <Alert message={error && !Object.keys(error.fields).length ? error.message : null} />
    </form>
  );
}
