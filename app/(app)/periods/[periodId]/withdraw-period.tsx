"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { withdrawPeriodSchema, type WithdrawPeriodInput } from "@/lib/validation/periods";
import { apiFetch } from "@/app/_components/api";
import { TextField } from "@/app/_components/form/fields";

/** Withdraw an empty period opened by mistake, with a reason (the server refuses once anything has entered it). */
export function WithdrawPeriod({ periodId, label }: { periodId: string; label: string }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [error, setErrorText] = useState<string | null>(null);
  const form = useForm<WithdrawPeriodInput>({ resolver: zodResolver(withdrawPeriodSchema), defaultValues: { reason: "" } });

  const onSubmit = form.handleSubmit(async (values) => {
    setErrorText(null);
    try {
      await apiFetch(`/api/periods/${periodId}`, { method: "DELETE", body: values });
      router.replace("/periods");
      router.refresh();
    } catch (e) {
      setErrorText(e instanceof Error ? e.message : "Could not withdraw the period.");
    }
  });

  if (!open) {
    return (
      <button type="button" className="text-sm font-medium text-alert underline" onClick={() => setOpen(true)}>
        Withdraw this period (opened by mistake)
      </button>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-wrap items-end gap-3 rounded-lg border border-alert/30 bg-alert-bg p-4" aria-label="Withdraw period">
      <p className="basis-full text-sm">
        Withdraw {label}? Only a period nothing has entered yet can be withdrawn. The withdrawal is recorded in the audit trail.
      </p>
      <TextField form={form} name="reason" id="withdraw-reason" label="Why" />
      <button type="submit" className="rounded-md border border-alert px-3 py-2 text-sm font-medium text-alert" disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting ? "Withdrawing…" : "Withdraw period"}
      </button>
      <button type="button" className="px-3 py-2 text-sm underline" onClick={() => setOpen(false)}>
        Keep it
      </button>
      {error ? (
        <p role="alert" className="basis-full text-sm text-alert">
          {error}
        </p>
      ) : null}
    </form>
  );
}
