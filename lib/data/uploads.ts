/**
 * Uploaded files: received from the upload service, previewed, then confirmed (or cancelled) by a person.
 * Nothing enters a period or the price history until it is confirmed, and a confirmation is one transaction.
 */
import "server-only";
import { and, desc, eq, inArray } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { capitalRuleProfiles, firms, instruments, pricePoints, reportingPeriods, uploads } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import { can } from "@/lib/auth/permissions";
import { now, today } from "@/lib/clock";
import { readTables } from "@/lib/uploads/read-table";
import { chooseTable, parsePositions, POSITION_FIELDS, type PositionsParse } from "@/lib/uploads/parse-positions";
import { parsePrices, PRICE_FIELDS, type PricePoint, type PricesParse } from "@/lib/uploads/parse-prices";
import { bulkInsert, orderedId } from "@/db/bulk-insert";
import { FileRejected, type DateFormat, type NumberFormat, type ParseProgress, type Problem, type ReadOptions } from "@/lib/uploads/types";
import { fetchStoredFile, deleteStoredFiles, sha256 } from "@/lib/uploads/file-store";
import { ATTRIBUTE_SQL_COLUMNS, attributeSqlValues } from "@/lib/uploads/position-attributes";
import type { StandardisedProfile } from "@/lib/risk/standardised";
import { standardisedProfileOfRow } from "./capital-profile";
import { assertPeriodTakesData } from "./periods";
import { enqueueQualityRefresh, periodsTakingPrices } from "./quality-jobs";

export type UploadKind = "positions" | "prices";

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

export type ParsedUpload = ({ kind: "positions" } & PositionsParse) | ({ kind: "prices" } & PricesParse) | { kind: "rejected"; message: string; problems: Problem[] };

const PERMISSION = { positions: "positions.upload", prices: "prices.upload" } as const;
/** How many problems are stored with an upload row (the preview re-reads the file for the full list). */
const STORED_PROBLEMS = 500;

// Parsed files, kept briefly so paging a preview does not re-read the file each time. Losing it costs a re-read.
const parsedCache = new Map<string, ParsedUpload>();
function remember(key: string, value: ParsedUpload): ParsedUpload {
  parsedCache.delete(key);
  parsedCache.set(key, value);
  while (parsedCache.size > 4) parsedCache.delete(parsedCache.keys().next().value!);
  return value;
}

/** Rates to the reporting currency on or before `asOf`, from the firm's `CCY` + reporting-currency series. */
async function fxRates(firmId: string, reportingCurrency: string, asOf: string): Promise<{ rates: Record<string, number>; dates: Record<string, string> }> {
  const db = getDb();
  const pairs = await db.select().from(instruments).where(eq(instruments.firmId, firmId));
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
async function filedStandardisedProfile(firmId: string): Promise<StandardisedProfile | null> {
  const [profile] = await getDb()
    .select({ filedRegime: capitalRuleProfiles.filedRegime, standardised: capitalRuleProfiles.standardised, showRwa: capitalRuleProfiles.showRwa })
    .from(capitalRuleProfiles)
    .where(and(eq(capitalRuleProfiles.firmId, firmId), eq(capitalRuleProfiles.active, true)))
    .limit(1);
  return profile?.filedRegime === "standardised" ? standardisedProfileOfRow(profile) : null;
}

/** Parse bytes as the given kind of upload, in the firm's context. */
export async function parseUploadBytes(
  bytes: Uint8Array,
  kind: UploadKind,
  options: ReadOptions,
  context: { firmId: string; reportingCurrency: string; periodEnd?: string; onProgress?: ParseProgress },
): Promise<ParsedUpload> {
  try {
    const tables = await readTables(bytes);
    const fields = kind === "positions" ? POSITION_FIELDS : PRICE_FIELDS;
    const table = chooseTable(tables, fields, options.mapping) ?? (tables.length === 1 && tables[0].source === "csv" ? tables[0] : null);
    if (!table) {
      const names = tables.map((t) => t.source).join(", ") || "none";
      const message = `No sheet of the workbook has the ${kind === "positions" ? "positions" : "price"} columns (sheets: ${names}).`;
      return { kind: "rejected", message, problems: [{ row: null, field: null, severity: "error", message }] };
    }
    if (kind === "positions") {
      const fx = await fxRates(context.firmId, context.reportingCurrency, context.periodEnd ?? today());
      const filedStandardised = await filedStandardisedProfile(context.firmId);
      return { kind, ...parsePositions(table, options, { today: today(), reportingCurrency: context.reportingCurrency, periodEnd: context.periodEnd, fxToReporting: fx.rates, fxDates: fx.dates, filedStandardisedProfile: filedStandardised, onProgress: context.onProgress }) };
    }
    return { kind, ...parsePrices(table, options, { today: today(), onProgress: context.onProgress }) };
  } catch (error) {
    if (error instanceof FileRejected) return { kind: "rejected", message: error.message, problems: [{ row: null, field: null, severity: "error", message: error.message }] };
    throw error;
  }
}

function counts(parsed: ParsedUpload) {
  const errors = parsed.problems.filter((p) => p.severity === "error").length;
  return {
    errorCount: errors,
    warningCount: parsed.problems.length - errors,
    rowCount: parsed.kind === "positions" ? parsed.rows.length : parsed.kind === "prices" ? parsed.points.length : 0,
  };
}

function summaryOf(parsed: ParsedUpload): Record<string, unknown> {
  if (parsed.kind === "positions") return { totals: parsed.totals, source: parsed.source, missingColumns: parsed.missingColumns, rates: parsed.rates ?? [] };
  if (parsed.kind === "prices") return { ...parsed.summary, layout: parsed.layout, source: parsed.source, missingColumns: parsed.missingColumns };
  return { rejected: parsed.message };
}

/**
 * Record a file the upload service received: read it back, check its hash, parse it, and store a pending upload
 * with its problems. The same file (by SHA-256) for the same purpose is not stored twice.
 */
export async function receiveUpload(context: UploadContext, file: { key: string; name: string; size: number; ufsUrl: string }): Promise<{ uploadId: string; duplicate: boolean }> {
  return receiveUploadBytes(context, file, await fetchStoredFile(file.ufsUrl));
}

/** The same, for bytes already in hand (the demo seed and the benchmark store files without a browser). */
export async function receiveUploadBytes(
  context: UploadContext,
  file: { key: string; name: string; ufsUrl: string },
  bytes: Uint8Array,
): Promise<{ uploadId: string; duplicate: boolean }> {
  const db = getDb();
  const hash = sha256(bytes);
  const sameFile = await db
    .select({ id: uploads.id, status: uploads.status })
    .from(uploads)
    .where(
      and(
        eq(uploads.firmId, context.firmId),
        eq(uploads.kind, context.kind),
        eq(uploads.sha256, hash),
        context.periodId ? eq(uploads.periodId, context.periodId) : eq(uploads.kind, "prices"),
        inArray(uploads.status, ["pending", "confirmed"]),
      ),
    );
  if (sameFile.length > 0) {
    await deleteStoredFiles([file.key]);
    return { uploadId: sameFile[0].id, duplicate: true };
  }
  if (context.periodId) {
    try {
      await assertPeriodTakesData(db, context.firmId, context.periodId);
    } catch (error) {
      await deleteStoredFiles([file.key]);
      throw error;
    }
  }
  const [firm] = await db.select().from(firms).where(eq(firms.id, context.firmId));
  const [period] = context.periodId
    ? await db.select().from(reportingPeriods).where(and(eq(reportingPeriods.id, context.periodId), eq(reportingPeriods.firmId, context.firmId)))
    : [];
  const options: ReadOptions = { numberFormat: context.numberFormat, ...(context.dateFormat && context.dateFormat !== "iso" ? { dateFormat: context.dateFormat } : {}) };
  const parsed = await parseUploadBytes(bytes, context.kind, options, { firmId: context.firmId, reportingCurrency: firm.reportingCurrency, periodEnd: period?.periodEnd });
  const id = crypto.randomUUID();
  remember(`${id}:${JSON.stringify(options)}`, parsed);
  await db.transaction(async (tx) => {
    await tx.insert(uploads).values({
      id,
      firmId: context.firmId,
      periodId: context.periodId,
      kind: context.kind,
      fileName: file.name.slice(0, 255),
      fileKey: file.key,
      fileUrl: file.ufsUrl,
      sha256: hash,
      sizeBytes: bytes.length,
      options: { ...options },
      summary: summaryOf(parsed),
      problems: parsed.problems.slice(0, STORED_PROBLEMS),
      uploadedBy: context.userId,
      ...counts(parsed),
    });
    await recordAudit(tx, { userId: context.userId, name: context.userName, firmId: context.firmId }, {
      action: "upload.receive",
      entityType: "upload",
      entityId: id,
      summary: `Received ${context.kind} file "${file.name}" (${bytes.length.toLocaleString("en")} bytes, SHA-256 ${hash.slice(0, 12)}…)`,
      detail: { sha256: hash, periodId: context.periodId, ...counts(parsed) },
    });
  });
  return { uploadId: id, duplicate: false };
}

async function getUploadRow(actor: Actor, uploadId: string) {
  const [row] = await getDb().select().from(uploads).where(and(eq(uploads.id, uploadId), eq(uploads.firmId, actor.firmId)));
  if (!row) throw new AppError("not_found:upload", "No such upload.");
  return row;
}

/** Whether the actor's firm has this upload (the preview page answers a real 404 otherwise). */
export async function uploadExists(actor: Actor, uploadId: string): Promise<boolean> {
  const [row] = await getDb().select({ id: uploads.id }).from(uploads).where(and(eq(uploads.id, uploadId), eq(uploads.firmId, actor.firmId)));
  return Boolean(row);
}

/** Re-read an upload's file under its current options (cached). */
async function parsedFor(actor: Actor, row: typeof uploads.$inferSelect): Promise<ParsedUpload> {
  const options = row.options ?? { numberFormat: "plain" };
  const key = `${row.id}:${JSON.stringify(options)}`;
  const cached = parsedCache.get(key);
  if (cached) return cached;
  const bytes = await fetchStoredFile(row.fileUrl, row.sha256);
  const [period] = row.periodId ? await getDb().select().from(reportingPeriods).where(eq(reportingPeriods.id, row.periodId)) : [];
  return remember(key, await parseUploadBytes(bytes, row.kind as UploadKind, options, { firmId: actor.firmId, reportingCurrency: actor.reportingCurrency, periodEnd: period?.periodEnd }));
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

/** The firm's uploads, newest first, optionally for one period or kind. */
export async function listUploads(actor: Actor, filter: { periodId?: string; kind?: UploadKind } = {}): Promise<UploadListItem[]> {
  const conditions = [eq(uploads.firmId, actor.firmId)];
  if (filter.periodId) conditions.push(eq(uploads.periodId, filter.periodId));
  if (filter.kind) conditions.push(eq(uploads.kind, filter.kind));
  const rows = await getDb().select().from(uploads).where(and(...conditions)).orderBy(desc(uploads.createdAt));
  return rows.map((r) => ({
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
  }));
}

/** An upload with its full problem list and totals, for the preview screen. */
export async function getUploadPreview(actor: Actor, uploadId: string) {
  const row = await getUploadRow(actor, uploadId);
  const parsed = row.status === "pending" ? await parsedFor(actor, row) : null;
  return {
    upload: { ...(await listUploads(actor)).find((u) => u.id === row.id)!, options: row.options, summary: row.summary, sizeBytes: row.sizeBytes },
    canConfirm: can(actor, PERMISSION[row.kind as UploadKind]),
    reportingCurrency: actor.reportingCurrency,
    problems: parsed ? parsed.problems : ((row.problems ?? []) as Problem[]),
    header: parsed && parsed.kind !== "rejected" ? parsed.header : [],
    missingColumns: parsed && parsed.kind !== "rejected" ? parsed.missingColumns : [],
    fields: row.kind === "positions"
      ? Object.entries(POSITION_FIELDS).map(([key, f]) => ({ key, label: f.label, required: f.required }))
      : Object.entries(PRICE_FIELDS).map(([key, f]) => ({ key, label: f.label, required: f.required })),
    summary: parsed ? summaryOf(parsed) : row.summary,
  };
}

/** One page of an upload's parsed rows (valid rows only; problems are listed separately). */
export async function getUploadRows(actor: Actor, uploadId: string, page: number, pageSize: number) {
  const row = await getUploadRow(actor, uploadId);
  if (row.status !== "pending") throw new AppError("conflict:upload", "Only an upload waiting for confirmation has a preview.");
  const parsed = await parsedFor(actor, row);
  const all: unknown[] = parsed.kind === "positions" ? parsed.rows : parsed.kind === "prices" ? parsed.points : [];
  return { total: all.length, page, pageSize, rows: all.slice((page - 1) * pageSize, page * pageSize) };
}

/** Change how a pending upload is read (number format, header mapping) and re-check it. */
export async function updateUploadOptions(actor: Actor, uploadId: string, options: ReadOptions) {
  const row = await getUploadRow(actor, uploadId);
  if (!can(actor, PERMISSION[row.kind as UploadKind])) throw new AppError("forbidden:upload");
  if (row.status !== "pending") throw new AppError("conflict:upload", `This upload is ${row.status}; only a pending upload can be re-read.`);
  const fields = row.kind === "positions" ? POSITION_FIELDS : PRICE_FIELDS;
  for (const [field, header] of Object.entries(options.mapping ?? {})) {
    if (!(field in fields)) throw new AppError("unprocessable:upload", `Unknown field "${field}" in the column mapping.`, { [`mapping.${field}`]: "Unknown field." });
    if (header.length > 200) throw new AppError("unprocessable:upload", "A column name is too long.", { [`mapping.${field}`]: "Too long." });
  }
  const updated = { ...row, options: { ...options } };
  const parsed = await parsedFor(actor, updated);
  await getDb().transaction(async (tx) => {
    await tx
      .update(uploads)
      .set({ options: { ...options }, summary: summaryOf(parsed), problems: parsed.problems.slice(0, STORED_PROBLEMS), ...counts(parsed) })
      .where(and(eq(uploads.id, uploadId), eq(uploads.firmId, actor.firmId)));
    await recordAudit(tx, actor, { action: "upload.options", entityType: "upload", entityId: uploadId, summary: `Changed how "${row.fileName}" is read`, detail: { options } });
  });
  return getUploadPreview(actor, uploadId);
}

/** Cancel a pending upload: nothing of it enters the period or the price history. */
export async function cancelUpload(actor: Actor, uploadId: string) {
  const row = await getUploadRow(actor, uploadId);
  if (!can(actor, PERMISSION[row.kind as UploadKind])) throw new AppError("forbidden:upload");
  if (row.status !== "pending") throw new AppError("conflict:upload", `This upload is already ${row.status}.`);
  await getDb().transaction(async (tx) => {
    await tx.update(uploads).set({ status: "cancelled", cancelledAt: now().toISOString() }).where(and(eq(uploads.id, uploadId), eq(uploads.firmId, actor.firmId), eq(uploads.status, "pending")));
    await recordAudit(tx, actor, { action: "upload.cancel", entityType: "upload", entityId: uploadId, summary: `Cancelled ${row.kind} file "${row.fileName}"` });
  });
  return { status: "cancelled" };
}

async function upsertInstruments(tx: Tx, firmId: string, wanted: Map<string, { name: string; assetClass: string; currency: string }>): Promise<Map<string, string>> {
  const codes = [...wanted.keys()];
  const ids = new Map<string, string>();
  for (let i = 0; i < codes.length; i += 500) {
    const existing = await tx.select().from(instruments).where(and(eq(instruments.firmId, firmId), inArray(instruments.code, codes.slice(i, i + 500))));
    for (const e of existing) {
      ids.set(e.code, e.id);
      const w = wanted.get(e.code)!;
      if ((e.name === "" && w.name) || (e.assetClass === "unknown" && w.assetClass !== "unknown") || (e.currency === "" && w.currency)) {
        await tx
          .update(instruments)
          .set({ name: e.name || w.name, assetClass: e.assetClass === "unknown" ? w.assetClass : e.assetClass, currency: e.currency || w.currency })
          .where(eq(instruments.id, e.id));
      }
    }
  }
  const fresh = codes.filter((c) => !ids.has(c)).map((code) => ({ id: crypto.randomUUID(), code, ...wanted.get(code)! }));
  const createdAt = now().toISOString();
  await bulkInsert(
    tx,
    "instruments",
    ["id", "firm_id", "code", "name", "asset_class", "currency", "created_at"],
    fresh.map((f) => [f.id, firmId, f.code, f.name, f.assetClass, f.currency, createdAt]),
  );
  for (const f of fresh) ids.set(f.code, f.id);
  return ids;
}

/**
 * Confirm a pending upload. Positions: the period's earlier confirmed positions upload is marked superseded and
 * this one's rows are stored. Prices: new points extend the history; a changed price is a correction that keeps
 * the old point (no longer current). All of it, and its audit record, in one transaction.
 */
export async function confirmUpload(actor: Actor, uploadId: string, input: { acknowledgeWarnings: boolean }) {
  const row = await getUploadRow(actor, uploadId);
  const kind = row.kind as UploadKind;
  if (!can(actor, PERMISSION[kind])) throw new AppError("forbidden:upload");
  if (row.status !== "pending") throw new AppError("conflict:upload", `This upload is already ${row.status}.`);
  const parsed = await parsedFor(actor, row);
  const errors = parsed.problems.filter((p) => p.severity === "error");
  if (parsed.kind === "rejected" || errors.length > 0) {
    throw new AppError("unprocessable:upload", `The file has ${errors.length || 1} error${errors.length === 1 ? "" : "s"}; fix the file and upload it again. Nothing was stored.`);
  }
  const warnings = parsed.problems.length;
  if (warnings > 0 && !input.acknowledgeWarnings) {
    throw new AppError("unprocessable:upload", `Acknowledge the ${warnings} warning${warnings === 1 ? "" : "s"} before confirming.`, { acknowledgeWarnings: "Required when there are warnings." });
  }
  const confirmedAt = now().toISOString();
  const outcome = await getDb().transaction(async (tx) => {
    // The status guard makes a second, concurrent confirmation a no-op that is refused below.
    const claimed = await tx
      .update(uploads)
      .set({ status: "confirmed", confirmedBy: actor.userId, confirmedAt })
      .where(and(eq(uploads.id, uploadId), eq(uploads.firmId, actor.firmId), eq(uploads.status, "pending")))
      .returning({ id: uploads.id });
    if (claimed.length === 0) throw new AppError("conflict:upload", "This upload was confirmed or cancelled meanwhile.");

    if (parsed.kind === "positions") {
      if (!row.periodId) throw new AppError("unprocessable:upload", "A positions upload must belong to a period.");
      // Inside the transaction: a filing submitted or signed a moment ago is seen here, and refuses the upload.
      await assertPeriodTakesData(tx, actor.firmId, row.periodId);
      const superseded = await tx
        .update(uploads)
        .set({ status: "superseded", supersededBy: uploadId })
        .where(and(eq(uploads.firmId, actor.firmId), eq(uploads.periodId, row.periodId), eq(uploads.kind, "positions"), eq(uploads.status, "confirmed"), inArray(uploads.id, await otherConfirmed(tx, actor.firmId, row.periodId, uploadId))))
        .returning({ id: uploads.id });
      const wanted = new Map(parsed.rows.map((r) => [r.instrumentId, { name: r.instrumentName, assetClass: r.assetClass, currency: r.currency }]));
      await upsertInstruments(tx, actor.firmId, wanted);
      const periodId = row.periodId;
      const stored = await bulkInsert(
        tx,
        "positions",
        ["id", "firm_id", "period_id", "upload_id", "row_number", "as_of", "book", "instrument_code", "instrument_name", "asset_class", "currency", "quantity", "price", "market_value", "delta_exposure", ...ATTRIBUTE_SQL_COLUMNS],
        parsed.rows.map((r) => [orderedId(), actor.firmId, periodId, uploadId, r.row, r.asOf, r.book, r.instrumentId, r.instrumentName, r.assetClass, r.currency, r.quantity, r.price, r.marketValue, r.deltaExposure, ...attributeSqlValues(r.attributes)]),
      );
      const result = { stored, superseded: superseded.map((s) => s.id) };
      await recordAudit(tx, actor, {
        action: "upload.confirm",
        entityType: "upload",
        entityId: uploadId,
        summary: `Confirmed ${stored} positions from "${row.fileName}"${superseded.length ? ` (supersedes ${superseded.length} earlier upload)` : ""}`,
        detail: { ...result, warningsAcknowledged: warnings, sha256: row.sha256 },
      });
      // the period's data-quality report reads these positions: the worker computes it again
      await enqueueQualityRefresh(tx, actor.firmId, [periodId]);
      return result;
    }
    if (parsed.kind === "prices") {
      const wanted = new Map<string, { name: string; assetClass: string; currency: string }>();
      for (const p of parsed.points) {
        if (wanted.has(p.instrument)) continue;
        const fxPair = /^[A-Z]{6}$/.test(p.instrument) && isCurrencyPair(p.instrument);
        wanted.set(p.instrument, { name: fxPair ? `${p.instrument.slice(0, 3)}/${p.instrument.slice(3)} exchange rate` : "", assetClass: fxPair ? "fx" : "unknown", currency: fxPair ? p.instrument.slice(3) : "" });
      }
      const ids = await upsertInstruments(tx, actor.firmId, wanted);
      const current = new Map<string, { id: string; close: number }>();
      const instrumentIds = [...new Set(ids.values())];
      for (let i = 0; i < instrumentIds.length; i += 200) {
        const existing = await tx
          .select({ id: pricePoints.id, instrumentId: pricePoints.instrumentId, date: pricePoints.date, close: pricePoints.close })
          .from(pricePoints)
          .where(and(eq(pricePoints.firmId, actor.firmId), eq(pricePoints.current, true), inArray(pricePoints.instrumentId, instrumentIds.slice(i, i + 200))));
        for (const e of existing) current.set(`${e.instrumentId}\u0000${e.date}`, { id: e.id, close: e.close });
      }
      const corrected: string[] = [];
      const corrections: { instrument: string; date: string; from: number; to: number }[] = [];
      let unchanged = 0;
      // Mark corrected points first, then add the new ones, all inside this transaction.
      const fresh: PricePoint[] = [];
      for (const p of parsed.points) {
        const instrumentId = ids.get(p.instrument)!;
        const before = current.get(`${instrumentId}\u0000${p.date}`);
        if (before && before.close === p.close) {
          unchanged++;
          continue;
        }
        if (before) {
          corrected.push(before.id);
          if (corrections.length < 200) corrections.push({ instrument: p.instrument, date: p.date, from: before.close, to: p.close });
        }
        fresh.push(p);
      }
      for (let i = 0; i < corrected.length; i += 500) {
        await tx.update(pricePoints).set({ current: false, replacedByUpload: uploadId }).where(and(eq(pricePoints.firmId, actor.firmId), inArray(pricePoints.id, corrected.slice(i, i + 500))));
      }
      const inserted = await bulkInsert(
        tx,
        "price_points",
        ["id", "firm_id", "instrument_id", "date", "close", "upload_id", "current", "created_at"],
        (function* () {
          for (const p of fresh) yield [orderedId(), actor.firmId, ids.get(p.instrument)!, p.date, p.close, uploadId, true, confirmedAt];
        })(),
      );
      const result = { added: inserted - corrected.length, corrected: corrected.length, unchanged, corrections };
      await tx.update(uploads).set({ summary: { ...(row.summary ?? {}), ...result } }).where(eq(uploads.id, uploadId));
      await recordAudit(tx, actor, {
        action: "upload.confirm",
        entityType: "upload",
        entityId: uploadId,
        summary: `Confirmed price history from "${row.fileName}": ${result.added} new, ${result.corrected} corrected, ${unchanged} unchanged`,
        detail: { ...result, warningsAcknowledged: warnings, sha256: row.sha256 },
      });
      // every open period's data-quality report reads the price history: the worker computes them again
      await enqueueQualityRefresh(tx, actor.firmId, await periodsTakingPrices(tx, actor.firmId));
      return result;
    }
    throw new AppError("unprocessable:upload", "This file could not be read.");
  });
  return { status: "confirmed", ...outcome };
}

async function otherConfirmed(tx: Tx, firmId: string, periodId: string, uploadId: string): Promise<string[]> {
  const rows = await tx
    .select({ id: uploads.id })
    .from(uploads)
    .where(and(eq(uploads.firmId, firmId), eq(uploads.periodId, periodId), eq(uploads.kind, "positions"), eq(uploads.status, "confirmed")));
  return rows.map((r) => r.id).filter((id) => id !== uploadId);
}

let currencies: Set<string> | undefined;
function isCurrencyPair(code: string): boolean {
  currencies ??= new Set(Intl.supportedValuesOf("currency"));
  return currencies.has(code.slice(0, 3)) && currencies.has(code.slice(3));
}

