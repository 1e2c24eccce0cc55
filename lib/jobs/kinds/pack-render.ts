/**
 * "pack-render": render and store both filing packs (Word, workbook) of one filing version as it is now
 * (lib/data/packs.ts storedOrRenderPack), so a download reads stored bytes. Payload `{ filingId }`; enqueued in the
 * transaction that assembles, edits, submits, sends back, signs, files or supersedes the version (enqueuePackRender).
 * Safe to run again: a pack already stored for the version, state and content is not rendered again.
 */
import "server-only";
import { filingPayloadSchema, readPayload } from "../payload";
import type { JobKind } from "../types";
import { firmWorkerActor } from "./firm-actor";

export const packRenderJob: JobKind = {
  async handle(context) {
    const { packSource } = await import("@/lib/data/filings");
    const { storedOrRenderPack, PACK_FORMATS } = await import("@/lib/data/packs");
    const { filingId } = readPayload(context.job, filingPayloadSchema);
    const actor = await firmWorkerActor(context.db, context.job.firmId);
    const source = await packSource(actor, filingId);
    const done: { format: string; sha256: string; rendered: boolean }[] = [];
    for (const [i, kind] of PACK_FORMATS.entries()) {
      if (context.signal.aborted) break;
      await context.progress(kind === "docx" ? "rendering the Word pack" : "rendering the workbook pack", i / PACK_FORMATS.length);
      const pack = await storedOrRenderPack(source, kind);
      done.push({ format: kind, sha256: pack.sha256, rendered: pack.rendered });
    }
    await context.progress("stored", 1);
    return { filingId, version: source.version, state: source.state, packs: done };
  },
  backoffMs: (attempt) => 5_000 * attempt,
};
