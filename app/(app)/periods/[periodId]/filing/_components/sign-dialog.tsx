"use client";

import { useEffect, useRef, useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { Field, inputClass, primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { useSend } from "./use-send";
import { Alert } from "./alert";
import { signFilingSchema, type SignFilingInput } from "@/lib/validation/filings";

/** The signing dialog: the password again, the attestation, the signer's name and licence or registration reference. */
export function SignDialog({
  filingId,
  version,
  signerName,
  licenceLabel,
  lastReference,
  attestation,
  hashPreview,
}: {
  filingId: string;
  version: number;
  signerName: string;
  licenceLabel: string;
  lastReference: string | null;
  attestation: string;
  hashPreview: string;
}) {
  const dialog = useRef<HTMLDialogElement>(null);
  const { send, error, pending, setError } = useSend();
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors },
  } = useForm<SignFilingInput>({
    resolver: zodResolver(signFilingSchema),
    defaultValues: { password: "", attest: false, signerName: "", licenceReference: lastReference ?? "" },
  });
  const [open, setOpen] = useState(false);
  useEffect(() => {
    if (open) dialog.current?.showModal();
    else dialog.current?.close();
  }, [open]);
  const fieldError = (name: keyof SignFilingInput) => errors[name]?.message ?? error?.fields[name];
  return (
    <>
      <button type="button" className={primaryButtonClass} onClick={() => (setError(null), setOpen(true))}>
        Sign version {version}
      </button>
      <dialog
        ref={dialog}
        aria-labelledby="sign-title"
        onClose={() => setOpen(false)}
        className="m-auto w-[40rem] max-w-[calc(100vw-2rem)] rounded-xl border border-ink-line bg-paper p-0 text-ink shadow-xl backdrop:bg-ink/40"
      >
        <form
          className="flex flex-col gap-5 p-8"
          noValidate
          onSubmit={handleSubmit(async (values) => {
            const ok = await send(`/api/filings/${filingId}/sign`, "POST", values);
            if (ok) {
              reset();
              setOpen(false);
            } else reset({ ...values, password: "" });
          })}
        >
          <div>
            <h2 id="sign-title" className="text-xl font-semibold">
              Sign version {version} of the filing
            </h2>
            <p className="mt-1 text-sm text-ink-soft">
              Your signature records your name, your reference, the time and the SHA-256 of the content as it stands (now <code className="text-xs">{hashPreview.slice(0, 16)}…</code>). The
              version is then locked: a later change makes a new version.
            </p>
          </div>
          <label className="flex items-start gap-3 rounded-lg border border-ink-line bg-paper-raised p-4 text-sm leading-relaxed">
            <input type="checkbox" className="mt-1 h-4 w-4 shrink-0" aria-invalid={Boolean(fieldError("attest"))} {...register("attest")} />
            <span>{attestation}</span>
          </label>
          {fieldError("attest") ? (
            <p role="alert" className="-mt-3 text-sm text-alert">
              {fieldError("attest")}
            </p>
          ) : null}
          <div className="grid gap-4 sm:grid-cols-2">
            <Field id="sign-name" label="Your full name" hint={`As Ballast knows you: ${signerName}`} error={fieldError("signerName")}>
              <input id="sign-name" autoComplete="name" className={inputClass} aria-invalid={Boolean(fieldError("signerName"))} {...register("signerName")} />
            </Field>
            <Field id="sign-reference" label={licenceLabel} error={fieldError("licenceReference")}>
              <input id="sign-reference" className={inputClass} aria-invalid={Boolean(fieldError("licenceReference"))} {...register("licenceReference")} />
            </Field>
          </div>
          <Field id="sign-password" label="Your password, entered again" error={fieldError("password")}>
            <input id="sign-password" type="password" autoComplete="current-password" className={inputClass} aria-invalid={Boolean(fieldError("password"))} {...register("password")} />
          </Field>
          <Alert message={error && !Object.keys(error.fields).length ? error.message : null} testId="sign-error" />
          <div className="flex justify-end gap-3">
            <button type="button" className={secondaryButtonClass} onClick={() => setOpen(false)}>
              Cancel
            </button>
            <button type="submit" className={primaryButtonClass} disabled={pending}>
              {pending ? "Signing…" : "Sign"}
            </button>
          </div>
        </form>
      </dialog>
    </>
  );
}
