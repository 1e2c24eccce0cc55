"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { changePasswordSchema, type ChangePasswordInput } from "@/lib/validation/accounts";
import { MIN_PASSWORD_LENGTH } from "@/lib/validation/auth";
import { apiFetch, ApiError } from "@/app/_components/api";
import { Field, inputClass, primaryButtonClass, FormError } from "@/app/_components/field";

/** Change one's own password with the current one; then go to sign-in (the session has ended). */
export function ChangePasswordForm({ email }: { email: string }) {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<ChangePasswordInput>({ resolver: zodResolver(changePasswordSchema), defaultValues: { currentPassword: "", newPassword: "", confirm: "" } });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await apiFetch("/api/account/password", { method: "POST", body: values });
      router.replace("/sign-in?changed=1");
      router.refresh();
    } catch (e) {
      if (e instanceof ApiError && e.fields) for (const [field, message] of Object.entries(e.fields)) setError(field as keyof ChangePasswordInput, { message });
      setFormError(e instanceof Error ? e.message : "Could not change the password.");
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="mt-4 flex flex-col gap-4">
      <FormError message={formError} />
      <input type="hidden" autoComplete="username" value={email} readOnly />
      <Field id="currentPassword" label="Current password" error={errors.currentPassword?.message}>
        <input id="currentPassword" type="password" autoComplete="current-password" className={inputClass} aria-invalid={Boolean(errors.currentPassword)} {...register("currentPassword")} />
      </Field>
      <Field id="newPassword" label="New password" hint={`At least ${MIN_PASSWORD_LENGTH} characters.`} error={errors.newPassword?.message}>
        <input id="newPassword" type="password" autoComplete="new-password" className={inputClass} aria-invalid={Boolean(errors.newPassword)} {...register("newPassword")} />
      </Field>
      <Field id="confirm" label="The new password again" error={errors.confirm?.message}>
        <input id="confirm" type="password" autoComplete="new-password" className={inputClass} aria-invalid={Boolean(errors.confirm)} {...register("confirm")} />
      </Field>
      <button type="submit" className={primaryButtonClass} disabled={isSubmitting}>
        {isSubmitting ? "Changing…" : "Change password"}
      </button>
    </form>
  );
}
