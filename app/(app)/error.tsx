"use client";

import Link from "next/link";
import { useEffect } from "react";
import { primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { errorDigest, ProblemNotice } from "@/app/_components/problem-notice";

/**
 * A signed-in page that failed while it was being prepared. The shell stays; the person can try the page again
 * (re-fetched from the server) or go elsewhere. A server error's own message is not shown (Next.js hides it in
 * production); its reference is, to match the server's log.
 */
export default function AppError({ error, retry }: { error: unknown; retry: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <ProblemNotice
      code="Error"
      title="This page could not be shown"
      reference={errorDigest(error)}
      actions={
        <>
          <button type="button" onClick={() => retry()} className={primaryButtonClass}>
            Try again
          </button>
          <Link href="/home" className={secondaryButtonClass}>
            Go to this month
          </Link>
        </>
      }
    >
      <p>Ballast hit an error while preparing this page. Showing a page reads stored data and changes none of it.</p>
      <p>If trying again does not help, tell your firm&apos;s administrator the reference below.</p>
    </ProblemNotice>
  );
}
