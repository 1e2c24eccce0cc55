"use client";

import { useState } from "react";
import Link from "next/link";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { resetRequestSchema, type ResetRequestInput } from "@/lib/validation/accounts";
import { apiFetch } from "@/app/_components/api";
import { primaryButtonClass, FormError } from "@/app/_components/field";
import { TextField } from "@/app/_components/form/fields";
import { useFormSubmit } from "@/app/_components/form/use-form-submit";

/** The reset request: one answer whatever the address, so the form cannot tell who has an account. */
export function ResetRequestForm() {
  const [answer, setAnswer] = useState<string | null>(null);
  const form = useForm<ResetRequestInput>({ resolver: zodResolver(resetRequestSchema), defaultValues: { email: "" } });
  // one answer whatever the address, so the server's field messages are not put on the field either
  const { onSubmit, formError } = useFormSubmit(
    form,
    async (values) => {
      const { message } = await apiFetch<{ message: string }>("/api/account/reset", { method: "POST", body: values });
      setAnswer(message);
    },
    { fallback: "Could not send the request.", fieldErrors: false },
  );

  if (answer) {
    return (
      <div className="mt-6 flex flex-col gap-4">
        <p role="status">{answer}</p>
        <Link href="/sign-in" className="text-sm underline">
          Back to sign-in
        </Link>
      </div>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 flex flex-col gap-4">
      <FormError message={formError} />
      <TextField form={form} name="email" label="E-mail" type="email" autoComplete="username" autoFocus />
      <button type="submit" className={primaryButtonClass} disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting ? "Sending…" : "Send reset link"}
      </button>
      <Link href="/sign-in" className="text-sm underline">
        Back to sign-in
      </Link>
    </form>
  );
}
