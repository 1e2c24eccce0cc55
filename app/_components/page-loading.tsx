/**
 * What a segment's loading.tsx shows while its page is read on the server: a heading-sized bar, a block, and a
 * sentence saying what is being loaded (announced politely to screen readers; no status role, so that it never
 * doubles a page's own status message).
 */
export function PageLoading({ what }: { what: string }) {
  return (
    <div aria-live="polite" aria-busy="true" className="flex flex-col gap-4">
      <div className="h-8 w-72 max-w-full animate-pulse rounded bg-paper-sunk" />
      <div className="h-12 animate-pulse rounded bg-paper-sunk" />
      <p className="text-sm text-ink-muted">{what}</p>
    </div>
  );
}
