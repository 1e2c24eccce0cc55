/** Data that could not be loaded: the error's message, else `fallback`, in the alert box (announced). */
export function LoadError({ error, fallback }: { error: unknown; fallback: string }) {
  return (
    <p role="alert" className="rounded-md border border-alert/30 bg-alert-bg p-3 text-sm text-alert">
      {error instanceof Error ? error.message : fallback}
    </p>
  );
}
