/**
 * Stored filing packs: each pack is rendered once per filing version, state (draft, signed, filed, superseded),
 * format and content, stored with its SHA-256 (pack_files; a trigger keeps stored rows unchanged), and a download
 * serves the stored bytes. The worker renders them ahead ("pack-render" jobs, lib/jobs/kinds/pack-render.ts),
 * enqueued in the transaction that assembles, edits, submits, signs, files or makes a new version of a filing; a
 * download of a pack not stored yet renders it once, stores it and serves it.
 *
 * A draft's content changes under one state (cover note, explanations, a rebuild), so the row's key includes the
 * SHA-256 of the content the pack was rendered from: a pack is never served for other content than the filing's now.
 */
import "server-only";
import { createHash } from "node:crypto";
import { and, desc, eq, inArray, ne } from "drizzle-orm";
import { getDb, type Database, type Tx } from "@/db/client";
import { jobs, packFiles } from "@/db/schema";
import { enqueueLatest } from "@/lib/jobs/queue";
import type { PackKind } from "@/lib/validation/filings";
import type { FilingViewModel } from "@/reports/view-model";
import { buildWordPack } from "@/reports/docx/filing-pack";
import { buildWorkbookPack } from "@/reports/xlsx/filing-pack";

export const PACK_FORMATS: readonly PackKind[] = ["docx", "xlsx"];

/** What a pack is rendered from: one filing version as it is now (lib/data/filings.ts packSource). */
export interface PackSource {
  firmId: string;
  filingId: string;
  version: number;
  /** the version's row status (draft, in_review, …, signed, filed, superseded) */
  status: string;
  /** the state in the pack's name: draft | signed | filed | superseded */
  state: string;
  /** SHA-256 of the stored content and the fields a read overlays on it (packContentKey) */
  contentKey: string;
  /** the content as a read presents it (parsed on demand: only a render needs it) */
  content(): FilingViewModel;
  fileName(kind: PackKind): string;
}

export interface StoredPack {
  fileName: string;
  sha256: string;
  bytes: Uint8Array;
  /** true when this call rendered it (nothing was stored for this version, state and content) */
  rendered: boolean;
}

/** Renders a pack's bytes from the filing content. Injectable, so tests count renders. */
export type PackRenderer = (content: FilingViewModel, kind: PackKind) => Promise<Uint8Array>;

/** How many packs this process rendered. */
export const packRenders = { count: 0 };

export const renderPack: PackRenderer = async (content, kind) => {
  packRenders.count++;
  const built = kind === "docx" ? await buildWordPack(content) : await buildWorkbookPack(content);
  return built instanceof Uint8Array ? built : new Uint8Array(built as ArrayBuffer);
};

/** The SHA-256 of the content a pack is rendered from: the stored content text and the status, filing date and
 * reference a read overlays on it. */
export function packContentKey(storedText: string, overlay: { status: string; filedAt: string | null; filingReference: string | null }): string {
  return createHash("sha256").update(storedText).update("\u0000").update(JSON.stringify([overlay.status, overlay.filedAt, overlay.filingReference])).digest("hex");
}

const sha256Of = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

async function findStored(db: Database | Tx, source: PackSource, kind: PackKind, contentKey: string) {
  const [row] = await db
    .select({ fileName: packFiles.fileName, sha256: packFiles.sha256, bytes: packFiles.bytes })
    .from(packFiles)
    .where(
      and(
        eq(packFiles.firmId, source.firmId),
        eq(packFiles.filingId, source.filingId),
        eq(packFiles.version, source.version),
        eq(packFiles.state, source.state),
        eq(packFiles.format, kind),
        eq(packFiles.contentKey, contentKey),
      ),
    );
  return row ?? null;
}

// One rendering per pack at a time in this process: a second download waits for the first one's bytes.
const inFlight = new Map<string, Promise<StoredPack>>();

/** The stored pack of this version, state and content; rendered, stored and served when there is none yet. */
export async function storedOrRenderPack(source: PackSource, kind: PackKind, render: PackRenderer = renderPack): Promise<StoredPack> {
  const contentKey = source.contentKey;
  const found = await findStored(getDb(), source, kind, contentKey);
  if (found) return { fileName: found.fileName, sha256: found.sha256, bytes: new Uint8Array(found.bytes), rendered: false };
  const flight = `${source.filingId}|${source.version}|${source.state}|${kind}|${contentKey}`;
  const running = inFlight.get(flight);
  if (running) return running;
  const work = (async (): Promise<StoredPack> => {
    const bytes = await render(source.content(), kind);
    const sha256 = sha256Of(bytes);
    const fileName = source.fileName(kind);
    return getDb().transaction(async (tx) => {
      const inserted = await tx
        .insert(packFiles)
        .values({ firmId: source.firmId, filingId: source.filingId, version: source.version, state: source.state, format: kind, contentKey, fileName, sha256, sizeBytes: bytes.byteLength, bytes: Buffer.from(bytes) })
        .onConflictDoNothing()
        .returning({ id: packFiles.id });
      if (inserted.length === 0) {
        // another process stored it meanwhile: serve that one, so every download of this pack is the same bytes
        const other = (await findStored(tx, source, kind, contentKey))!;
        return { fileName: other.fileName, sha256: other.sha256, bytes: new Uint8Array(other.bytes), rendered: false };
      }
      // a draft's earlier renderings (its content since changed) are never served again
      if (source.state === "draft") {
        await tx
          .delete(packFiles)
          .where(and(eq(packFiles.firmId, source.firmId), eq(packFiles.filingId, source.filingId), eq(packFiles.format, kind), eq(packFiles.state, "draft"), ne(packFiles.contentKey, contentKey)));
      }
      return { fileName, sha256, bytes, rendered: true };
    });
  })();
  inFlight.set(flight, work);
  try {
    return await work;
  } finally {
    inFlight.delete(flight);
  }
}

/** Where a pack stands for the page: stored (with its SHA-256) or being prepared (the render job's progress). */
export type PackState =
  | { kind: PackKind; stored: true; sha256: string; sizeBytes: number }
  | { kind: PackKind; stored: false; job: { state: string; stage: string | null; progress: number | null; error: string | null } | null };

/** The packs of a filing version as it is now, and the newest render job for it. */
export async function packStates(source: PackSource): Promise<PackState[]> {
  const contentKey = source.contentKey;
  const db = getDb();
  const rows = await db
    .select({ format: packFiles.format, sha256: packFiles.sha256, sizeBytes: packFiles.sizeBytes })
    .from(packFiles)
    .where(and(eq(packFiles.firmId, source.firmId), eq(packFiles.filingId, source.filingId), eq(packFiles.version, source.version), eq(packFiles.state, source.state), eq(packFiles.contentKey, contentKey)));
  const [job] = await db
    .select({ state: jobs.state, stage: jobs.stage, progress: jobs.progress, error: jobs.error })
    .from(jobs)
    .where(and(eq(jobs.firmId, source.firmId), eq(jobs.kind, "pack-render"), inArray(jobs.dedupeKey, packJobKeys(source.filingId))))
    .orderBy(desc(jobs.createdAt))
    .limit(1);
  return PACK_FORMATS.map((kind): PackState => {
    const row = rows.find((r) => r.format === kind);
    return row ? { kind, stored: true, sha256: row.sha256, sizeBytes: row.sizeBytes } : { kind, stored: false, job: job ?? null };
  });
}

/** The dedupe keys of a filing's render jobs: one queued or running under each, the second for a state that changed
 * while the first was rendering. */
export function packJobKeys(filingId: string): [string, string] {
  return [`pack-render:${filingId}`, `pack-render:${filingId}:next`];
}

/**
 * Ask the worker to render a filing's packs as the filing is now, inside the caller's transaction (so the job
 * exists exactly when the change does). A job still queued for the filing renders the newest state when it runs, so
 * none is added then; while one runs, the next one is queued under the second key. A download renders what is still
 * missing in any case.
 */
export async function enqueuePackRender(tx: Tx, firmId: string, filingIds: string[]): Promise<void> {
  for (const filingId of filingIds) await enqueueLatest(tx, { kind: "pack-render", firmId, payload: { filingId }, maxAttempts: 3 }, packJobKeys(filingId));
}
