import type { Metadata } from "next";
import { BackLink } from "@/app/_components/back-link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { QueryProvider } from "@/app/_components/query-provider";
import { pageActor } from "@/lib/auth/page";
import { uploadExists } from "@/lib/data/uploads";
import { UploadPreview } from "./upload-preview";

export const metadata: Metadata = { title: "Upload preview" };

export default async function UploadPage({ params, searchParams }: { params: Promise<{ uploadId: string }>; searchParams: Promise<{ duplicate?: string }> }) {
  const { uploadId } = await params;
  const { duplicate } = await searchParams;
  const { actor } = await pageActor();
  // A malformed id names no upload: not found, rather than a request the API would refuse; another firm's upload is
  // a real 404 too (decided here, before the preview loads in the browser).
  if (!z.string().uuid().safeParse(uploadId).success) notFound();
  if (!(await uploadExists(actor, uploadId))) notFound();
  return (
    <>
      <BackLink href="/data">Data</BackLink>
      {duplicate ? (
        <p role="status" className="mb-4 rounded-md border border-ink-line bg-paper-sunk px-3 py-2 text-sm">
          This exact file (same SHA-256) was uploaded before, so it was not stored again. This is that upload.
        </p>
      ) : null}
      <QueryProvider>
        <UploadPreview uploadId={uploadId} />
      </QueryProvider>
    </>
  );
}
