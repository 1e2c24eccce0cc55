/**
 * The one file name of a pack: firm slug, period, version and state, e.g. "northmoor-2026-11-v2-draft.docx" — lower-case
 * ASCII letters, digits and hyphens (the firm's slug is stored that way), safe on every file system and in a
 * Content-Disposition header. Pure.
 */
import type { FilingStatus } from "./view-model";

/** A version's state in the name: signed, filed and superseded versions say so; everything before signing is a draft. */
function packState(status: FilingStatus | "superseded"): string {
  return status === "signed" || status === "filed" || status === "superseded" ? status : "draft";
}

/** The file name of a pack: firm, period, version and state, e.g. northmoor-2026-11-v2-draft.docx. */
export function packFileName(slug: string, periodEnd: string, version: number, status: FilingStatus | "superseded", kind: "docx" | "xlsx"): string {
  return `${slug}-${periodEnd.slice(0, 7)}-v${version}-${packState(status)}.${kind}`;
}
