import type { PackFile } from "@/lib/data/filings";

/** A pack as a download: its content type, its file name, never cached. */
export function packResponse(pack: PackFile): Response {
  return new Response(Buffer.from(pack.bytes), {
    status: 200,
    headers: {
      "content-type": pack.contentType,
      "content-disposition": `attachment; filename="${pack.fileName}"`,
      "content-length": String(pack.bytes.byteLength),
      "cache-control": "no-store",
      "x-content-type-options": "nosniff",
    },
  });
}
