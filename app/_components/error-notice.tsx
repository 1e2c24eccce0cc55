"use client";

import { useEffect, type ReactNode } from "react";
import { primaryButtonClass } from "@/app/_components/field";
import { errorDigest, ProblemNotice } from "@/app/_components/problem-notice";

/**
 * What an error boundary shows: the error logged in the browser's console, the notice with its title and what
 * happened (`children`), "Try again" (the boundary's retry) before the page's way on (`wayOn`), what to do if that
 * does not help, and the reference that matches the server's log. Never the server's message.
 */
export function ErrorNotice({ error, retry, title, wayOn, children }: { error: unknown; retry: () => void; title: string; wayOn: ReactNode; children: ReactNode }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <ProblemNotice
      code="Error"
      title={title}
      reference={errorDigest(error)}
      actions={
        <>
          <button type="button" onClick={() => retry()} className={primaryButtonClass}>
            Try again
          </button>
          {wayOn}
        </>
      }
    >
      {children}
      <p>If trying again does not help, tell your firm&apos;s administrator the reference below.</p>
    </ProblemNotice>
  );
}
