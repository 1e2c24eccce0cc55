/** A labelled form field with its error message tied to the input for screen readers. */
export function Field({
  id,
  label,
  error,
  hint,
  children,
}: {
  id: string;
  label: string;
  error?: string;
  hint?: string;
  children: React.ReactNode;
}) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
      </label>
      {children}
      {hint && !error ? (
        <p id={`${id}-hint`} className="text-xs text-ink-muted">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} role="alert" className="text-sm text-alert">
          {error}
        </p>
      ) : null}
    </div>
  );
}

/** A select's options from [value, label] pairs (e.g. a label table's entries). */
export function SelectOptions({ options }: { options: readonly (readonly [string, React.ReactNode])[] }) {
  return (
    <>
      {options.map(([value, label]) => (
        <option key={value} value={value}>
          {label}
        </option>
      ))}
    </>
  );
}

export const inputClass =
  "rounded-md border border-ink-line bg-paper-raised px-3 py-2 text-ink shadow-sm placeholder:text-ink-muted focus:border-brass focus:outline-none aria-[invalid=true]:border-alert";

export const primaryButtonClass =
  "inline-flex items-center justify-center whitespace-nowrap rounded-md bg-brass px-4 py-2 font-medium text-white shadow-sm hover:bg-brass-dark disabled:cursor-not-allowed disabled:opacity-60";

export const secondaryButtonClass =
  "inline-flex items-center justify-center whitespace-nowrap rounded-md border border-ink-line bg-paper-raised px-4 py-2 font-medium text-ink hover:bg-paper-sunk disabled:cursor-not-allowed disabled:opacity-60";

/** A form's own error (what the server said about the whole form), announced to screen readers; nothing when empty. */
export function FormError({ message }: { message: string | null | undefined }) {
  return message ? (
    <p role="alert" className="rounded-md border border-alert/30 bg-alert-bg px-3 py-2 text-sm text-alert">
      {message}
    </p>
  ) : null;
}
