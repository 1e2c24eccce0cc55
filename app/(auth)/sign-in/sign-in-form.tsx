"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { signIn } from "next-auth/react";
import { signInSchema, type SignInInput } from "@/lib/validation/auth";
import { safeNextPath } from "@/lib/auth/safe-redirect";
import { primaryButtonClass } from "@/app/_components/field";
import { TextField } from "@/app/_components/form/fields";

const GENERIC = "That e-mail and password do not match an active account.";
const RATE_LIMITED = "Too many failed sign-in attempts for this account from here. Wait a few minutes and try again; each further failure doubles the wait.";

export function SignInForm({ next, expired }: { next: string; expired: boolean }) {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(expired ? "Your session ended. Sign in again." : null);
  const form = useForm<SignInInput>({ resolver: zodResolver(signInSchema), defaultValues: { email: "", password: "" } });

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    const result = await signIn("credentials", { ...values, redirect: false });
    if (!result || result.error) {
      setFormError(result?.code === "rate_limited" ? RATE_LIMITED : GENERIC);
      return;
    }
    // Checked again here: the page passed a safe path, and this keeps it so whatever calls the form.
    router.replace(safeNextPath(next));
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 flex flex-col gap-4" aria-describedby={formError ? "sign-in-error" : undefined}>
      {formError ? (
        <p id="sign-in-error" role="alert" className="rounded-md border border-alert/30 bg-alert-bg px-3 py-2 text-sm text-alert">
          {formError}
        </p>
      ) : null}
      <TextField form={form} name="email" label="E-mail" type="email" autoComplete="username" autoFocus />
      <TextField form={form} name="password" label="Password" type="password" autoComplete="current-password" />
      <button type="submit" className={primaryButtonClass} disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting ? "Signing in…" : "Sign in"}
      </button>
    </form>
  );
}
