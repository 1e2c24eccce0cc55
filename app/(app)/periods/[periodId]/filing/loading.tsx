/** While the filing is read and its sections laid out. */
export default function Loading() {
  return (
    <div role="status" aria-live="polite" className="flex flex-col gap-4">
      <div className="h-8 w-72 animate-pulse rounded bg-paper-sunk" />
      <div className="h-12 animate-pulse rounded bg-paper-sunk" />
      <p className="text-sm text-ink-muted">Loading the filing…</p>
    </div>
  );
}
