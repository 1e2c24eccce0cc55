"use client";

import { useForm } from "react-hook-form";
import type { z } from "zod";
import { zodResolver } from "@hookform/resolvers/zod";
import { Field, inputClass, secondaryButtonClass, SelectOptions } from "@/app/_components/field";
import { useSend } from "./use-send";
import { Alert } from "./alert";
import { FILING_SECTIONS, requestChangesSchema, type RequestChangesInput } from "@/lib/validation/filings";

/** Send the version back to the compliance officer with the reason. */
export function RequestChangesForm({ filingId }: { filingId: string }) {
  const { send, error, pending } = useSend();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<z.input<typeof requestChangesSchema>, unknown, RequestChangesInput>({ resolver: zodResolver(requestChangesSchema), defaultValues: { section: "general", reason: "" } });
  return (
    <form className="flex flex-col gap-3" onSubmit={handleSubmit((v) => send(`/api/filings/${filingId}/request-changes`, "POST", v))} noValidate>
      <Field id="changes-section" label="About" error={errors.section?.message ?? error?.fields.section}>
        <select id="changes-section" className={inputClass} {...register("section")}>
          <SelectOptions options={FILING_SECTIONS.map((s) => [s.id, s.label])} />
        </select>
      </Field>
      <Field id="changes-reason" label="What needs to change" error={errors.reason?.message ?? error?.fields.reason}>
        <textarea id="changes-reason" rows={3} className={inputClass} aria-invalid={Boolean(errors.reason)} {...register("reason")} />
      </Field>
      <button type="submit" className={secondaryButtonClass} disabled={pending}>
        {pending ? "Sending…" : "Request changes"}
      </button>
      <Alert message={error && !Object.keys(error.fields).length ? error.message : null} testId="request-changes-error" />
    </form>
  );
}
