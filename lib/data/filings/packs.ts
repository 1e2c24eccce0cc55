/** A filing version's packs: what they are rendered from and the audited download. */
import "server-only";
import { and, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { filings } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import { PACK_KINDS, type PackKind } from "@/lib/validation/filings";
import type { FilingViewModel } from "@/reports/view-model";
import { packFileName } from "@/reports/file-names";
import { packContentKey, storedOrRenderPack, type PackRenderer, type PackSource } from "../packs";
import { FilingRowStatus, PackFile } from "./types";
import { findPeriod, firmOf, presentContent } from "./read";

/** The file name of a pack (reports/file-names.ts), e.g. northmoor-2026-11-v2-draft.docx. */
export { packFileName };

/**
 * What a filing version's packs are rendered from, as it is now (lib/data/packs.ts); another firm's is not found.
 * The content is read as stored text and keyed by its SHA-256 with the fields a read overlays (status, filing date,
 * reference); it is parsed only when a pack must be rendered.
 */
export async function packSource(actor: Actor, filingId: string): Promise<PackSource> {
  const [row] = await getDb()
    .select({ id: filings.id, periodId: filings.periodId, version: filings.version, status: filings.status, filedAt: filings.filedAt, filingReference: filings.filingReference, text: sql<string>`${filings.content}` })
    .from(filings)
    .where(and(eq(filings.id, filingId), eq(filings.firmId, actor.firmId)));
  if (!row) throw new AppError("not_found:filing", "No such filing.");
  const [firm, period] = await Promise.all([firmOf(actor), findPeriod(actor, row.periodId)]);
  const status = row.status as FilingRowStatus;
  return {
    firmId: actor.firmId,
    filingId: row.id,
    version: row.version,
    status,
    state: status === "signed" || status === "filed" || status === "superseded" ? status : "draft",
    contentKey: packContentKey(row.text, { status, filedAt: row.filedAt, filingReference: row.filingReference }),
    content: () => presentContent({ content: JSON.parse(row.text) as FilingViewModel, status, filedAt: row.filedAt, filingReference: row.filingReference }),
    fileName: (kind) => packFileName(firm.slug, period.periodEnd, row.version, status, kind),
  };
}

/**
 * One of the two packs of a filing version for download: the stored bytes of this version, state and content, or
 * rendered once, stored and served (lib/data/packs.ts); each download is recorded in the audit trail.
 */
export async function downloadPack(actor: Actor, filingId: string, kind: PackKind, render?: PackRenderer): Promise<PackFile> {
  const source = await packSource(actor, filingId);
  const pack = await storedOrRenderPack(source, kind, render);
  await getDb().transaction(async (tx) => {
    await recordAudit(tx, actor, {
      action: "filing.download",
      entityType: "filing",
      entityId: source.filingId,
      summary: `Downloaded the ${PACK_KINDS[kind].label} pack ${pack.fileName}`,
      detail: { kind, fileName: pack.fileName, version: source.version, status: source.status, bytes: pack.bytes.byteLength, sha256: pack.sha256 },
    });
  });
  return { fileName: pack.fileName, contentType: PACK_KINDS[kind].contentType, bytes: pack.bytes, sha256: pack.sha256 };
}
