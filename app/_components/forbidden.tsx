/** Shown in place of a page the person's roles do not open. */
export function Forbidden({ what }: { what: string }) {
  return (
    <div role="alert" className="rounded-lg border border-ink-line bg-paper-raised p-6">
      <h1 className="text-lg font-semibold">Not open to your role</h1>
      <p className="mt-2 text-ink-soft">{what} Ask your firm&apos;s administrator if you need access.</p>
    </div>
  );
}
