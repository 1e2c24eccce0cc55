"use client";

import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { changePasswordSchema, type ChangePasswordInput } from "@/lib/validation/accounts";
import { MIN_PASSWORD_LENGTH } from "@/lib/validation/auth";
import { apiFetch } from "@/app/_components/api";
import { primaryButtonClass, FormError } from "@/app/_components/field";
import { TextField } from "@/app/_components/form/fields";
import { useFormSubmit } from "@/app/_components/form/use-form-submit";

/** Change one's own password with the current one; then go to sign-in (the session has ended). */
export function ChangePasswordForm({ email }: { email: string }) {
  const router = useRouter();
  const form = useForm<ChangePasswordInput>({ resolver: zodResolver(changePasswordSchema), defaultValues: { currentPassword: "", newPassword: "", confirm: "" } });
  const { onSubmit, formError } = useFormSubmit(
    form,
    async (values) => {
      await apiFetch("/api/account/password", { method: "POST", body: values });
      router.replace("/sign-in?changed=1");
      router.refresh();
    },
    { fallback: "Could not change the password." },
  );

  return (
    <form onSubmit={onSubmit} noValidate className="mt-4 flex flex-col gap-4">
      <FormError message={formError} />
      <input type="hidden" autoComplete="username" value={email} readOnly />
      <TextField form={form} name="currentPassword" label="Current password" type="password" autoComplete="current-password" />
      <TextField form={form} name="newPassword" label="New password" hint={`At least ${MIN_PASSWORD_LENGTH} characters.`} type="password" autoComplete="new-password" />
      <TextField form={form} name="confirm" label="The new password again" type="password" autoComplete="new-password" />
      <button type="submit" className={primaryButtonClass} disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting ? "Changing…" : "Change password"}
      </button>
    </form>
  );
}
