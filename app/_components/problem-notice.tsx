import type { ReactNode } from "react";

/**
 * The body of an error or not-found page: what happened in plain words, what the person can do next (the first
 * action in brass), and, for an unexpected error, the reference that matches the server's log. Renders on the
 * server and in error boundaries alike (no hooks).
 */
export function ProblemNotice({ code, title, children, reference, actions }: {
  /** a short word above the title, e.g. "Not found" or "Error" */
  code: string;
  title: string;
  children: ReactNode;
  /** the error's digest, shown so support can find it in the server log */
  reference?: string | null;
  actions: ReactNode;
}) {
  return (
    <section role="alert" aria-labelledby="problem-title" className="mx-auto mt-8 max-w-xl rounded-lg border border-ink-line bg-paper-raised p-6 shadow-sm">
      <p className="text-sm font-medium uppercase tracking-wide text-ink-muted">{code}</p>
      <h1 id="problem-title" className="mt-1 text-2xl font-semibold tracking-tight">
        {title}
      </h1>
      <div className="mt-3 space-y-2 text-ink-soft">{children}</div>
      {reference ? (
        <p className="mt-4 text-sm text-ink-muted">
          Reference for support: <code className="rounded bg-paper-sunk px-1 py-0.5 font-mono text-ink" data-testid="error-reference">{reference}</code>
        </p>
      ) : null}
      <div className="mt-6 flex flex-wrap gap-3">{actions}</div>
    </section>
  );
}

/** The digest of an error thrown on the server (Next.js sets it), if the thrown value carries one. */
export function errorDigest(error: unknown): string | null {
  return error instanceof Error && typeof (error as Error & { digest?: unknown }).digest === "string" ? (error as Error & { digest: string }).digest : null;
}
