/**
 * Uploaded files: received from the upload service, read and checked by a worker, previewed, then confirmed (or
 * cancelled) by a person. Nothing enters a period or the price history until it is confirmed, and what makes a
 * confirmation count is one short transaction (lib/data/uploads/confirm.ts).
 *
 * Two ways through, one set of steps:
 * - the web tier (upload service callback, routes): `receiveUpload`, `updateUploadOptions` and `requestConfirm`
 *   record the request and queue the "upload-read" / "upload-confirm" job; the worker runs `readUpload` and
 *   `applyConfirm`; the preview shows the job's progress;
 * - the demo seed, the tests and the benchmarks: `receiveUploadBytes` and `confirmUpload` run the same steps inline.
 */
import "server-only";
import { firmRow } from "@/lib/data/firm-row";
import { and, desc, eq, inArray, ne } from "drizzle-orm";
import { getDb } from "@/db/client";
import { uploads } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import { can } from "@/lib/auth/permissions";
import { now } from "@/lib/clock";
import { enqueue, isDuplicateJob, jobByKey } from "@/lib/jobs/queue";
import { POSITION_FIELDS } from "@/lib/uploads/parse-positions";
import { PRICE_FIELDS } from "@/lib/uploads/parse-prices";
import type { UploadKind } from "@/lib/uploads/parse-file";
import type { DateFormat, NumberFormat, Problem, ReadOptions } from "@/lib/uploads/types";
import { deleteStoredFiles, sha256 } from "@/lib/uploads/file-store";
import { assertPeriodTakesData } from "./periods";
import { markReadFailed, readUpload } from "./uploads/read";
import { applyConfirm, clearStaged } from "./uploads/confirm";
import { clearParts, readAll, readItems } from "./uploads/parts";

export type { UploadKind } from "@/lib/uploads/parse-file";
export type { ParsedUpload } from "@/lib/uploads/parse-file";
export { readUpload, markReadFailed } from "./uploads/read";
export { applyConfirm } from "./uploads/confirm";

/** Every state an upload can be in (db/schema/data.ts tells the order). */
export type UploadStatus = "reading" | "pending" | "duplicate" | "failed" | "confirming" | "confirmed" | "cancelled" | "superseded";

/** What the upload service's middleware established about the uploader (through the gate). */
export type UploadContext = {
  firmId: string;
  userId: string;
  userName: string;
  periodId: string | null;
  kind: UploadKind;
  numberFormat: NumberFormat;
  /** how text dates are written (ISO when absent) */
  dateFormat?: DateFormat;
};

/** Who may upload, confirm, cancel and re-read each kind of file (the routes of each kind take the same). */
export const UPLOAD_PERMISSION = { positions: "positions.upload", prices: "prices.upload" } as const;
const PERMISSION = UPLOAD_PERMISSION;
/** The dedupe keys of an upload's jobs: one read and one confirmation at a time. */
export const readJobKey = (uploadId: string) => `upload-read:${uploadId}`;
export const confirmJobKey = (uploadId: string) => `upload-confirm:${uploadId}`;
/** A read or confirmation is safe to run again (see lib/data/uploads/read.ts and confirm.ts). */
const UPLOAD_JOB_ATTEMPTS = 3;

function readOptionsOf(context: UploadContext): ReadOptions {
  return { numberFormat: context.numberFormat, ...(context.dateFormat && context.dateFormat !== "iso" ? { dateFormat: context.dateFormat } : {}) };
}

/** A new upload row, waiting to be read (its hash unknown until then when the bytes are not in hand). */
function readingRow(id: string, context: UploadContext, file: { key: string; name: string; ufsUrl: string }, known: { sha256: string; sizeBytes: number }): typeof uploads.$inferInsert {
  return {
    id,
    firmId: context.firmId,
    periodId: context.periodId,
    kind: context.kind,
    fileName: file.name.slice(0, 255),
    fileKey: file.key,
    fileUrl: file.ufsUrl,
    ...known,
    options: readOptionsOf(context),
    status: "reading",
    uploadedBy: context.userId,
  };
}

async function assertPeriodOrDropFile(context: UploadContext, fileKey: string) {
  if (!context.periodId) return;
  try {
    await assertPeriodTakesData(getDb(), context.firmId, context.periodId);
  } catch (error) {
    await deleteStoredFiles([fileKey]);
    throw error;
  }
}

/**
 * Record a file the upload service received and queue its reading: answers at once, before the file is fetched;
 * the worker reads, hashes and checks it (a file uploaded before is recognised then) while the preview shows how far
 * it has got.
 */
export async function receiveUpload(context: UploadContext, file: { key: string; name: string; size: number; ufsUrl: string }): Promise<{ uploadId: string; duplicate: boolean }> {
  await assertPeriodOrDropFile(context, file.key);
  const id = crypto.randomUUID();
  await getDb().transaction(async (tx) => {
    await tx.insert(uploads).values(readingRow(id, context, file, { sha256: "", sizeBytes: file.size }));
    await enqueue(tx, { kind: "upload-read", firmId: context.firmId, payload: { uploadId: id }, dedupeKey: readJobKey(id), maxAttempts: UPLOAD_JOB_ATTEMPTS });
  });
  return { uploadId: id, duplicate: false };
}

/** The same, read at once in this process, for bytes already in hand (the demo seed, the tests and the benchmarks). */
export async function receiveUploadBytes(context: UploadContext, file: { key: string; name: string; ufsUrl: string }, bytes: Uint8Array): Promise<{ uploadId: string; duplicate: boolean }> {
  const db = getDb();
  const hash = sha256(bytes);
  const [same] = await db
    .select({ id: uploads.id })
    .from(uploads)
    .where(
      and(
        eq(uploads.firmId, context.firmId),
        eq(uploads.kind, context.kind),
        eq(uploads.sha256, hash),
        context.periodId ? eq(uploads.periodId, context.periodId) : eq(uploads.kind, "prices"),
        inStatuses(["pending", "confirming", "confirmed"]),
      ),
    )
    .limit(1);
  if (same) {
    await deleteStoredFiles([file.key]);
    return { uploadId: same.id, duplicate: true };
  }
  await assertPeriodOrDropFile(context, file.key);
  const id = crypto.randomUUID();
  await db.insert(uploads).values(readingRow(id, context, file, { sha256: hash, sizeBytes: bytes.length }));
  try {
    await readUpload(context.firmId, id, { bytes });
  } catch (error) {
    await markReadFailed(db, context.firmId, id, error instanceof Error ? error.message : String(error));
    throw error;
  }
  return { uploadId: id, duplicate: false };
}

/** The upload's status is one of these. */
function inStatuses(statuses: UploadStatus[]) {
  return inArray(uploads.status, statuses);
}

async function getUploadRow(actor: Actor, uploadId: string) {
  return firmRow(uploads, actor.firmId, uploadId, "not_found:upload", "No such upload.");
}

/** The actor's firm has this upload and it is of `kind` (each kind has its own routes): else not found. */
export async function assertUploadKind(actor: Actor, uploadId: string, kind: UploadKind): Promise<void> {
  const [row] = await getDb().select({ id: uploads.id }).from(uploads).where(and(eq(uploads.id, uploadId), eq(uploads.firmId, actor.firmId), eq(uploads.kind, kind)));
  if (!row) throw new AppError("not_found:upload", "No such upload.");
}

/** Whether the actor's firm has this upload (the preview page answers a real 404 otherwise). */
export async function uploadExists(actor: Actor, uploadId: string): Promise<boolean> {
  const [row] = await getDb().select({ id: uploads.id }).from(uploads).where(and(eq(uploads.id, uploadId), eq(uploads.firmId, actor.firmId)));
  return Boolean(row);
}

export interface UploadListItem {
  id: string;
  kind: UploadKind;
  periodId: string | null;
  fileName: string;
  status: string;
  rowCount: number;
  errorCount: number;
  warningCount: number;
  createdAt: string;
  confirmedAt: string | null;
  supersededBy: string | null;
  sha256: string;
}

function listItem(r: typeof uploads.$inferSelect): UploadListItem {
  return {
    id: r.id,
    kind: r.kind as UploadKind,
    periodId: r.periodId,
    fileName: r.fileName,
    status: r.status,
    rowCount: r.rowCount,
    errorCount: r.errorCount,
    warningCount: r.warningCount,
    createdAt: r.createdAt,
    confirmedAt: r.confirmedAt,
    supersededBy: r.supersededBy,
    sha256: r.sha256,
  };
}

/** The firm's uploads, newest first, optionally for one period or kind (a second copy of a file is not listed). */
export async function listUploads(actor: Actor, filter: { periodId?: string; kind?: UploadKind } = {}): Promise<UploadListItem[]> {
  const conditions = [eq(uploads.firmId, actor.firmId), ne(uploads.status, "duplicate")];
  if (filter.periodId) conditions.push(eq(uploads.periodId, filter.periodId));
  if (filter.kind) conditions.push(eq(uploads.kind, filter.kind));
  const rows = await getDb().select().from(uploads).where(and(...conditions)).orderBy(desc(uploads.createdAt));
  return rows.map(listItem);
}

/** Where an upload's reading or confirmation job stands (for the preview's progress), or null. */
async function uploadJob(uploadId: string, status: string) {
  const key = status === "reading" ? readJobKey(uploadId) : status === "confirming" ? confirmJobKey(uploadId) : null;
  if (!key) return null;
  const job = await jobByKey(getDb(), key);
  return job ? { state: job.state, stage: job.stage, progress: job.progress, error: job.error } : null;
}

/** An upload with its full problem list and totals, for the preview screen (and its job's progress while one runs). */
export async function getUploadPreview(actor: Actor, uploadId: string) {
  const row = await getUploadRow(actor, uploadId);
  const summary = row.summary ?? null;
  const problems = row.status === "pending" ? ((await readAll(getDb(), actor.firmId, uploadId, "problems")) as Problem[]) : ((row.problems ?? []) as Problem[]);
  return {
    upload: { ...listItem(row), options: row.options, summary: row.summary, sizeBytes: row.sizeBytes },
    canConfirm: can(actor, PERMISSION[row.kind as UploadKind]),
    reportingCurrency: actor.reportingCurrency,
    problems,
    header: row.status === "pending" ? (summary?.header ?? []) : [],
    missingColumns: row.status === "pending" ? (summary?.missingColumns ?? []) : [],
    fields: row.kind === "positions"
      ? Object.entries(POSITION_FIELDS).map(([key, f]) => ({ key, label: f.label, required: f.required }))
      : Object.entries(PRICE_FIELDS).map(([key, f]) => ({ key, label: f.label, required: f.required })),
    summary: row.summary,
    job: await uploadJob(uploadId, row.status),
  };
}

/** One page of an upload's parsed rows (valid rows only; problems are listed separately). */
export async function getUploadRows(actor: Actor, uploadId: string, page: number, pageSize: number) {
  const row = await getUploadRow(actor, uploadId);
  if (row.status !== "pending") throw new AppError("conflict:upload", "Only an upload waiting for confirmation has a preview.");
  const rows = await readItems(getDb(), actor.firmId, uploadId, "rows", (page - 1) * pageSize, Math.min(row.rowCount, page * pageSize));
  return { total: row.rowCount, page, pageSize, rows };
}

/** Change how an upload is read (number format, header mapping) and queue its reading again. */
export async function updateUploadOptions(actor: Actor, uploadId: string, options: ReadOptions) {
  const row = await getUploadRow(actor, uploadId);
  if (!can(actor, PERMISSION[row.kind as UploadKind])) throw new AppError("forbidden:upload");
  if (row.status !== "pending" && row.status !== "failed") throw new AppError("conflict:upload", `This upload is ${row.status}; only a pending upload can be re-read.`);
  const fields = row.kind === "positions" ? POSITION_FIELDS : PRICE_FIELDS;
  for (const [field, header] of Object.entries(options.mapping ?? {})) {
    if (!(field in fields)) throw new AppError("unprocessable:upload", `Unknown field "${field}" in the column mapping.`, { [`mapping.${field}`]: "Unknown field." });
    if (header.length > 200) throw new AppError("unprocessable:upload", "A column name is too long.", { [`mapping.${field}`]: "Too long." });
  }
  try {
    await getDb().transaction(async (tx) => {
      const claimed = await tx
        .update(uploads)
        .set({ options: { ...options }, status: "reading", summary: row.summary ?? {} })
        .where(and(eq(uploads.id, uploadId), eq(uploads.firmId, actor.firmId), eq(uploads.status, row.status)))
        .returning({ id: uploads.id });
      if (claimed.length === 0) throw new AppError("conflict:upload", "This upload was changed meanwhile; reload the page.");
      await enqueue(tx, { kind: "upload-read", firmId: actor.firmId, payload: { uploadId }, dedupeKey: readJobKey(uploadId), maxAttempts: UPLOAD_JOB_ATTEMPTS });
      await recordAudit(tx, actor, { action: "upload.options", entityType: "upload", entityId: uploadId, summary: `Changed how "${row.fileName}" is read`, detail: { options } });
    });
  } catch (error) {
    if (isDuplicateJob(error)) throw new AppError("conflict:upload", "This file is being read already.");
    throw error;
  }
  return getUploadPreview(actor, uploadId);
}

/** Cancel an upload not yet decided: nothing of it enters the period or the price history. */
export async function cancelUpload(actor: Actor, uploadId: string) {
  const row = await getUploadRow(actor, uploadId);
  if (!can(actor, PERMISSION[row.kind as UploadKind])) throw new AppError("forbidden:upload");
  if (!["pending", "reading", "failed"].includes(row.status)) throw new AppError("conflict:upload", `This upload is already ${row.status}.`);
  await getDb().transaction(async (tx) => {
    const done = await tx
      .update(uploads)
      .set({ status: "cancelled", cancelledAt: now().toISOString() })
      .where(and(eq(uploads.id, uploadId), eq(uploads.firmId, actor.firmId), eq(uploads.status, row.status)))
      .returning({ id: uploads.id });
    if (done.length === 0) throw new AppError("conflict:upload", "This upload was changed meanwhile; reload the page.");
    await clearParts(tx, actor.firmId, uploadId);
    await clearStaged(tx, actor.firmId, uploadId, row.kind);
    await recordAudit(tx, actor, { action: "upload.cancel", entityType: "upload", entityId: uploadId, summary: `Cancelled ${row.kind} file "${row.fileName}"` });
  });
  return { status: "cancelled" };
}

/** The checks before a confirmation: the person may, the upload waits, it has no errors, its warnings are acknowledged. */
async function checkConfirmable(actor: Actor, uploadId: string, input: { acknowledgeWarnings: boolean }) {
  const row = await getUploadRow(actor, uploadId);
  const kind = row.kind as UploadKind;
  if (!can(actor, PERMISSION[kind])) throw new AppError("forbidden:upload");
  if (row.status !== "pending") throw new AppError("conflict:upload", `This upload is already ${row.status}.`);
  const rejectedFile = Boolean(row.summary && "rejected" in row.summary);
  if (rejectedFile || row.errorCount > 0) {
    const errors = row.errorCount || 1;
    throw new AppError("unprocessable:upload", `The file has ${errors} error${errors === 1 ? "" : "s"}; fix the file and upload it again. Nothing was stored.`);
  }
  const warnings = row.warningCount;
  if (warnings > 0 && !input.acknowledgeWarnings) {
    throw new AppError("unprocessable:upload", `Acknowledge the ${warnings} warning${warnings === 1 ? "" : "s"} before confirming.`, { acknowledgeWarnings: "Required when there are warnings." });
  }
  if (kind === "positions") {
    if (!row.periodId) throw new AppError("unprocessable:upload", "A positions upload must belong to a period.");
    await assertPeriodTakesData(getDb(), actor.firmId, row.periodId);
  }
  return { row, warnings };
}

/** Confirm from the web tier: the checks, then the upload is "confirming" and the worker stores it (answers at once). */
export async function requestConfirm(actor: Actor, uploadId: string, input: { acknowledgeWarnings: boolean }) {
  const { warnings } = await checkConfirmable(actor, uploadId, input);
  try {
    await getDb().transaction(async (tx) => {
      const claimed = await tx
        .update(uploads)
        .set({ status: "confirming", confirmedBy: actor.userId })
        .where(and(eq(uploads.id, uploadId), eq(uploads.firmId, actor.firmId), eq(uploads.status, "pending")))
        .returning({ id: uploads.id });
      if (claimed.length === 0) throw new AppError("conflict:upload", "This upload was confirmed or cancelled meanwhile.");
      await enqueue(tx, {
        kind: "upload-confirm",
        firmId: actor.firmId,
        payload: { uploadId, userId: actor.userId, userName: actor.name, warningsAcknowledged: warnings },
        dedupeKey: confirmJobKey(uploadId),
        maxAttempts: UPLOAD_JOB_ATTEMPTS,
      });
    });
  } catch (error) {
    if (isDuplicateJob(error)) throw new AppError("conflict:upload", "This upload is being confirmed already.");
    throw error;
  }
  return { status: "confirming" as const };
}

/**
 * Confirm a pending upload here and now (the demo seed, the tests, the benchmarks). Positions: the period's earlier
 * confirmed positions upload is marked superseded and this one's rows are stored. Prices: new points extend the
 * history; a changed price is a correction that keeps the old point (no longer current).
 */
export async function confirmUpload(actor: Actor, uploadId: string, input: { acknowledgeWarnings: boolean }) {
  const { warnings } = await checkConfirmable(actor, uploadId, input);
  return applyConfirm(actor.firmId, uploadId, { from: "pending", by: { userId: actor.userId, name: actor.name }, warningsAcknowledged: warnings });
}

/** A confirmation job that gave up: the upload waits again, saying why (what it staged is cleared on the next try). */
export async function confirmGivenUp(firmId: string, uploadId: string, reason: string): Promise<void> {
  const db = getDb();
  const [row] = await db.select({ summary: uploads.summary }).from(uploads).where(and(eq(uploads.id, uploadId), eq(uploads.firmId, firmId)));
  await db
    .update(uploads)
    .set({ status: "pending", summary: { ...(row?.summary ?? {}), confirmError: reason } })
    .where(and(eq(uploads.id, uploadId), eq(uploads.firmId, firmId), eq(uploads.status, "confirming")));
}
