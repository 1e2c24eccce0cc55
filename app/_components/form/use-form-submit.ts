"use client";

import { useState } from "react";
import type { FieldValues, UseFormReturn } from "react-hook-form";
import { ApiError } from "@/app/_components/api";
import { setFieldErrors } from "@/app/_components/form/fields";

/**
 * A form's submit with the form's own error line: `send` gets the validated values; when it throws, the server's
 * per-field messages go on the fields (unless `fieldErrors: false`) and its message, else `fallback`, is the form's
 * error (show it with FormError). The error is cleared at each submit.
 */
export function useFormSubmit<T extends FieldValues>(form: UseFormReturn<T>, send: (values: T) => Promise<void>, { fallback, fieldErrors = true }: { fallback: string; fieldErrors?: boolean }) {
  const [formError, setFormError] = useState<string | null>(null);
  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await send(values);
    } catch (e) {
      if (fieldErrors && e instanceof ApiError) setFieldErrors(form, e.fields);
      setFormError(e instanceof Error ? e.message : fallback);
    }
  });
  return { onSubmit, formError };
}
