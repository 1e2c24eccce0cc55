import type { PackFile } from "@/lib/data/filings";

/**
 * A pack as a download: its content type, its file name, never cached; the stored SHA-256 of its bytes as the ETag
 * and, in hex, in `X-Ballast-Pack-SHA256` (the same figure the filing page and the audit record show).
 */
export function packResponse(pack: PackFile): Response {
  return new Response(Buffer.from(pack.bytes), {
    status: 200,
    headers: {
      "content-type": pack.contentType,
      "content-disposition": `attachment; filename="${pack.fileName}"`,
      "content-length": String(pack.bytes.byteLength),
      "cache-control": "no-store",
      etag: `"${pack.sha256}"`,
      "x-ballast-pack-sha256": pack.sha256,
      "x-content-type-options": "nosniff",
    },
  });
}
