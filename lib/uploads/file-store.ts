/**
 * The bytes of uploaded files live with the upload service (the hosted one, or the loopback stand-in). Ballast
 * keeps the URL and the SHA-256, reads the bytes back when it needs them, and checks the hash every time.
 */
import "server-only";
import { createHash } from "node:crypto";
import { UTApi } from "uploadthing/server";
import { AppError } from "@/lib/errors";

/** SHA-256 of bytes, hex. */
export function sha256(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/** Fetch a stored file; a store that is down or answers an error becomes a clear 503. */
export async function fetchStoredFile(url: string, expectedSha256?: string): Promise<Uint8Array> {
  let response: Response | null = null;
  // Twice: a kept-alive connection the store closed meanwhile fails the first request without the store being down.
  for (let attempt = 1; attempt <= 2 && !response; attempt++) {
    try {
      response = await fetch(url, { cache: "no-store" });
    } catch (error) {
      if (attempt === 2) {
        console.warn("[ballast] the file store did not answer", error instanceof Error ? `${error.message} ${String((error as { cause?: unknown }).cause ?? "")}` : error);
        throw new AppError("unavailable:file_store", "The file store is not answering. Nothing was changed; try again in a moment.");
      }
    }
  }
  if (!response) throw new AppError("unavailable:file_store", "The file store is not answering. Nothing was changed; try again in a moment.");
  if (!response.ok) throw new AppError("unavailable:file_store", `The file store answered ${response.status} for this file. Nothing was changed; try again, or upload the file again.`);
  const bytes = new Uint8Array(await response.arrayBuffer());
  if (expectedSha256 && sha256(bytes) !== expectedSha256) {
    throw new AppError("conflict:file_store", "The stored file no longer matches the file that was uploaded (its SHA-256 differs). Upload it again.");
  }
  return bytes;
}

/** Remove files from the upload service (a duplicate, or a cancelled upload's file). Failures are logged only. */
export async function deleteStoredFiles(keys: string[]): Promise<void> {
  if (keys.length === 0) return;
  try {
    await new UTApi().deleteFiles(keys);
  } catch (error) {
    console.warn("[ballast] could not delete stored upload files", keys, error instanceof Error ? error.message : error);
  }
}
