/**
 * The kept history check of a run start (history_checks): counted once per positions upload, period end, minimum
 * history and state of the price history, then read by every start; counted again (and the earlier state's row
 * replaced) once a price-history upload is confirmed; kept ahead of the next start by the data-quality job and by a
 * start that goes ahead, never by a refused one. Whether a start read the kept check is shown by what it answers,
 * never by timing. The tests run in order on one world (the correction of the second queues the third's job).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import type { Database } from "@/db/client";
import { historyChecks, instruments, pricePoints } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { assessHistoryOfUpload, keptHistoryAssessment, startRun } from "@/lib/data/runs";
import { priceHistoryState } from "@/lib/data/run-freshness";
import { confirmedPositionsUpload } from "@/lib/data/data-quality";
import { currentMethod } from "@/lib/data/method";
import { getPeriod } from "@/lib/data/periods";
import { confirmUpload, receiveUploadBytes } from "@/lib/data/uploads";
import { dataQualityJob } from "@/lib/jobs/kinds/data-quality";
import { Worker } from "@/lib/jobs/worker";
import { demoWorldAs, PEOPLE } from "./setup";

let db: Database;
let analyst: Actor;
let periodId: string;
let uploadId: string;
let periodEnd: string;
let minHistory: number;

const rowsOfFirm = () => db.select().from(historyChecks).where(eq(historyChecks.firmId, analyst.firmId));

beforeAll(async () => {
  ({ db, periodId, analyst } = await demoWorldAs({ withMethod: true }, { analyst: PEOPLE.analyst }));
  uploadId = (await confirmedPositionsUpload(analyst, periodId))!.id;
  periodEnd = (await getPeriod(analyst, periodId)).periodEnd;
  minHistory = (await currentMethod(analyst))!.content.minHistory;
  await db.delete(historyChecks);
}, 120_000);

describe("the kept history check of a run start", () => {
  it("is counted once for the state of the price history, kept, and then read by a start", async () => {
    const counted = await assessHistoryOfUpload(analyst, uploadId, periodEnd, minHistory);
    // The demo book has factors short of history, so a start without leave to exclude them is refused, naming them;
    // a refused start stores nothing, not even what it counted.
    expect(counted.short.length).toBeGreaterThan(0);
    await expect(startRun(analyst, periodId)).rejects.toThrow(counted.short[0].factor);
    expect(await rowsOfFirm()).toEqual([]);
    expect(await keptHistoryAssessment(analyst, uploadId, periodEnd, minHistory)).toEqual(counted);
    const [row, ...more] = await rowsOfFirm();
    expect(more).toEqual([]);
    expect(row).toMatchObject({ uploadId, periodEnd, minHistory, priceState: await priceHistoryState(analyst.firmId), assessment: counted });
    // A kept check that says no position is usable: the start answers from it, without counting again.
    await db.update(historyChecks).set({ assessment: { ...counted, positionsUsable: 0 } }).where(eq(historyChecks.uploadId, uploadId));
    await expect(startRun(analyst, periodId, { excludeShortHistory: true })).rejects.toThrow(/no position's price history reaches/);
    await db.update(historyChecks).set({ assessment: counted }).where(eq(historyChecks.uploadId, uploadId));
  });

  it("is counted again after a price-history upload is confirmed, replacing the earlier state's row", async () => {
    const stateBefore = await priceHistoryState(analyst.firmId);
    const counted = await assessHistoryOfUpload(analyst, uploadId, periodEnd, minHistory);
    await db.update(historyChecks).set({ assessment: { ...counted, positionsUsable: 0 } }).where(eq(historyChecks.uploadId, uploadId));
    // one close of a held instrument corrected: a new state of the price history
    const held = counted.factors.find((f) => f.returns > 100)!;
    const [instrument] = await db.select().from(instruments).where(and(eq(instruments.firmId, analyst.firmId), eq(instruments.code, held.factor)));
    const [point] = await db.select().from(pricePoints).where(and(eq(pricePoints.instrumentId, instrument.id), eq(pricePoints.current, true))).limit(1);
    const context = { firmId: analyst.firmId, userId: analyst.userId, userName: analyst.name, periodId: null, kind: "prices" as const, numberFormat: "plain" as const };
    const file = { key: "hc1", name: "correction.csv", ufsUrl: "http://127.0.0.1:9/f/hc1" };
    const { uploadId: priceUpload } = await receiveUploadBytes(context, file, new TextEncoder().encode(`date,instrument,close\n${point.date},${held.factor},${point.close * 1.01}\n`));
    await confirmUpload(analyst, priceUpload, { acknowledgeWarnings: true });
    const stateAfter = await priceHistoryState(analyst.firmId);
    expect(stateAfter).not.toBe(stateBefore);

    const recounted = await keptHistoryAssessment(analyst, uploadId, periodEnd, minHistory);
    expect(recounted).toEqual(await assessHistoryOfUpload(analyst, uploadId, periodEnd, minHistory));
    expect(recounted.positionsUsable).toBeGreaterThan(0);
    expect((await rowsOfFirm()).map((r) => r.priceState)).toEqual([stateAfter]);
  });

  it("is kept for the period's book by the data-quality job that a confirmation queues", async () => {
    await db.delete(historyChecks);
    const worker = new Worker({ db, kinds: { "data-quality": dataQualityJob }, owner: "history-check-test", log: () => undefined });
    let ran = 0;
    while ((await worker.runOne())?.outcome === "completed") ran++;
    expect(ran, "the correction above queued the period's data-quality job").toBeGreaterThan(0);
    const [row, ...more] = await rowsOfFirm();
    expect(more).toEqual([]);
    expect(row).toMatchObject({ uploadId, periodEnd, minHistory, priceState: await priceHistoryState(analyst.firmId) });
    expect(row.assessment).toEqual(await assessHistoryOfUpload(analyst, uploadId, periodEnd, minHistory));
  });

  it("is kept by a start that goes ahead, for the next one", async () => {
    await db.delete(historyChecks);
    const run = await startRun(analyst, periodId, { excludeShortHistory: true });
    expect(run.status).toBe("queued");
    const [row, ...more] = await rowsOfFirm();
    expect(more).toEqual([]);
    expect(row).toMatchObject({ uploadId, periodEnd, minHistory, priceState: await priceHistoryState(analyst.firmId) });
    expect(row.assessment).toEqual(await assessHistoryOfUpload(analyst, uploadId, periodEnd, minHistory));
  });
});
