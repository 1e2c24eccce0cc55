"use client";

import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { firmSettingsSchema, REPORTING_CURRENCIES, type FirmSettingsInput } from "@/lib/validation/firm";
import { apiFetch } from "@/app/_components/api";
import { TextField, NumberField, SelectField, TextAreaField, CheckboxField } from "@/app/_components/form/fields";
import type { FirmSettings } from "@/lib/data/firm";
import { SaveButton, SaveStatusLine, useSettingsSave } from "./save-status";

export function FirmSettingsForm({ initial, editable }: { initial: FirmSettings; editable: boolean }) {
  const form = useForm<FirmSettingsInput>({
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
  const {
    control,
    formState: { isSubmitting, isDirty },
    reset,
  } = form;
  const rule = useWatch({ control, name: "deadlineRule" });
  const coApproval = useWatch({ control, name: "methodCoApproval" });

  const { status, onSubmit } = useSettingsSave(form, async (values) => {
    const saved = await apiFetch<FirmSettings>("/api/firm", { method: "PATCH", body: values });
    reset({ ...values, name: saved.name });
    return "Settings saved.";
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4 rounded-lg border border-ink-line bg-paper-raised p-5">
      <fieldset disabled={!editable} className="flex flex-col gap-4">
        <TextField form={form} name="name" label="Firm name" />
        <SelectField form={form} name="reportingCurrency" label="Reporting currency">
          {REPORTING_CURRENCIES.map((c) => (
            <option key={c}>{c}</option>
          ))}
        </SelectField>
        <TextField form={form} name="regulatorName" label="Regulator" hint="As you name it in correspondence; free text." />
        <TextField form={form} name="licenceLabel" label="Signer's reference is called" hint="Shown beside the signature, e.g. “Registration no.”" />
        <div className="grid gap-4 2xl:grid-cols-2">
          <SelectField form={form} name="deadlineRule" label="Filing deadline rule">
            <option value="business-days-after">Business days after period end</option>
            <option value="fixed-day-next-month">Fixed day of the next month</option>
          </SelectField>
          <NumberField
            form={form}
            name="deadlineValue"
            label={rule === "fixed-day-next-month" ? "Day of the month" : "Business days"}
            hint={rule === "fixed-day-next-month" ? "Moved to the next business day when it falls on a weekend or holiday." : "Weekends and the firm's holidays are skipped."}
            inputMode="numeric"
            min={1}
            max={60}
          />
        </div>
        <CheckboxField form={form} name="methodCoApproval">
          A compliance head must co-approve each method statement version (recommended: a second person checks every method change).
        </CheckboxField>
        {!coApproval ? (
          <TextAreaField
            form={form}
            name="methodSingleApprovalReason"
            label="Why one person may approve the method statement"
            hint="Recorded in the audit trail and shown beside each one-person approval."
            rows={2}
          />
        ) : null}
      </fieldset>
      {editable ? (
        <div className="flex items-center gap-3">
          <SaveButton busy={isSubmitting} disabled={isSubmitting || !isDirty}>
            Save settings
          </SaveButton>
          <SaveStatusLine status={status} />
        </div>
      ) : null}
    </form>
  );
}
