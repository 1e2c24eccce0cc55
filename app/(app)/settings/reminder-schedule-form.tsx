"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { apiFetch, ApiError } from "@/app/_components/api";
import { CheckboxField, TextField } from "@/app/_components/form/fields";
import { parseOffsetList, reminderSettingsSchema } from "@/lib/calendar/validation";
import { fieldMessages } from "./field-messages";
import type { ReminderSettings } from "@/lib/data/calendar-settings";
import { saveFailed, SaveButton, SaveStatusLine, type SaveStatus } from "./save-status";

/** What the form holds: the days before the deadline as typed ("10, 5, 2, 1"), and the two switches. */
type ScheduleForm = { reminderOffsets: string; remindOverdue: boolean; autoOpenPeriods: boolean };

const formValues = (s: ReminderSettings): ScheduleForm => ({ reminderOffsets: s.reminderOffsets.join(", "), remindOverdue: s.remindOverdue, autoOpenPeriods: s.autoOpenPeriods });

/** The reminder schedule: business days before the deadline, the overdue notice, and automatic opening. */
export function ReminderScheduleForm({ initial }: { initial: ReminderSettings }) {
  const router = useRouter();
  const [status, setStatus] = useState<SaveStatus>(null);
  // the list's message stays until the next save (no checking while typing), as before
  const form = useForm<ScheduleForm>({ reValidateMode: "onSubmit", defaultValues: formValues(initial) });
  const { isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setStatus(null);
    // the typed list read as numbers and checked by the API's own schema; a refusal is one line on the list's field
    const parsed = reminderSettingsSchema.safeParse({ ...values, reminderOffsets: parseOffsetList(values.reminderOffsets) });
    if (!parsed.success) {
      form.setError("reminderOffsets", { message: fieldMessages(parsed.error.issues, "reminderOffsets") });
      return;
    }
    try {
      const saved = await apiFetch<ReminderSettings>("/api/calendar/settings", { method: "PUT", body: parsed.data });
      form.reset(formValues(saved));
      setStatus({ tone: "ok", text: "Reminder schedule saved." });
      router.refresh();
    } catch (e) {
      if (e instanceof ApiError && e.fields) form.setError("reminderOffsets", { message: Object.values(e.fields)[0] ?? e.message });
      setStatus(saveFailed(e));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4 rounded-lg border border-ink-line bg-paper-raised p-5">
      <TextField
        form={form}
        name="reminderOffsets"
        label="Reminders before the deadline"
        hint="Business days before it, whole numbers from 1 to 60 separated by commas, e.g. 10, 5, 2, 1. Leave empty for none."
      />
      <CheckboxField form={form} name="remindOverdue">
        Send an overdue notice the first day a deadline has passed (to every owner of the step, even those who turned reminders off).
      </CheckboxField>
      <CheckboxField form={form} name="autoOpenPeriods">
        Open each month&apos;s reporting period automatically at month end.
      </CheckboxField>
      <div className="flex items-center gap-3">
        <SaveButton busy={isSubmitting}>Save reminder schedule</SaveButton>
        <SaveStatusLine status={status} />
      </div>
    </form>
  );
}
