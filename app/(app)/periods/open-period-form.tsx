"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { openPeriodSchema, type OpenPeriodInput } from "@/lib/validation/periods";
import { apiFetch, ApiError } from "@/app/_components/api";
import { primaryButtonClass } from "@/app/_components/field";
import { TextField } from "@/app/_components/form/fields";

/** Open the period of a month by hand (periods also open automatically at month end). */
export function OpenPeriodForm({ defaultMonth }: { defaultMonth: string }) {
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "ok" | "alert"; text: string } | null>(null);
  const form = useForm<OpenPeriodInput>({ resolver: zodResolver(openPeriodSchema), defaultValues: { month: defaultMonth } });
  const {
    handleSubmit,
    setError,
    formState: { isSubmitting },
  } = form;

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
      <TextField form={form} name="month" label="Open the period for month" hint="A month's period opens once the month has ended." type="month" max={defaultMonth} />
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
