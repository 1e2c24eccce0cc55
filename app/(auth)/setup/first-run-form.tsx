"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { firstRunSchema, type FirstRunInput } from "@/lib/validation/accounts";
import { REPORTING_CURRENCIES } from "@/lib/validation/firm";
import { MIN_PASSWORD_LENGTH } from "@/lib/validation/auth";
import { apiFetch } from "@/app/_components/api";
import { primaryButtonClass, FormError } from "@/app/_components/field";
import { TextField, SelectField } from "@/app/_components/form/fields";
import { useFormSubmit } from "@/app/_components/form/use-form-submit";
import { SignInNow } from "../_components/sign-in-now";

/** The first-run form: firm name, reporting currency, the administrator's name, e-mail and password. */
export function FirstRunForm() {
  const [done, setDone] = useState<string | null>(null);
  const form = useForm<FirstRunInput>({
    resolver: zodResolver(firstRunSchema),
    defaultValues: { firmName: "", reportingCurrency: "EUR", adminName: "", adminEmail: "", password: "", confirm: "" },
  });

  const { onSubmit, formError } = useFormSubmit(
    form,
    async (values) => {
      const { email } = await apiFetch<{ email: string }>("/api/setup", { method: "POST", body: values });
      setDone(email);
    },
    { fallback: "Could not set up the firm." },
  );

  if (done) {
    return <SignInNow>The firm is created. Sign in as {done}, then invite your colleagues under Settings → People and roles.</SignInNow>;
  }
  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 flex flex-col gap-4">
      <FormError message={formError} />
      <fieldset className="flex flex-col gap-4">
        <legend className="mb-2 font-medium">The firm</legend>
        <TextField form={form} name="firmName" label="Firm name" autoFocus autoComplete="organization" />
        <SelectField
          form={form}
          name="reportingCurrency"
          label="Reporting currency"
          hint="Capital and risk figures are shown in it; change it later under Settings."
          options={REPORTING_CURRENCIES.map((c) => [c, c])}
        />
      </fieldset>
      <fieldset className="flex flex-col gap-4">
        <legend className="mb-2 font-medium">Its first administrator (you)</legend>
        <TextField form={form} name="adminName" label="Your name" autoComplete="name" />
        <TextField form={form} name="adminEmail" label="Your e-mail" type="email" autoComplete="username" />
        <TextField form={form} name="password" label="Password" hint={`At least ${MIN_PASSWORD_LENGTH} characters.`} type="password" autoComplete="new-password" />
        <TextField form={form} name="confirm" label="The same password again" type="password" autoComplete="new-password" />
      </fieldset>
      <button type="submit" className={primaryButtonClass} disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting ? "Creating…" : "Create the firm"}
      </button>
    </form>
  );
}
