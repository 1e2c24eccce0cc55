import { useState, type ReactNode } from "react";
import { useRouter } from "next/navigation";
import type { FieldValues, UseFormReturn } from "react-hook-form";
import { ApiError } from "@/app/_components/api";
import { primaryButtonClass } from "@/app/_components/field";
import { setFieldErrors } from "@/app/_components/form/fields";

/** What a settings form says after a save: done (green) or refused (red); nothing before the first. */
export type SaveStatus = { tone: "ok" | "alert"; text: string } | null;

/** The status of a save that threw: the server's message, else a plain "Could not save." */
export function saveFailed(error: unknown): SaveStatus {
  return { tone: "alert", text: error instanceof Error ? error.message : "Could not save." };
}

/**
 * A settings form's save: `save` sends the validated values and says what was saved; then the status says so and the
 * page is read again. When it throws, the server's per-field messages go on the fields and its message is the status.
 */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- the form's context type plays no part here
export function useSettingsSave<T extends FieldValues, V>(form: UseFormReturn<T, any, V>, save: (values: V) => Promise<string>) {
  const router = useRouter();
  const [status, setStatus] = useState<SaveStatus>(null);
  const onSubmit = form.handleSubmit(async (values) => {
    setStatus(null);
    try {
      setStatus({ tone: "ok", text: await save(values) });
      router.refresh();
    } catch (error) {
      if (error instanceof ApiError) setFieldErrors(form, error.fields);
      setStatus(saveFailed(error));
    }
  });
  return { status, setStatus, onSubmit };
}

/** The line beside a settings form's save button, announced to screen readers; nothing while there is no status. */
export function SaveStatusLine({ status }: { status: SaveStatus }) {
  return status ? (
    <p role="status" className={`text-sm ${status.tone === "ok" ? "text-ok" : "text-alert"}`}>
      {status.text}
    </p>
  ) : null;
}

/** A settings form's save button: its label, "Saving…" while the save is under way. */
export function SaveButton({ busy, disabled = busy, children }: { busy: boolean; disabled?: boolean; children: ReactNode }) {
  return (
    <button type="submit" className={primaryButtonClass} disabled={disabled}>
      {busy ? "Saving…" : children}
    </button>
  );
}
