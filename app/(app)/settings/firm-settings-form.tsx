"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { firmSettingsSchema, REPORTING_CURRENCIES, type FirmSettingsInput } from "@/lib/validation/firm";
import { apiFetch, ApiError } from "@/app/_components/api";
import { Field, inputClass, primaryButtonClass } from "@/app/_components/field";
import type { FirmSettings } from "@/lib/data/firm";

export function FirmSettingsForm({ initial, editable }: { initial: FirmSettings; editable: boolean }) {
  const router = useRouter();
  const [status, setStatus] = useState<{ tone: "ok" | "alert"; text: string } | null>(null);
  const {
    register,
    handleSubmit,
    control,
    setError,
    formState: { errors, isSubmitting, isDirty },
    reset,
  } = useForm<FirmSettingsInput>({
    resolver: zodResolver(firmSettingsSchema) as never,
    defaultValues: {
      name: initial.name,
      reportingCurrency: initial.reportingCurrency as FirmSettingsInput["reportingCurrency"],
      regulatorName: initial.regulatorName,
      licenceLabel: initial.licenceLabel,
      methodCoApproval: initial.methodCoApproval,
      methodSingleApprovalReason: initial.methodSingleApprovalReason,
      deadlineRule: initial.deadlineRule,
      deadlineValue: initial.deadlineValue,
    },
  });
  const rule = useWatch({ control, name: "deadlineRule" });
  const coApproval = useWatch({ control, name: "methodCoApproval" });

  const onSubmit = handleSubmit(async (values) => {
    setStatus(null);
    try {
      const saved = await apiFetch<FirmSettings>("/api/firm", { method: "PATCH", body: values });
      reset({ ...values, name: saved.name });
      setStatus({ tone: "ok", text: "Settings saved." });
      router.refresh();
    } catch (error) {
      if (error instanceof ApiError && error.fields) {
        for (const [field, message] of Object.entries(error.fields)) setError(field as keyof FirmSettingsInput, { message });
      }
      setStatus({ tone: "alert", text: error instanceof Error ? error.message : "Could not save." });
    }
  });

  const err = (name: keyof FirmSettingsInput) => ({
    "aria-invalid": Boolean(errors[name]),
    "aria-describedby": errors[name] ? `${name}-error` : undefined,
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4 rounded-lg border border-ink-line bg-paper-raised p-5">
      <fieldset disabled={!editable} className="flex flex-col gap-4">
        <Field id="name" label="Firm name" error={errors.name?.message}>
          <input id="name" className={inputClass} {...err("name")} {...register("name")} />
        </Field>
        <Field id="reportingCurrency" label="Reporting currency" error={errors.reportingCurrency?.message}>
          <select id="reportingCurrency" className={inputClass} {...err("reportingCurrency")} {...register("reportingCurrency")}>
            {REPORTING_CURRENCIES.map((c) => (
              <option key={c}>{c}</option>
            ))}
          </select>
        </Field>
        <Field id="regulatorName" label="Regulator" hint="As you name it in correspondence; free text." error={errors.regulatorName?.message}>
          <input id="regulatorName" className={inputClass} {...err("regulatorName")} {...register("regulatorName")} />
        </Field>
        <Field id="licenceLabel" label="Signer's reference is called" hint="Shown beside the signature, e.g. “Registration no.”" error={errors.licenceLabel?.message}>
          <input id="licenceLabel" className={inputClass} {...err("licenceLabel")} {...register("licenceLabel")} />
        </Field>
        <div className="grid gap-4 2xl:grid-cols-2">
          <Field id="deadlineRule" label="Filing deadline rule" error={errors.deadlineRule?.message}>
            <select id="deadlineRule" className={inputClass} {...err("deadlineRule")} {...register("deadlineRule")}>
              <option value="business-days-after">Business days after period end</option>
              <option value="fixed-day-next-month">Fixed day of the next month</option>
            </select>
          </Field>
          <Field
            id="deadlineValue"
            label={rule === "fixed-day-next-month" ? "Day of the month" : "Business days"}
            hint={rule === "fixed-day-next-month" ? "Moved to the next business day when it falls on a weekend or holiday." : "Weekends and the firm's holidays are skipped."}
            error={errors.deadlineValue?.message}
          >
            <input id="deadlineValue" type="number" inputMode="numeric" min={1} max={60} className={inputClass} {...err("deadlineValue")} {...register("deadlineValue")} />
          </Field>
        </div>
        <label className="flex items-start gap-2 text-sm">
          <input type="checkbox" className="mt-1" {...register("methodCoApproval")} />
          <span>A compliance head must co-approve each method statement version (recommended: a second person checks every method change).</span>
        </label>
        {!coApproval ? (
          <Field
            id="methodSingleApprovalReason"
            label="Why one person may approve the method statement"
            hint="Recorded in the audit trail and shown beside each one-person approval."
            error={errors.methodSingleApprovalReason?.message}
          >
            <textarea id="methodSingleApprovalReason" rows={2} className={inputClass} {...err("methodSingleApprovalReason")} {...register("methodSingleApprovalReason")} />
          </Field>
        ) : null}
      </fieldset>
      {editable ? (
        <div className="flex items-center gap-3">
          <button type="submit" className={primaryButtonClass} disabled={isSubmitting || !isDirty}>
            {isSubmitting ? "Saving…" : "Save settings"}
          </button>
          {status ? (
            <p role="status" className={`text-sm ${status.tone === "ok" ? "text-ok" : "text-alert"}`}>
              {status.text}
            </p>
          ) : null}
        </div>
      ) : null}
    </form>
  );
}
