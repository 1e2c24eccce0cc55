"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { openPeriodSchema, type OpenPeriodInput } from "@/lib/validation/periods";
import { apiFetch, ApiError } from "@/app/_components/api";
import { Field, inputClass, primaryButtonClass } from "@/app/_components/field";

/** Open the period of a month by hand (periods also open automatically at month end). */
export function OpenPeriodForm({ defaultMonth }: { defaultMonth: string }) {
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "ok" | "alert"; text: string } | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<OpenPeriodInput>({ resolver: zodResolver(openPeriodSchema), defaultValues: { month: defaultMonth } });

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    try {
      const { period } = await apiFetch<{ period: { periodEnd: string; deadline: string } }>("/api/periods", { method: "POST", body: values });
      setMessage({ tone: "ok", text: `Opened the period ending ${period.periodEnd}; deadline ${period.deadline}.` });
      router.refresh();
    } catch (error) {
      if (error instanceof ApiError && error.fields?.month) setError("month", { message: error.fields.month });
      setMessage({ tone: "alert", text: error instanceof Error ? error.message : "Could not open the period." });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="mb-6 flex flex-wrap items-end gap-3 rounded-lg border border-ink-line bg-paper-raised p-4">
      <Field id="month" label="Open the period for month" hint="A month's period opens once the month has ended." error={errors.month?.message}>
        <input id="month" type="month" max={defaultMonth} className={inputClass} aria-invalid={Boolean(errors.month)} {...register("month")} />
      </Field>
      <button type="submit" className={primaryButtonClass} disabled={isSubmitting}>
        {isSubmitting ? "Opening…" : "Open period"}
      </button>
      {message ? (
        <p role="status" className={`basis-full text-sm ${message.tone === "ok" ? "text-ok" : "text-alert"}`}>
          {message.text}
        </p>
      ) : null}
    </form>
  );
}
