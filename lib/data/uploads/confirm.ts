/**
 * Storing a confirmed upload (the "upload-confirm" job, or inline for the seed and the tests). The rows are written
 * first in short transactions where no reader sees them (positions under an upload that is not confirmed; prices
 * marked staged, not current), then one short last transaction makes them count: the upload confirmed, an earlier
 * positions file superseded, corrected prices no longer current and the staged ones current, the audit record and
 * the data-quality refresh. Instruments a price file names for the first time are added before its closes are staged,
 * pending (no reader lists them) until that last step. A retried confirmation clears what an interrupted one staged
 * and starts again.
 */
import "server-only";
import { firmRow } from "@/lib/data/firm-row";
import { and, count, eq, inArray, max, sql } from "drizzle-orm";
import { getDb, type Database, type Tx } from "@/db/client";
import { instruments, pricePoints, uploads } from "@/db/schema";
import { bulkInsert, orderedId } from "@/db/bulk-insert";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import { now } from "@/lib/clock";
import { countOf } from "@/lib/text/count";
import type { PositionRow } from "@/lib/uploads/parse-positions";
import type { PricePoint } from "@/lib/uploads/parse-prices";
import type { ConfirmedSummary, PriceCorrection } from "@/lib/uploads/summary";
import { ATTRIBUTE_SQL_COLUMNS, attributeSqlValues } from "@/lib/uploads/position-attributes";
import { assertPeriodTakesData } from "../periods";
import { enqueueQualityRefresh, periodsTakingPrices } from "../quality-jobs";
import { clearParts, eachPart, readAll } from "./parts";

/** Rows written per staging transaction. */
const STAGE_ROWS = 5_000;

export interface ConfirmHow {
  /** the status the upload is in while this runs: "pending" (inline) or "confirming" (the job) */
  from: "pending" | "confirming";
  /** the person who confirmed */
  by: { userId: string; name: string };
  warningsAcknowledged: number;
  progress?: (stage: string, fraction: number) => Promise<unknown>;
  signal?: AbortSignal;
}

export type ConfirmResult = { status: "confirmed" } & ConfirmedSummary;

class PricesChangedMeanwhile extends Error {}

/** The last step's first write: the upload confirmed, if it is still in the state this confirmation started from. */
async function claimConfirmed(tx: Tx, firmId: string, uploadId: string, how: ConfirmHow): Promise<void> {
  const claimed = await tx
    .update(uploads)
    .set({ status: "confirmed", confirmedBy: how.by.userId, confirmedAt: now().toISOString() })
    .where(and(eq(uploads.id, uploadId), eq(uploads.firmId, firmId), eq(uploads.status, how.from)))
    .returning({ id: uploads.id });
  if (claimed.length === 0) throw new AppError("conflict:upload", "This upload was confirmed or cancelled meanwhile.");
}

function stop(how: ConfirmHow) {
  if (how.signal?.aborted) throw new Error("Stopped: the worker no longer holds this job.");
}

/** Store an upload's rows and make them count. Confirmed already (a retry after the last step): its stored result. */
export async function applyConfirm(firmId: string, uploadId: string, how: ConfirmHow): Promise<ConfirmResult> {
  const db = getDb();
  const row = await firmRow(uploads, firmId, uploadId, "not_found:upload", "No such upload.", db);
  if (row.status === "confirmed" && row.summary?.confirmed) return { status: "confirmed", ...row.summary.confirmed };
  if (row.status !== how.from) throw new AppError("conflict:upload", `This upload is ${row.status}; it was confirmed or cancelled meanwhile.`);
  if (row.kind === "positions") return confirmPositions(db, row, how);
  for (let attempt = 1; ; attempt++) {
    try {
      return await confirmPrices(db, row, how);
    } catch (error) {
      if (!(error instanceof PricesChangedMeanwhile) || attempt >= 3) throw error;
    }
  }
}

/**
 * Delete what an earlier, interrupted confirmation of the upload staged (nobody reads it): its positions, or its
 * staged closes and the pending instruments it added that no other row refers to.
 */
export async function clearStaged(db: Database | Tx, firmId: string, uploadId: string, kind: string): Promise<void> {
  if (kind === "positions") {
    await db.run(sql`DELETE FROM positions WHERE firm_id = ${firmId} AND upload_id = ${uploadId}`);
    return;
  }
  await db.run(sql`DELETE FROM price_points WHERE firm_id = ${firmId} AND upload_id = ${uploadId} AND staged = 1`);
  await db.run(sql`DELETE FROM instruments WHERE firm_id = ${firmId} AND pending_upload = ${uploadId} AND NOT EXISTS (SELECT 1 FROM price_points p WHERE p.instrument_id = instruments.id)`);
}

async function confirmPositions(db: Database, row: typeof uploads.$inferSelect, how: ConfirmHow): Promise<ConfirmResult> {
  const { firmId, id: uploadId } = row;
  const periodId = row.periodId;
  if (!periodId) throw new AppError("unprocessable:upload", "A positions upload must belong to a period.");
  const report = how.progress ?? (async () => undefined);
  await clearStaged(db, firmId, uploadId, "positions");
  const total = row.rowCount;
  const wanted = new Map<string, { name: string; assetClass: string; currency: string }>();
  let stored = 0;
  let batch: PositionRow[] = [];
  const flush = async () => {
    if (batch.length === 0) return;
    stop(how);
    const rows = batch;
    batch = [];
    await db.transaction(async (tx) => {
      stored += await bulkInsert(
        tx,
        "positions",
        ["id", "firm_id", "period_id", "upload_id", "row_number", "as_of", "book", "instrument_code", "instrument_name", "asset_class", "currency", "quantity", "price", "market_value", "delta_exposure", ...ATTRIBUTE_SQL_COLUMNS],
        rows.map((r) => [orderedId(), firmId, periodId, uploadId, r.row, r.asOf, r.book, r.instrument, r.instrumentName, r.assetClass, r.currency, r.quantity, r.price, r.marketValue, r.deltaExposure, ...attributeSqlValues(r.attributes)]),
      );
    });
    await report(`Stored ${countOf(stored, "position")} of ${total.toLocaleString("en")}`, 0.05 + 0.85 * (stored / Math.max(1, total)));
  };
  for await (const items of eachPart(db, firmId, uploadId, "rows")) {
    for (const r of items as PositionRow[]) {
      wanted.set(r.instrument, { name: r.instrumentName, assetClass: r.assetClass, currency: r.currency });
      batch.push(r);
    }
    if (batch.length >= STAGE_ROWS) await flush();
  }
  await flush();
  stop(how);

  await report("Making the positions count", 0.95);
  return db.transaction(async (tx) => {
    await claimConfirmed(tx, firmId, uploadId, how);
    // Inside the transaction: a filing submitted or signed a moment ago is seen here, and refuses the upload.
    await assertPeriodTakesData(tx, firmId, periodId);
    const superseded = await tx
      .update(uploads)
      .set({ status: "superseded", supersededBy: uploadId })
      .where(and(eq(uploads.firmId, firmId), eq(uploads.periodId, periodId), eq(uploads.kind, "positions"), eq(uploads.status, "confirmed"), sql`${uploads.id} <> ${uploadId}`))
      .returning({ id: uploads.id });
    await upsertInstruments(tx, firmId, wanted);
    const result = { stored, superseded: superseded.map((s) => s.id) };
    await tx.update(uploads).set({ summary: { ...(row.summary ?? {}), confirmed: result } }).where(eq(uploads.id, uploadId));
    await recordAudit(tx, { ...how.by, firmId }, {
      action: "upload.confirm",
      entityType: "upload",
      entityId: uploadId,
      summary: `Confirmed ${stored} positions from "${row.fileName}"${superseded.length ? ` (supersedes ${superseded.length} earlier upload)` : ""}`,
      detail: { ...result, warningsAcknowledged: how.warningsAcknowledged, sha256: row.sha256 },
    });
    // the period's data-quality report reads these positions: the worker computes it again
    await enqueueQualityRefresh(tx, firmId, [periodId]);
    await clearParts(tx, firmId, uploadId);
    return { status: "confirmed" as const, ...result };
  });
}

/** A fingerprint of the firm's price history: changes whenever a price upload is confirmed. */
async function pricesVersion(db: Database | Tx, firmId: string): Promise<string> {
  const [v] = await db
    .select({ n: count(), last: max(uploads.confirmedAt) })
    .from(uploads)
    .where(and(eq(uploads.firmId, firmId), eq(uploads.kind, "prices"), inArray(uploads.status, ["confirmed", "superseded"])));
  return `${v?.n ?? 0}:${v?.last ?? ""}`;
}

async function confirmPrices(db: Database, row: typeof uploads.$inferSelect, how: ConfirmHow): Promise<ConfirmResult> {
  const { firmId, id: uploadId } = row;
  const report = how.progress ?? (async () => undefined);
  await clearStaged(db, firmId, uploadId, "prices");
  const version = await pricesVersion(db, firmId);
  const points = (await readAll(db, firmId, uploadId, "rows")) as PricePoint[];
  const wanted = new Map<string, { name: string; assetClass: string; currency: string }>();
  for (const p of points) {
    if (wanted.has(p.instrument)) continue;
    const fxPair = /^[A-Z]{6}$/.test(p.instrument) && isCurrencyPair(p.instrument);
    wanted.set(p.instrument, { name: fxPair ? `${p.instrument.slice(0, 3)}/${p.instrument.slice(3)} exchange rate` : "", assetClass: fxPair ? "fx" : "unknown", currency: fxPair ? p.instrument.slice(3) : "" });
  }
  // New instruments are added now, pending (no reader lists them), so that the staged closes can refer to them.
  const ids = await addPendingInstruments(db, firmId, uploadId, wanted);
  const current = new Map<string, { id: string; close: number }>();
  const instrumentIds = [...new Set(ids.values())];
  for (let i = 0; i < instrumentIds.length; i += 200) {
    const existing = await db
      .select({ id: pricePoints.id, instrumentId: pricePoints.instrumentId, date: pricePoints.date, close: pricePoints.close })
      .from(pricePoints)
      .where(and(eq(pricePoints.firmId, firmId), eq(pricePoints.current, true), inArray(pricePoints.instrumentId, instrumentIds.slice(i, i + 200))));
    for (const e of existing) current.set(`${e.instrumentId}\u0000${e.date}`, { id: e.id, close: e.close });
  }
  const corrected: string[] = [];
  const corrections: PriceCorrection[] = [];
  let unchanged = 0;
  const fresh: PricePoint[] = [];
  for (const p of points) {
    const before = current.get(`${ids.get(p.instrument)!}\u0000${p.date}`);
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
  const stagedAt = now().toISOString();
  for (let i = 0; i < fresh.length; i += STAGE_ROWS) {
    stop(how);
    const chunk = fresh.slice(i, i + STAGE_ROWS);
    await db.transaction((tx) =>
      bulkInsert(tx, "price_points", ["id", "firm_id", "instrument_id", "date", "close", "upload_id", "current", "staged", "created_at"], chunk.map((p) => [orderedId(), firmId, ids.get(p.instrument)!, p.date, p.close, uploadId, false, true, stagedAt])),
    );
    await report(`Stored ${countOf(Math.min(fresh.length, i + STAGE_ROWS), "close")} of ${fresh.length.toLocaleString("en")}`, 0.05 + 0.85 * (Math.min(fresh.length, i + STAGE_ROWS) / Math.max(1, fresh.length)));
  }
  stop(how);

  await report("Making the closes count", 0.95);
  const confirmedAt = now().toISOString();
  return db.transaction(async (tx) => {
    if ((await pricesVersion(tx, firmId)) !== version) throw new PricesChangedMeanwhile();
    await claimConfirmed(tx, firmId, uploadId, how);
    await upsertInstruments(tx, firmId, wanted);
    for (let i = 0; i < corrected.length; i += 500) {
      await tx.update(pricePoints).set({ current: false, replacedByUpload: uploadId }).where(and(eq(pricePoints.firmId, firmId), inArray(pricePoints.id, corrected.slice(i, i + 500))));
    }
    await tx.run(sql`UPDATE price_points SET current = 1, staged = 0, created_at = ${confirmedAt} WHERE firm_id = ${firmId} AND upload_id = ${uploadId} AND staged = 1`);
    const result = { added: fresh.length - corrected.length, corrected: corrected.length, unchanged, corrections };
    await tx.update(uploads).set({ summary: { ...(row.summary ?? {}), ...result, confirmed: result } }).where(eq(uploads.id, uploadId));
    await recordAudit(tx, { ...how.by, firmId }, {
      action: "upload.confirm",
      entityType: "upload",
      entityId: uploadId,
      summary: `Confirmed price history from "${row.fileName}": ${result.added} new, ${result.corrected} corrected, ${unchanged} unchanged`,
      detail: { ...result, warningsAcknowledged: how.warningsAcknowledged, sha256: row.sha256 },
    });
    // every open period's data-quality report reads the price history: the worker computes them again
    await enqueueQualityRefresh(tx, firmId, await periodsTakingPrices(tx, firmId));
    await clearParts(tx, firmId, uploadId);
    return { status: "confirmed" as const, ...result };
  });
}

/**
 * The instrument id of each code: the firm's where it has one, else a new instrument added pending under this upload
 * (in one short transaction; a code someone else added meanwhile keeps their row).
 */
async function addPendingInstruments(db: Database, firmId: string, uploadId: string, wanted: Map<string, { name: string; assetClass: string; currency: string }>): Promise<Map<string, string>> {
  const codes = [...wanted.keys()];
  const createdAt = now().toISOString();
  return db.transaction(async (tx) => {
    const ids = new Map<string, string>();
    for (let i = 0; i < codes.length; i += 500) {
      const chunk = codes.slice(i, i + 500);
      await tx
        .insert(instruments)
        .values(chunk.map((code) => ({ firmId, code, ...wanted.get(code)!, pendingUpload: uploadId, createdAt })))
        .onConflictDoNothing({ target: [instruments.firmId, instruments.code] });
      const rows = await tx.select({ id: instruments.id, code: instruments.code }).from(instruments).where(and(eq(instruments.firmId, firmId), inArray(instruments.code, chunk)));
      for (const r of rows) ids.set(r.code, r.id);
    }
    return ids;
  });
}

/**
 * Make the instruments a confirmed upload names count: add those the firm does not know yet, fill in blanks of those
 * it does, and clear `pendingUpload` of any a price confirmation in progress added (this upload's rows refer to them).
 */
async function upsertInstruments(tx: Tx, firmId: string, wanted: Map<string, { name: string; assetClass: string; currency: string }>): Promise<void> {
  const codes = [...wanted.keys()];
  const known = new Set<string>();
  for (let i = 0; i < codes.length; i += 500) {
    const existing = await tx.select().from(instruments).where(and(eq(instruments.firmId, firmId), inArray(instruments.code, codes.slice(i, i + 500))));
    for (const e of existing) {
      known.add(e.code);
      const w = wanted.get(e.code)!;
      if ((e.name === "" && w.name) || (e.assetClass === "unknown" && w.assetClass !== "unknown") || (e.currency === "" && w.currency) || e.pendingUpload !== null) {
        await tx
          .update(instruments)
          .set({ name: e.name || w.name, assetClass: e.assetClass === "unknown" ? w.assetClass : e.assetClass, currency: e.currency || w.currency, pendingUpload: null })
          .where(eq(instruments.id, e.id));
      }
    }
  }
  const createdAt = now().toISOString();
  const fresh = codes.filter((c) => !known.has(c)).map((code) => ({ id: crypto.randomUUID(), code, ...wanted.get(code)! }));
  await bulkInsert(tx, "instruments", ["id", "firm_id", "code", "name", "asset_class", "currency", "created_at"], fresh.map((f) => [f.id, firmId, f.code, f.name, f.assetClass, f.currency, createdAt]));
}

let currencies: Set<string> | undefined;
function isCurrencyPair(code: string): boolean {
  currencies ??= new Set(Intl.supportedValuesOf("currency"));
  return currencies.has(code.slice(0, 3)) && currencies.has(code.slice(3));
}
