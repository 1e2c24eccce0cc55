"use client";

import Link from "next/link";
import { useEffect, type ReactNode } from "react";
import { primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { errorDigest, ProblemNotice } from "@/app/_components/problem-notice";

/**
 * What an error boundary shows: the error logged in the browser's console, the notice with its title and what
 * happened (`children`), "Try again" (the boundary's retry) and "Go to this month", what to do if neither helps, and
 * the reference that matches the server's log. Never the server's message. `plainLink` makes the way on a plain
 * link, for where the app's router may be what failed.
 */
export function ErrorNotice({ error, retry, title, plainLink = false, children }: { error: unknown; retry: () => void; title: string; plainLink?: boolean; children: ReactNode }) {
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
          {plainLink ? (
            <a href="/home" className={secondaryButtonClass}>
              Go to this month
            </a>
          ) : (
            <Link href="/home" className={secondaryButtonClass}>
              Go to this month
            </Link>
          )}
        </>
      }
    >
      {children}
      <p>If trying again does not help, tell your firm&apos;s administrator the reference below.</p>
    </ProblemNotice>
  );
}
