/**
 * The stored data-quality report: computed once per state of its inputs, served from the store while they are
 * unchanged, computed again when a positions upload is confirmed, a price is corrected or a finding confirmed.
 * Computations are counted (qualityComputations), never timed.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { demoWorldAs, PEOPLE } from "../runs/setup";
import type { Database } from "@/db/client";
import { dataQualityReports, instruments, positions, pricePoints, uploads } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { getDataQuality, qualityComputations, qualityInputsKey } from "@/lib/data/data-quality";
import { confirmQualityItem } from "@/lib/data/quality-confirmations";
import { confirmUpload, receiveUploadBytes, type UploadContext } from "@/lib/data/uploads";

let db: Database;
let analyst: Actor;
let officer: Actor;
let pellam: Actor;
let periodId: string;
let n = 0;
const enc = (text: string) => new TextEncoder().encode(text);
const file = () => ({ key: `dq${++n}`, name: `dq-${n}.csv`, ufsUrl: `http://127.0.0.1:9/f/dq${n}` });
const context = (actor: Actor, kind: "positions" | "prices"): UploadContext => ({ firmId: actor.firmId, userId: actor.userId, userName: actor.name, periodId: kind === "positions" ? periodId : null, kind, numberFormat: "plain" });

async function storedRow() {
  const [row] = await db.select().from(dataQualityReports).where(and(eq(dataQualityReports.firmId, analyst.firmId), eq(dataQualityReports.periodId, periodId)));
  return row;
}

beforeAll(async () => {
  ({ db, periodId, analyst, officer, pellam } = await demoWorldAs({ withMethod: false }, { analyst: PEOPLE.analyst, officer: PEOPLE.officer, pellam: PEOPLE.pellamAnalyst }));
});

describe("stored data-quality report", () => {
  it("is computed once and then served from the store while its inputs are unchanged", async () => {
    const before = qualityComputations.count;
    const first = await getDataQuality(analyst, periodId);
    expect(qualityComputations.count).toBe(before + 1);
    const row = await storedRow();
    expect(row.inputsKey).toBe(await qualityInputsKey(db, analyst, periodId));
    const second = await getDataQuality(officer, periodId);
    const third = await getDataQuality(analyst, periodId);
    expect(qualityComputations.count, "served from the store, not computed").toBe(before + 1);
    expect(second).toEqual(first);
    expect(third.computedAt).toBe(first.computedAt);
    expect(first.report.items.length).toBeGreaterThan(0);
  });

  it("is computed again after a finding is confirmed, and shows the confirmation", async () => {
    const { report } = await getDataQuality(analyst, periodId);
    const item = report.items.find((i) => i.check === "extreme-return" && !i.confirmation);
    expect(item, "the demo history has a move flagged for confirmation").toBeTruthy();
    const keyBefore = (await storedRow()).inputsKey;
    await confirmQualityItem(analyst, periodId, { check: "extreme-return", instrument: item!.instrument, dates: item!.dates ?? [], reason: "Checked against the exchange's record." }, report.items);
    const before = qualityComputations.count;
    const after = await getDataQuality(analyst, periodId);
    expect(qualityComputations.count).toBe(before + 1);
    expect(after.report.items.find((i) => i.check === "extreme-return" && i.instrument === item!.instrument)?.confirmation?.reason).toBe("Checked against the exchange's record.");
    expect((await storedRow()).inputsKey).not.toBe(keyBefore);
    await getDataQuality(analyst, periodId);
    expect(qualityComputations.count).toBe(before + 1);
  });

  it("is computed again after a price correction, and reports the corrected history", async () => {
    // a recent stored close of one instrument the period holds, corrected to ten times itself: an extreme move
    const [held] = await db.select({ code: positions.instrument }).from(positions).innerJoin(uploads, eq(uploads.id, positions.uploadId)).where(and(eq(positions.firmId, analyst.firmId), eq(positions.periodId, periodId), eq(uploads.status, "confirmed"))).limit(1);
    const [instrument] = await db.select().from(instruments).where(and(eq(instruments.firmId, analyst.firmId), eq(instruments.code, held.code)));
    const points = await db.select().from(pricePoints).where(and(eq(pricePoints.firmId, analyst.firmId), eq(pricePoints.instrumentId, instrument.id), eq(pricePoints.current, true)));
    const sorted = points.sort((a, b) => a.date.localeCompare(b.date));
    const last = sorted[sorted.length - 10];
    const before = qualityComputations.count;
    const beforeReport = await getDataQuality(analyst, periodId);
    expect(qualityComputations.count).toBe(before);
    const { uploadId } = await receiveUploadBytes(context(analyst, "prices"), file(), enc(`date,instrument,close\n${last.date},${held.code},${last.close * 10}\n`));
    expect(await confirmUpload(analyst, uploadId, { acknowledgeWarnings: true })).toMatchObject({ corrected: 1 });
    const after = await getDataQuality(analyst, periodId);
    expect(qualityComputations.count).toBe(before + 1);
    const flagged = (r: typeof after) => r.report.items.some((i) => i.check === "extreme-return" && i.instrument === held.code && (i.dates ?? []).includes(last.date));
    expect(flagged(beforeReport)).toBe(false);
    expect(flagged(after), "the corrected close is an extreme move the new report names").toBe(true);
  });

  it("is computed again after a new positions upload is confirmed, for the new upload", async () => {
    const before = qualityComputations.count;
    const old = await getDataQuality(officer, periodId);
    expect(qualityComputations.count).toBe(before);
    const header = "as_of,book,instrument_id,instrument_name,asset_class,currency,quantity,price,market_value,delta_exposure,market_value_note";
    const { uploadId } = await receiveUploadBytes(context(officer, "positions"), file(), enc(`${header}\n2026-11-30,T,EQ-NEW,Newcomer,equity,EUR,10,5,50,,\n`));
    await confirmUpload(officer, uploadId, { acknowledgeWarnings: true });
    const fresh = await getDataQuality(officer, periodId);
    expect(qualityComputations.count).toBe(before + 1);
    expect(fresh.uploadId).toBe(uploadId);
    expect(old.uploadId).not.toBe(uploadId);
    expect(fresh.positions).toBe(1);
    expect(fresh.report.items.map((i) => `${i.check}:${i.instrument}`)).toContain("no-history:EQ-NEW");
    expect((await storedRow()).uploadId).toBe(uploadId);
  });

  it("never serves a stored report whose key is not the current one", async () => {
    await db.update(dataQualityReports).set({ inputsKey: "not-the-current-inputs" }).where(and(eq(dataQualityReports.firmId, analyst.firmId), eq(dataQualityReports.periodId, periodId)));
    const before = qualityComputations.count;
    await getDataQuality(analyst, periodId);
    expect(qualityComputations.count).toBe(before + 1);
    expect((await storedRow()).inputsKey).toBe(await qualityInputsKey(db, analyst, periodId));
  });

  it("is another firm's period: not found, and nothing stored for it", async () => {
    await expect(getDataQuality(pellam, periodId)).rejects.toMatchObject({ kind: "not_found" });
    const rows = await db.select().from(dataQualityReports).where(eq(dataQualityReports.firmId, pellam.firmId));
    expect(rows).toHaveLength(0);
  });
});
