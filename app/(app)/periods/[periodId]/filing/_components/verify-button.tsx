"use client";

import { useState } from "react";
import { apiFetch } from "@/app/_components/api";
import { secondaryButtonClass } from "@/app/_components/field";
import { Alert } from "./alert";

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
