"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { tokenPasswordSchema, type TokenPasswordInput } from "@/lib/validation/accounts";
import { MIN_PASSWORD_LENGTH } from "@/lib/validation/auth";
import { apiFetch } from "@/app/_components/api";
import { primaryButtonClass, FormError } from "@/app/_components/field";
import { TextField } from "@/app/_components/form/fields";
import { useFormSubmit } from "@/app/_components/form/use-form-submit";
import { SignInNow } from "./sign-in-now";

/** Choose a password through an invitation or reset link; then sign in with it. */
export function SetPasswordForm({ token, purpose, email }: { token: string; purpose: "invite" | "reset"; email: string }) {
  const [done, setDone] = useState(false);
  const form = useForm<TokenPasswordInput>({ resolver: zodResolver(tokenPasswordSchema), defaultValues: { token, password: "", confirm: "" } });
  const { onSubmit, formError } = useFormSubmit(
    form,
    async (values) => {
      await apiFetch("/api/account/set-password", { method: "POST", body: { ...values, purpose } });
      setDone(true);
    },
    { fallback: "Could not set the password." },
  );

  if (done) {
    return <SignInNow>Your password is set. Sign in with {email} and the password you chose.</SignInNow>;
  }
  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 flex flex-col gap-4">
      <FormError message={formError} />
      <input type="hidden" autoComplete="username" value={email} readOnly />
      <TextField
        form={form}
        name="password"
        label="New password"
        hint={`At least ${MIN_PASSWORD_LENGTH} characters; a phrase of several words is easiest to remember.`}
        type="password"
        autoComplete="new-password"
        autoFocus
      />
      <TextField form={form} name="confirm" label="The same password again" type="password" autoComplete="new-password" />
      <button type="submit" className={primaryButtonClass} disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting ? "Saving…" : "Set password"}
      </button>
    </form>
  );
}
