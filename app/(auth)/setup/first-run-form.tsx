"use client";

import { useState } from "react";
import Link from "next/link";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { firstRunSchema, type FirstRunInput } from "@/lib/validation/accounts";
import { REPORTING_CURRENCIES } from "@/lib/validation/firm";
import { MIN_PASSWORD_LENGTH } from "@/lib/validation/auth";
import { apiFetch, ApiError } from "@/app/_components/api";
import { Field, inputClass, primaryButtonClass, FormError } from "@/app/_components/field";

/** The first-run form: firm name, reporting currency, the administrator's name, e-mail and password. */
export function FirstRunForm() {
  const [done, setDone] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<FirstRunInput>({
    resolver: zodResolver(firstRunSchema),
    defaultValues: { firmName: "", reportingCurrency: "EUR", adminName: "", adminEmail: "", password: "", confirm: "" },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const { email } = await apiFetch<{ email: string }>("/api/setup", { method: "POST", body: values });
      setDone(email);
    } catch (e) {
      if (e instanceof ApiError && e.fields) for (const [field, message] of Object.entries(e.fields)) setError(field as keyof FirstRunInput, { message });
      setFormError(e instanceof Error ? e.message : "Could not set up the firm.");
    }
  });

  if (done) {
    return (
      <div className="mt-6 flex flex-col gap-4" role="status">
        <p>The firm is created. Sign in as {done}, then invite your colleagues under Settings → People and roles.</p>
        <Link href="/sign-in" className={primaryButtonClass}>
          Sign in
        </Link>
      </div>
    );
  }
  const f = (name: keyof FirstRunInput) => ({ "aria-invalid": Boolean(errors[name]), className: inputClass, ...register(name) });
  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 flex flex-col gap-4">
      <FormError message={formError} />
      <fieldset className="flex flex-col gap-4">
        <legend className="mb-2 font-medium">The firm</legend>
        <Field id="firmName" label="Firm name" error={errors.firmName?.message}>
          <input id="firmName" autoFocus autoComplete="organization" {...f("firmName")} />
        </Field>
        <Field id="reportingCurrency" label="Reporting currency" hint="Capital and risk figures are shown in it; change it later under Settings." error={errors.reportingCurrency?.message}>
          <select id="reportingCurrency" {...f("reportingCurrency")}>
            {REPORTING_CURRENCIES.map((c) => (
              <option key={c} value={c}>
                {c}
              </option>
            ))}
          </select>
        </Field>
      </fieldset>
      <fieldset className="flex flex-col gap-4">
        <legend className="mb-2 font-medium">Its first administrator (you)</legend>
        <Field id="adminName" label="Your name" error={errors.adminName?.message}>
          <input id="adminName" autoComplete="name" {...f("adminName")} />
        </Field>
        <Field id="adminEmail" label="Your e-mail" error={errors.adminEmail?.message}>
          <input id="adminEmail" type="email" autoComplete="username" {...f("adminEmail")} />
        </Field>
        <Field id="password" label="Password" hint={`At least ${MIN_PASSWORD_LENGTH} characters.`} error={errors.password?.message}>
          <input id="password" type="password" autoComplete="new-password" {...f("password")} />
        </Field>
        <Field id="confirm" label="The same password again" error={errors.confirm?.message}>
          <input id="confirm" type="password" autoComplete="new-password" {...f("confirm")} />
        </Field>
      </fieldset>
      <button type="submit" className={primaryButtonClass} disabled={isSubmitting}>
        {isSubmitting ? "Creating…" : "Create the firm"}
      </button>
    </form>
  );
}
