/**
 * Reading an uploaded file (the "upload-read" job, or inline for the seed and the tests): fetch the stored bytes,
 * hash them, recognise a file uploaded before, check every row, store what was read in parts, and leave the upload
 * waiting for a person ("pending"). Safe to run again: a read of an upload no longer "reading" does nothing.
 */
import "server-only";
import { firmRow } from "@/lib/data/firm-row";
import { and, eq, inArray, isNull, ne } from "drizzle-orm";
import { getDb, type Database, type Tx } from "@/db/client";
import { capitalRuleProfiles, firms, instruments, pricePoints, reportingPeriods, uploads, users } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import { today } from "@/lib/clock";
import { countOf } from "@/lib/text/count";
import { parseFile, rejected, type ParsedUpload, type ParseFileContext, type UploadKind } from "@/lib/uploads/parse-file";
import { deleteStoredFiles, fetchStoredFile, sha256 } from "@/lib/uploads/file-store";
import type { ParseProgress, ReadOptions } from "@/lib/uploads/types";
import type { UploadSummary } from "@/lib/uploads/summary";
import type { StandardisedProfile } from "@/lib/risk/standardised";
import { standardisedProfileOfRow } from "../capital-profile";
import { assertPeriodTakesData } from "../periods";
import { clearParts, writeParts } from "./parts";

/** How many problems are stored on the upload row itself (the full list is in its parts). */
export const STORED_PROBLEMS = 500;

/** Parses a file: parseFile inline, or parseInThread in the job worker. */
export type FileParser = (bytes: Uint8Array, kind: UploadKind, options: ReadOptions, context: ParseFileContext, onProgress?: ParseProgress, signal?: AbortSignal) => Promise<ParsedUpload>;

/** How a read is run: the bytes when already in hand, the parser, and where progress goes. */
export interface ReadHow {
  bytes?: Uint8Array;
  parse?: FileParser;
  /** stage and fraction 0..1 (the job's progress) */
  progress?: (stage: string, fraction: number) => Promise<unknown>;
  /** aborted when the worker lost the job: stop, store nothing more */
  signal?: AbortSignal;
}

export type ReadOutcome = { status: "pending"; rows: number; errors: number } | { status: "duplicate"; duplicateOf: string } | { status: "failed"; message: string } | { status: string };

/** Rates to the reporting currency on or before `asOf`, from the firm's `CCY` + reporting-currency series. */
async function fxRates(db: Database, firmId: string, reportingCurrency: string, asOf: string): Promise<{ rates: Record<string, number>; dates: Record<string, string> }> {
  const pairs = await db.select().from(instruments).where(and(eq(instruments.firmId, firmId), isNull(instruments.pendingUpload)));
  const rates: Record<string, number> = {};
  const dates: Record<string, string> = {};
  for (const pair of pairs.filter((p) => /^[A-Z]{3}[A-Z]{3}$/.test(p.code) && p.code.endsWith(reportingCurrency))) {
    const points = await db
      .select({ date: pricePoints.date, close: pricePoints.close })
      .from(pricePoints)
      .where(and(eq(pricePoints.firmId, firmId), eq(pricePoints.instrumentId, pair.id), eq(pricePoints.current, true)));
    const latest = points.filter((p) => p.date <= asOf).sort((a, b) => (a.date < b.date ? 1 : -1))[0];
    if (latest) {
      rates[pair.code.slice(0, 3)] = latest.close;
      dates[pair.code.slice(0, 3)] = latest.date;
    }
  }
  return { rates, dates };
}

/** The standardised rates when the firm's capital rule profile in force files that figure (its positions then need their attributes); null otherwise. */
async function filedStandardisedProfile(db: Database, firmId: string): Promise<StandardisedProfile | null> {
  const [profile] = await db
    .select({ filedRegime: capitalRuleProfiles.filedRegime, standardised: capitalRuleProfiles.standardised, showRwa: capitalRuleProfiles.showRwa })
    .from(capitalRuleProfiles)
    .where(and(eq(capitalRuleProfiles.firmId, firmId), eq(capitalRuleProfiles.active, true)))
    .limit(1);
  return profile?.filedRegime === "standardised" ? standardisedProfileOfRow(profile) : null;
}

/** What the checks of a file of `kind` need from the firm and the period. */
export async function parseContextFor(db: Database, firmId: string, kind: UploadKind, periodId: string | null): Promise<ParseFileContext> {
  const [firm] = await db.select({ reportingCurrency: firms.reportingCurrency }).from(firms).where(eq(firms.id, firmId));
  if (!firm) throw new AppError("not_found:firm", "No such firm.");
  const [period] = periodId ? await db.select({ periodEnd: reportingPeriods.periodEnd }).from(reportingPeriods).where(and(eq(reportingPeriods.id, periodId), eq(reportingPeriods.firmId, firmId))) : [];
  const base = { today: today(), reportingCurrency: firm.reportingCurrency, periodEnd: period?.periodEnd };
  if (kind === "prices") return base;
  const fx = await fxRates(db, firmId, firm.reportingCurrency, period?.periodEnd ?? today());
  return { ...base, fxToReporting: fx.rates, fxDates: fx.dates, filedStandardisedProfile: await filedStandardisedProfile(db, firmId) };
}

/** Errors, warnings and rows of a parse. */
export function counts(parsed: ParsedUpload) {
  const errors = parsed.problems.filter((p) => p.severity === "error").length;
  return {
    errorCount: errors,
    warningCount: parsed.problems.length - errors,
    rowCount: parsed.kind === "positions" ? parsed.rows.length : parsed.kind === "prices" ? parsed.points.length : 0,
  };
}

/** The summary stored on the upload row: totals, layout, the file's header and the columns it lacks. */
export function summaryOf(parsed: ParsedUpload): UploadSummary {
  if (parsed.kind === "positions") return { totals: parsed.totals, source: parsed.source, header: parsed.header.slice(0, 500), missingColumns: parsed.missingColumns, rates: parsed.rates ?? [] };
  if (parsed.kind === "prices") return { ...parsed.summary, layout: parsed.layout, source: parsed.source, header: parsed.header.slice(0, 500), missingColumns: parsed.missingColumns };
  return { rejected: parsed.message };
}

/** Mark an upload that could not be read (its file refused, its period closed, its reading interrupted). */
export async function markReadFailed(db: Database, firmId: string, uploadId: string, message: string): Promise<void> {
  const failed = rejected(message);
  await db
    .update(uploads)
    .set({ status: "failed", summary: { rejected: message }, problems: failed.problems, errorCount: 1, warningCount: 0, rowCount: 0 })
    .where(and(eq(uploads.id, uploadId), eq(uploads.firmId, firmId), eq(uploads.status, "reading")));
}

/** Read, check and store an upload that is "reading". */
export async function readUpload(firmId: string, uploadId: string, how: ReadHow = {}): Promise<ReadOutcome> {
  const db = getDb();
  const report = how.progress ?? (async () => undefined);
  const row = await firmRow(uploads, firmId, uploadId, "not_found:upload", "No such upload.", db);
  if (row.status !== "reading") return { status: row.status };
  const kind = row.kind as UploadKind;
  const stillOurs = () => !how.signal?.aborted;

  await report("Fetching the file", 0.02);
  const bytes = how.bytes ?? (await fetchStoredFile(row.fileUrl, row.sha256 || undefined));
  const hash = sha256(bytes);
  if (!row.sha256) {
    // The same file (by SHA-256) for the same purpose is not stored twice.
    const [same] = await db
      .select({ id: uploads.id })
      .from(uploads)
      .where(
        and(
          eq(uploads.firmId, firmId),
          eq(uploads.kind, kind),
          eq(uploads.sha256, hash),
          ne(uploads.id, uploadId),
          row.periodId ? eq(uploads.periodId, row.periodId) : eq(uploads.kind, "prices"),
          inArray(uploads.status, ["pending", "confirming", "confirmed"]),
        ),
      )
      .limit(1);
    if (same) {
      await db
        .update(uploads)
        .set({ status: "duplicate", sha256: hash, sizeBytes: bytes.length, summary: { duplicateOf: same.id } })
        .where(and(eq(uploads.id, uploadId), eq(uploads.firmId, firmId), eq(uploads.status, "reading")));
      await deleteStoredFiles([row.fileKey]);
      return { status: "duplicate", duplicateOf: same.id };
    }
  }
  if (row.periodId) {
    try {
      await assertPeriodTakesData(db, firmId, row.periodId);
    } catch (error) {
      if (!(error instanceof AppError)) throw error;
      await markReadFailed(db, firmId, uploadId, error.message);
      return { status: "failed", message: error.message };
    }
  }

  const options: ReadOptions = row.options ?? { numberFormat: "plain" };
  const context = await parseContextFor(db, firmId, kind, row.periodId);
  await report("Checking the rows", 0.05);
  const parse = how.parse ?? ((b, k, o, c, p) => parseFile(b, k, o, c, p));
  const parsed = await parse(bytes, kind, options, context, (done, total) => void report(`Checked ${countOf(done, "row")} of ${total.toLocaleString("en")}`, 0.05 + 0.75 * (done / Math.max(1, total))).catch(() => undefined), how.signal);
  if (!stillOurs()) throw new Error("Stopped: the worker no longer holds this job.");

  await report("Storing the preview", 0.82);
  await clearParts(db, firmId, uploadId);
  const items = parsed.kind === "positions" ? parsed.rows : parsed.kind === "prices" ? parsed.points : [];
  await writeParts(db, firmId, uploadId, "rows", items, stillOurs);
  await writeParts(db, firmId, uploadId, "problems", parsed.problems, stillOurs);

  const tally = counts(parsed);
  // the receipt is audited once, by the read that first gets through (a handed-over file has no hash until then)
  const firstRead = row.summary === null || row.sha256 === "";
  const stored = await db.transaction(async (tx) => {
    const done = await tx
      .update(uploads)
      .set({ status: "pending", sha256: hash, sizeBytes: bytes.length, summary: summaryOf(parsed), problems: parsed.problems.slice(0, STORED_PROBLEMS), ...tally })
      .where(and(eq(uploads.id, uploadId), eq(uploads.firmId, firmId), eq(uploads.status, "reading")))
      .returning({ id: uploads.id });
    if (done.length === 0) return false;
    if (firstRead) {
      const [person] = await tx.select({ userId: uploads.uploadedBy }).from(uploads).where(eq(uploads.id, uploadId));
      await recordAudit(tx, { userId: person.userId, name: await uploaderName(tx, person.userId), firmId }, {
        action: "upload.receive",
        entityType: "upload",
        entityId: uploadId,
        summary: `Received ${kind} file "${row.fileName}" (${bytes.length.toLocaleString("en")} bytes, SHA-256 ${hash.slice(0, 12)}…)`,
        detail: { sha256: hash, periodId: row.periodId, ...tally },
      });
    }
    return true;
  });
  // cancelled while it was read: what was read goes
  if (!stored) await clearParts(db, firmId, uploadId);
  await report("Read", 1);
  return stored ? { status: "pending", rows: tally.rowCount, errors: tally.errorCount } : { status: "cancelled" };
}

async function uploaderName(tx: Tx, userId: string): Promise<string> {
  const [user] = await tx.select({ name: users.name }).from(users).where(eq(users.id, userId));
  return user?.name ?? "Unknown person";
}
