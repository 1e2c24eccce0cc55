"use client";

import { ErrorNotice } from "@/app/_components/error-notice";

/**
 * A signed-in page that failed while it was being prepared. The shell stays; the person can try the page again
 * (re-fetched from the server) or go elsewhere. A server error's own message is not shown (Next.js hides it in
 * production); its reference is, to match the server's log.
 */
export default function AppError({ error, retry }: { error: unknown; retry: () => void }) {
  return (
    <ErrorNotice error={error} retry={retry} title="This page could not be shown">
      <p>Ballast hit an error while preparing this page. Showing a page reads stored data and changes none of it.</p>
    </ErrorNotice>
  );
}
