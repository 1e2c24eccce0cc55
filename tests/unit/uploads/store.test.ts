import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { actorFor, snapshot } from "../helpers/db";
import { SEEDED, worldAs } from "../helpers/people";
import { receiveUploadBytes, confirmUpload, cancelUpload, listUploads, getUploadPreview, type UploadContext } from "@/lib/data/uploads";
import { listPeriods } from "@/lib/data/periods";
import { getDataQuality } from "@/lib/data/data-quality";
import { positions, pricePoints } from "@/db/schema";
import type { Database } from "@/db/client";
import type { Actor } from "@/lib/auth/actor";

const HEADER = "as_of,book,instrument_id,instrument_name,asset_class,currency,quantity,price,market_value,delta_exposure";
const enc = (text: string) => new TextEncoder().encode(text);
let db: Database;
let officer: Actor;
let analyst: Actor;
let periodId: string;
let n = 0;

function context(actor: Actor, kind: "positions" | "prices"): UploadContext {
  return { firmId: actor.firmId, userId: actor.userId, userName: actor.name, periodId: kind === "positions" ? periodId : null, kind, numberFormat: "plain" };
}
const file = () => ({ key: `k${++n}`, name: `file-${n}.csv`, ufsUrl: `http://127.0.0.1:9/f/k${n}` });

beforeAll(async () => {
  ({ db, officer, analyst } = await worldAs({ officer: SEEDED.northmoorOfficer, analyst: SEEDED.northmoorAnalyst }));
  periodId = (await listPeriods(officer))[0].id;
});

describe("positions uploads", () => {
  it("stores nothing until confirmed, then stores every row in the period", async () => {
    const { uploadId } = await receiveUploadBytes(context(officer, "positions"), file(), enc(`${HEADER}\n2026-11-30,T,EQ-A,Alpha,equity,EUR,10,5,50,\n2026-11-30,T,EQ-B,Beta,etf,EUR,-4,25,-100,\n`));
    expect(await db.select().from(positions)).toHaveLength(0);
    const result = await confirmUpload(officer, uploadId, { acknowledgeWarnings: false });
    expect(result).toMatchObject({ status: "confirmed", stored: 2 });
    expect(await db.select().from(positions).where(eq(positions.uploadId, uploadId))).toHaveLength(2);
  });

  it("recognises the same file by its SHA-256 and does not store it twice", async () => {
    const bytes = enc(`${HEADER}\n2026-11-30,T,EQ-A,Alpha,equity,EUR,10,5,50,\n2026-11-30,T,EQ-B,Beta,etf,EUR,-4,25,-100,\n`);
    const before = (await listUploads(officer)).length;
    const again = await receiveUploadBytes(context(officer, "positions"), file(), bytes);
    expect(again.duplicate).toBe(true);
    expect((await listUploads(officer)).length).toBe(before);
  });

  it("supersedes the earlier confirmed upload of the period, keeping both", async () => {
    const [first] = (await listUploads(officer, { kind: "positions" })).filter((u) => u.status === "confirmed");
    const { uploadId } = await receiveUploadBytes(context(officer, "positions"), file(), enc(`${HEADER}\n2026-11-30,T,EQ-A,Alpha,equity,EUR,12,5,60,\n`));
    await confirmUpload(officer, uploadId, { acknowledgeWarnings: false });
    const all = await listUploads(officer, { kind: "positions" });
    expect(all.find((u) => u.id === first.id)).toMatchObject({ status: "superseded", supersededBy: uploadId });
    expect(all.find((u) => u.id === uploadId)?.status).toBe("confirmed");
    expect(await db.select().from(positions).where(eq(positions.uploadId, first.id))).toHaveLength(2);
  });

  it("refuses to confirm a file with errors and leaves everything as it was", async () => {
    const { uploadId } = await receiveUploadBytes(context(officer, "positions"), file(), enc(`${HEADER}\n2026-11-30,T,EQ-A,Alpha,equity,EUX,10,5,50,\n`));
    const before = await snapshot(db);
    await expect(confirmUpload(officer, uploadId, { acknowledgeWarnings: true })).rejects.toMatchObject({ kind: "unprocessable", message: expect.stringContaining("1 error") });
    expect(await snapshot(db)).toEqual(before);
  });

  it("asks for warnings to be acknowledged before confirming", async () => {
    // a position dated before the period end, in the period's month: a warning (a market value that disagrees is an error)
    const { uploadId } = await receiveUploadBytes(context(officer, "positions"), file(), enc(`${HEADER}\n2026-11-27,T,EQ-A,Alpha,equity,EUR,10,5,50,\n`));
    await expect(confirmUpload(officer, uploadId, { acknowledgeWarnings: false })).rejects.toMatchObject({ fields: { acknowledgeWarnings: expect.any(String) } });
    await expect(confirmUpload(officer, uploadId, { acknowledgeWarnings: true })).resolves.toMatchObject({ status: "confirmed" });
  });

  it("cancels a pending upload without touching the period", async () => {
    const { uploadId } = await receiveUploadBytes(context(officer, "positions"), file(), enc(`${HEADER}\n2026-11-30,T,EQ-Z,Zed,equity,EUR,1,5,5,\n`));
    const rowsBefore = (await db.select().from(positions)).length;
    await cancelUpload(officer, uploadId);
    expect((await db.select().from(positions)).length).toBe(rowsBefore);
    await expect(confirmUpload(officer, uploadId, { acknowledgeWarnings: true })).rejects.toMatchObject({ kind: "conflict" });
  });

  it("does not let a role without the permission confirm", async () => {
    const { uploadId } = await receiveUploadBytes(context(officer, "positions"), file(), enc(`${HEADER}\n2026-11-30,T,EQ-Y,Why,equity,EUR,1,5,5,\n`));
    await expect(confirmUpload(analyst, uploadId, { acknowledgeWarnings: true })).rejects.toMatchObject({ kind: "forbidden" });
  });

  it("answers not-found for another firm's upload", async () => {
    const other = await actorFor("june.okafor@pellam.example");
    const [mine] = await listUploads(officer);
    await expect(getUploadPreview(other, mine.id)).rejects.toMatchObject({ kind: "not_found" });
  });
});

describe("price history uploads", () => {
  it("extends the history, and keeps a corrected price as history", async () => {
    const first = await receiveUploadBytes(context(analyst, "prices"), file(), enc("date,instrument,close\n2026-11-26,EQ-A,5\n2026-11-27,EQ-A,5.1\n2026-11-27,USDEUR,0.92\n"));
    expect(await confirmUpload(analyst, first.uploadId, { acknowledgeWarnings: false })).toMatchObject({ added: 3, corrected: 0 });
    const second = await receiveUploadBytes(context(analyst, "prices"), file(), enc("date,instrument,close\n2026-11-27,EQ-A,5.2\n2026-11-30,EQ-A,5.3\n2026-11-27,USDEUR,0.92\n"));
    const result = await confirmUpload(analyst, second.uploadId, { acknowledgeWarnings: false });
    expect(result).toMatchObject({ added: 1, corrected: 1, unchanged: 1, corrections: [{ instrument: "EQ-A", date: "2026-11-27", from: 5.1, to: 5.2 }] });
    const points = await db.select().from(pricePoints).where(and(eq(pricePoints.firmId, analyst.firmId), eq(pricePoints.date, "2026-11-27")));
    const eqA = points.filter((p) => p.close === 5.1 || p.close === 5.2);
    expect(eqA.find((p) => p.close === 5.1)).toMatchObject({ current: false, replacedByUpload: second.uploadId });
    expect(eqA.find((p) => p.close === 5.2)).toMatchObject({ current: true });
  });
});

describe("data-quality report", () => {
  it("lists instruments without history and currencies without exchange rates", async () => {
    const { uploadId } = await receiveUploadBytes(
      context(officer, "positions"),
      file(),
      // the NOK position says where its value's rate came from: without a NOKEUR series the upload refuses it otherwise
      enc(`${HEADER},market_value_note\n2026-11-30,T,EQ-A,Alpha,equity,EUR,10,5.3,53,,\n2026-11-30,T,EQ-N,Nordic,equity,NOK,10,100,85.5,,Valued at the custodian's rate\n`),
    );
    await confirmUpload(officer, uploadId, { acknowledgeWarnings: true });
    const { report } = await getDataQuality(officer, periodId);
    const checks = report.items.map((i) => `${i.check}:${i.instrument}`);
    expect(checks).toContain("no-history:EQ-N");
    expect(checks).toContain("missing-fx:EQ-N");
    expect(checks).toContain("short-history:EQ-A");
    expect(report.counts.error).toBeGreaterThanOrEqual(2);
  });
});
