"use client";

/**
 * The filing page's actions, each shown only to the role that may take it: assembling and editing the draft and
 * submitting it (compliance officer), requesting changes and signing (compliance head), recording the filing and
 * starting a new version after signing (compliance officer), and checking the signature (anyone).
 */
import { useEffect, useRef, useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { zodResolver } from "@hookform/resolvers/zod";
import { apiFetch, ApiError } from "@/app/_components/api";
import { Field, inputClass, primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import {
  FILING_SECTIONS,
  markFiledSchema,
  newFilingVersionSchema,
  requestChangesSchema,
  signFilingSchema,
  submitFilingSchema,
  type MarkFiledInput,
  type NewFilingVersionInput,
  type RequestChangesInput,
  type SignFilingInput,
  type SubmitFilingInput,
} from "@/lib/validation/filings";

type Method = "POST" | "PATCH";

/** Send one request; on success refresh the page's server data, on failure keep the server's message and fields. */
function useSend() {
  const router = useRouter();
  const [error, setError] = useState<{ message: string; fields: Record<string, string> } | null>(null);
  const [pending, setPending] = useState(false);
  async function send(url: string, method: Method, body: unknown): Promise<boolean> {
    setPending(true);
    setError(null);
    try {
      await apiFetch(url, { method, body });
      router.refresh();
      return true;
    } catch (e) {
      setError({ message: e instanceof Error ? e.message : "That did not work.", fields: e instanceof ApiError ? (e.fields ?? {}) : {} });
      return false;
    } finally {
      setPending(false);
    }
  }
  return { send, error, pending, setError };
}

function Alert({ message, testId }: { message: string | null | undefined; testId?: string }) {
  if (!message) return null;
  return (
    <p role="alert" data-testid={testId} className="rounded-md border border-alert/30 bg-alert-bg px-3 py-2 text-sm text-alert">
      {message}
    </p>
  );
}

/** Assemble the draft from the marked run, or rebuild the open draft from it. */
export function PrepareButton({ periodId, rebuild }: { periodId: string; rebuild: boolean }) {
  const { send, error, pending } = useSend();
  return (
    <div className="flex flex-col items-start gap-2">
      <button type="button" className={rebuild ? secondaryButtonClass : primaryButtonClass} disabled={pending} onClick={() => void send(`/api/periods/${periodId}/filing`, "POST", {})}>
        {pending ? "Assembling…" : rebuild ? "Rebuild from the marked run" : "Assemble the draft filing"}
      </button>
      <Alert message={error?.message} testId="prepare-error" />
    </div>
  );
}

/** The compliance officer's cover note. */
export function CoverNoteForm({ filingId, coverNote }: { filingId: string; coverNote: string }) {
  const { send, error, pending } = useSend();
  const [value, setValue] = useState(coverNote);
  const [saved, setSaved] = useState(false);
  return (
    <form
      className="mt-4 flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-raised p-4"
      onSubmit={async (e) => {
        e.preventDefault();
        setSaved(await send(`/api/filings/${filingId}`, "PATCH", { coverNote: value }));
      }}
    >
      <Field id="cover-note" label="Cover note" hint="Free text at the front of the filing: what the reader should know first." error={error?.fields.coverNote}>
        <textarea id="cover-note" rows={5} className={inputClass} value={value} onChange={(e) => (setValue(e.target.value), setSaved(false))} aria-invalid={Boolean(error?.fields.coverNote)} />
      </Field>
      <div className="flex items-center gap-3">
        <button type="submit" className={secondaryButtonClass} disabled={pending || value === coverNote}>
          {pending ? "Saving…" : "Save cover note"}
        </button>
        {saved ? <span className="text-sm text-ok" role="status">Saved.</span> : null}
      </div>
      {error && !error.fields.coverNote ? <Alert message={error.message} /> : null}
    </form>
  );
}

/** One explanation per backtest exception. */
export function ExplanationsForm({ filingId, exceptions }: { filingId: string; exceptions: { date: string; label: string; explanation: string }[] }) {
  const { send, error, pending } = useSend();
  const initial = Object.fromEntries(exceptions.map((e) => [e.date, e.explanation]));
  const [values, setValues] = useState<Record<string, string>>(initial);
  const [saved, setSaved] = useState(false);
  const changed = Object.fromEntries(Object.entries(values).filter(([d, t]) => t !== initial[d]));
  if (!exceptions.length) return null;
  return (
    <form
      className="mt-4 flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-raised p-4"
      aria-labelledby="explanations-heading"
      onSubmit={async (e) => {
        e.preventDefault();
        setSaved(await send(`/api/filings/${filingId}`, "PATCH", { explanations: changed }));
      }}
    >
      <h4 id="explanations-heading" className="font-medium">
        Explain each exception
      </h4>
      {exceptions.map((x) => (
        <Field key={x.date} id={`explanation-${x.date}`} label={`Exception of ${x.label}`} error={error?.fields[`explanations.${x.date}`]}>
          <textarea
            id={`explanation-${x.date}`}
            rows={2}
            className={inputClass}
            value={values[x.date] ?? ""}
            onChange={(e) => (setValues({ ...values, [x.date]: e.target.value }), setSaved(false))}
          />
        </Field>
      ))}
      <div className="flex items-center gap-3">
        <button type="submit" className={secondaryButtonClass} disabled={pending || Object.keys(changed).length === 0}>
          {pending ? "Saving…" : "Save explanations"}
        </button>
        {saved ? <span className="text-sm text-ok" role="status">Saved.</span> : null}
      </div>
      {error && !Object.keys(error.fields).length ? <Alert message={error.message} /> : null}
    </form>
  );
}

/** Send the draft to the compliance head, with an optional answer to the review. */
export function SubmitForm({ filingId, resubmit, unexplained }: { filingId: string; resubmit: boolean; unexplained: number }) {
  const { send, error, pending } = useSend();
  const { register, handleSubmit } = useForm<z.input<typeof submitFilingSchema>, unknown, SubmitFilingInput>({ resolver: zodResolver(submitFilingSchema), defaultValues: { note: "" } });
  return (
    <form className="flex flex-col gap-3" onSubmit={handleSubmit((v) => send(`/api/filings/${filingId}/submit`, "POST", v))} noValidate>
      {unexplained > 0 ? (
        <p className="text-sm text-caution">
          {unexplained} backtest exception{unexplained === 1 ? " has" : "s have"} no explanation yet.
        </p>
      ) : null}
      <Field id="submit-note" label={resubmit ? "Your answer to the review (optional)" : "Note to the reviewer (optional)"} error={error?.fields.note}>
        <textarea id="submit-note" rows={2} className={inputClass} {...register("note")} />
      </Field>
      <button type="submit" className={primaryButtonClass} disabled={pending}>
        {pending ? "Sending…" : resubmit ? "Resubmit for review" : "Submit for review"}
      </button>
      <Alert message={error && !error.fields.note ? error.message : null} testId="submit-error" />
    </form>
  );
}

/** Send the version back to the compliance officer with the reason. */
export function RequestChangesForm({ filingId }: { filingId: string }) {
  const { send, error, pending } = useSend();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<z.input<typeof requestChangesSchema>, unknown, RequestChangesInput>({ resolver: zodResolver(requestChangesSchema), defaultValues: { section: "general", reason: "" } });
  return (
    <form className="flex flex-col gap-3" onSubmit={handleSubmit((v) => send(`/api/filings/${filingId}/request-changes`, "POST", v))} noValidate>
      <Field id="changes-section" label="About" error={errors.section?.message ?? error?.fields.section}>
        <select id="changes-section" className={inputClass} {...register("section")}>
          {FILING_SECTIONS.map((s) => (
            <option key={s.id} value={s.id}>
              {s.label}
            </option>
          ))}
        </select>
      </Field>
      <Field id="changes-reason" label="What needs to change" error={errors.reason?.message ?? error?.fields.reason}>
        <textarea id="changes-reason" rows={3} className={inputClass} aria-invalid={Boolean(errors.reason)} {...register("reason")} />
      </Field>
      <button type="submit" className={secondaryButtonClass} disabled={pending}>
        {pending ? "Sending…" : "Request changes"}
      </button>
      <Alert message={error && !Object.keys(error.fields).length ? error.message : null} testId="request-changes-error" />
    </form>
  );
}

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

/** Record the filing with the regulator: the date and the regulator's reference. */
export function MarkFiledForm({ filingId, today }: { filingId: string; today: string }) {
  const { send, error, pending } = useSend();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<MarkFiledInput>({ resolver: zodResolver(markFiledSchema), defaultValues: { filedOn: today, reference: "" } });
  return (
    <form className="flex flex-col gap-3" onSubmit={handleSubmit((v) => send(`/api/filings/${filingId}/filed`, "POST", v))} noValidate>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field id="filed-on" label="Filed on" error={errors.filedOn?.message ?? error?.fields.filedOn}>
          <input id="filed-on" type="date" max={today} className={inputClass} {...register("filedOn")} />
        </Field>
        <Field id="filed-reference" label="Regulator's reference" error={errors.reference?.message ?? error?.fields.reference}>
          <input id="filed-reference" className={inputClass} {...register("reference")} />
        </Field>
      </div>
      <button type="submit" className={primaryButtonClass} disabled={pending}>
        {pending ? "Recording…" : "Record as filed"}
      </button>
      <Alert message={error && !Object.keys(error.fields).length ? error.message : null} />
    </form>
  );
}

/** A change after signing: a new version with the reason; the signature of this version is superseded. */
export function NewVersionForm({ filingId, version }: { filingId: string; version: number }) {
  const { send, error, pending } = useSend();
  const [open, setOpen] = useState(false);
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<NewFilingVersionInput>({ resolver: zodResolver(newFilingVersionSchema), defaultValues: { reason: "" } });
  if (!open) {
    return (
      <button type="button" className={secondaryButtonClass} onClick={() => setOpen(true)}>
        Change the signed filing…
      </button>
    );
  }
  return (
    <form className="flex flex-col gap-3" onSubmit={handleSubmit((v) => send(`/api/filings/${filingId}/versions`, "POST", v))} noValidate>
      <p className="text-sm text-ink-soft">
        Version {version} stays as signed. The change is made in version {version + 1}, a new draft that goes through review and sign-off again; the signature on version {version} is
        marked superseded and stays visible.
      </p>
      <Field id="new-version-reason" label="Why does the signed version need to change?" error={errors.reason?.message ?? error?.fields.reason}>
        <textarea id="new-version-reason" rows={3} className={inputClass} {...register("reason")} />
      </Field>
      <div className="flex gap-3">
        <button type="submit" className={primaryButtonClass} disabled={pending}>
          {pending ? "Starting…" : `Start version ${version + 1}`}
        </button>
        <button type="button" className={secondaryButtonClass} onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
      <Alert message={error && !Object.keys(error.fields).length ? error.message : null} />
    </form>
  );
}

interface Verification {
  signed: boolean;
  matches: boolean | null;
  storedHash: string | null;
  recomputedHash: string;
  message: string;
}

/** Recompute the hash of the stored content and compare it with the one stored at signing. */
export function VerifyButton({ filingId }: { filingId: string }) {
  const [result, setResult] = useState<Verification | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  return (
    <div className="flex flex-col gap-2">
      <button
        type="button"
        className={secondaryButtonClass}
        disabled={pending}
        onClick={async () => {
          setPending(true);
          setError(null);
          try {
            setResult((await apiFetch<{ verification: Verification }>(`/api/filings/${filingId}/verify`)).verification);
          } catch (e) {
            setError(e instanceof Error ? e.message : "The check did not run.");
          } finally {
            setPending(false);
          }
        }}
      >
        {pending ? "Checking…" : "Verify signature"}
      </button>
      {result ? (
        <div
          role="status"
          data-testid="verify-result"
          className={`rounded-md border px-3 py-2 text-sm ${result.matches === true ? "border-ok/30 bg-ok-bg" : result.matches === false ? "border-alert/30 bg-alert-bg" : "border-ink-line bg-paper-sunk"}`}
        >
          <p className="font-medium">
            <span aria-hidden="true">{result.matches === true ? "✓ " : result.matches === false ? "! " : "• "}</span>
            {result.matches === true ? "Matches" : result.matches === false ? "Does not match" : "Not signed"}
          </p>
          <p className="mt-1 text-ink-soft">{result.message}</p>
          <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-xs">
            {result.storedHash ? (
              <>
                <dt className="text-ink-muted">Stored at signing</dt>
                <dd className="break-all font-mono">{result.storedHash}</dd>
              </>
            ) : null}
            <dt className="text-ink-muted">Recomputed now</dt>
            <dd className="break-all font-mono">{result.recomputedHash}</dd>
          </dl>
        </div>
      ) : null}
      <Alert message={error} />
    </div>
  );
}
