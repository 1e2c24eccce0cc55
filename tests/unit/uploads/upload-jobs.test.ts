/**
 * Uploads through the job queue, as the web tier hands them over: the upload service's callback answers before the
 * file is read; a worker reads and checks it (in a thread of its own) and stores what it read in parts; the preview
 * pages through those parts; a confirmation is queued and a worker stores the rows in short transactions that no
 * reader sees, then makes them count in one last step. An interrupted confirmation leaves nothing counted and can be
 * retried; a price confirmation that finds the history changed meanwhile starts again and accounts for the change.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq, inArray } from "drizzle-orm";
import path from "node:path";
import type { Database } from "@/db/client";
import { auditEvents, instruments, jobs, positions, pricePoints, uploadParts, uploads } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import {
  applyConfirm,
  cancelUpload,
  confirmUpload,
  getUploadPreview,
  getUploadRows,
  listUploads,
  readUpload,
  receiveUpload,
  receiveUploadBytes,
  requestConfirm,
  updateUploadOptions,
  type UploadContext,
} from "@/lib/data/uploads";
import { listPeriods } from "@/lib/data/periods";
import { priceCoverage } from "@/lib/data/prices";
import { uploadReadJob } from "@/lib/jobs/kinds/upload-read";
import { uploadConfirmJob } from "@/lib/jobs/kinds/upload-confirm";
import { Worker } from "@/lib/jobs/worker";
import { startUploadStandIn, storeFileInStandIn } from "@/scripts/upload-standin";
import { SEEDED, worldAs } from "../helpers/people";

const HEADER = "as_of,book,instrument_id,instrument_name,asset_class,currency,quantity,price,market_value,delta_exposure";
const enc = (text: string) => new TextEncoder().encode(text);
const book = (rows: number, tag: string) => {
  const lines = [HEADER];
  for (let i = 0; i < rows; i++) lines.push(`2026-11-30,B${i % 3},${tag}-${i},Name ${i},equity,EUR,${(i % 9) + 1},10,${((i % 9) + 1) * 10},`);
  return enc(lines.join("\n") + "\n");
};

let db: Database;
let officer: Actor;
let analyst: Actor;
let periodId: string;
let worker: Worker;
let store: Awaited<ReturnType<typeof startUploadStandIn>>;
let storeDir: string;
let n = 0;

function context(actor: Actor, kind: "positions" | "prices"): UploadContext {
  return { firmId: actor.firmId, userId: actor.userId, userName: actor.name, periodId: kind === "positions" ? periodId : null, kind, numberFormat: "plain" };
}
/** Put bytes in the upload service, as a browser upload would, and hand them over as its callback does. */
async function handOver(actor: Actor, kind: "positions" | "prices", bytes: Uint8Array) {
  const key = `job-file-${++n}`;
  storeFileInStandIn(storeDir, key, `${key}.csv`, bytes);
  return receiveUpload(context(actor, kind), { key, name: `${key}.csv`, size: bytes.length, ufsUrl: `${store.url}/f/${key}` });
}
const statusOf = async (id: string) => (await db.select({ status: uploads.status }).from(uploads).where(eq(uploads.id, id)))[0].status;
const positionsOf = async (id: string) => (await db.select({ id: positions.id }).from(positions).where(eq(positions.uploadId, id))).length;
const partsOf = async (id: string) => (await db.select({ id: uploadParts.id }).from(uploadParts).where(eq(uploadParts.uploadId, id))).length;

beforeAll(async () => {
  ({ db, officer, analyst } = await worldAs({ officer: SEEDED.northmoorOfficer, analyst: SEEDED.northmoorAnalyst }));
  periodId = (await listPeriods(officer))[0].id;
  storeDir = path.join(path.dirname(process.env.DATABASE_URL!.slice("file:".length)), "job-store");
  const token = Buffer.from(JSON.stringify({ apiKey: "sk_upload_jobs", appId: "jobs", regions: ["local"] })).toString("base64");
  store = await startUploadStandIn({ token, port: 0, dir: storeDir });
  worker = new Worker({ db, kinds: { "upload-read": uploadReadJob, "upload-confirm": uploadConfirmJob }, owner: "upload-test-worker", log: () => undefined });
}, 120_000);

afterAll(async () => {
  await store?.close();
});

describe("an upload handed over by the upload service", () => {
  let uploadId = "";

  it("is recorded at once as being read, with its reading queued, and nothing read yet", async () => {
    ({ uploadId } = await handOver(officer, "positions", book(2_500, "JOB")));
    const row = (await db.select().from(uploads).where(eq(uploads.id, uploadId)))[0];
    expect(row).toMatchObject({ status: "reading", sha256: "", rowCount: 0, summary: null });
    expect((await db.select().from(jobs).where(eq(jobs.dedupeKey, `upload-read:${uploadId}`)))[0]).toMatchObject({ kind: "upload-read", state: "queued", maxAttempts: 3 });
    const preview = await getUploadPreview(officer, uploadId);
    expect(preview.upload.status).toBe("reading");
    expect(preview.job).toMatchObject({ state: "queued" });
    await expect(getUploadRows(officer, uploadId, 1, 25)).rejects.toMatchObject({ kind: "conflict" });
  });

  it("is read by a worker (in a thread), hashed, checked and stored in parts; the preview pages through them", async () => {
    expect((await worker.runOne())?.outcome).toBe("completed");
    const preview = await getUploadPreview(officer, uploadId);
    expect(preview.upload).toMatchObject({ status: "pending", rowCount: 2_500, errorCount: 0 });
    expect(preview.upload.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(preview.header).toContain("instrument_id");
    expect(await partsOf(uploadId)).toBe(3); // 2,500 rows in parts of 1,000; no problems
    const page = await getUploadRows(officer, uploadId, 41, 25); // rows 1,001–1,025 span the first and second part
    expect(page.total).toBe(2_500);
    expect(page.rows).toHaveLength(25);
    expect((page.rows[0] as { instrument: string }).instrument).toBe("JOB-1000");
    expect((await getUploadRows(officer, uploadId, 100, 25)).rows.map((r) => (r as { instrument: string }).instrument).at(-1)).toBe("JOB-2499");
    const [received] = await db.select().from(auditEvents).where(and(eq(auditEvents.action, "upload.receive"), eq(auditEvents.entityId, uploadId)));
    expect(received).toMatchObject({ actorId: officer.userId, actorName: officer.name });
  });

  it("reads rows stored under the earlier field name (instrumentId) under today's (instrument), in the preview and the confirmation", async () => {
    const [first] = await db.select().from(uploadParts).where(and(eq(uploadParts.uploadId, uploadId), eq(uploadParts.part, "rows"), eq(uploadParts.seq, 0)));
    const earlier = (first.items as Record<string, unknown>[]).map((r) => Object.fromEntries(Object.entries(r).map(([k, v]) => [k === "instrument" ? "instrumentId" : k, v])));
    await db.update(uploadParts).set({ items: earlier }).where(eq(uploadParts.id, first.id));
    const page = await getUploadRows(officer, uploadId, 1, 25);
    expect(Object.keys(page.rows[0] as object)).toEqual(Object.keys(earlier[0]).map((k) => (k === "instrumentId" ? "instrument" : k)));
    expect((page.rows[0] as { instrument: string }).instrument).toBe("JOB-0");
  });

  it("is confirmed through the queue: answered at once, stored by the worker, counted in one last step", async () => {
    await expect(requestConfirm(officer, uploadId, { acknowledgeWarnings: false })).resolves.toEqual({ status: "confirming" });
    expect(await statusOf(uploadId)).toBe("confirming");
    expect(await positionsOf(uploadId)).toBe(0);
    await expect(requestConfirm(officer, uploadId, { acknowledgeWarnings: false })).rejects.toMatchObject({ kind: "conflict" });
    expect((await worker.runOne())?.outcome).toBe("completed");
    expect(await statusOf(uploadId)).toBe("confirmed");
    expect(await positionsOf(uploadId)).toBe(2_500);
    expect(await partsOf(uploadId)).toBe(0);
    const preview = await getUploadPreview(officer, uploadId);
    expect(preview.upload.summary).toMatchObject({ confirmed: { stored: 2_500 } });
    const [job] = await db.select().from(jobs).where(eq(jobs.dedupeKey, `upload-confirm:${uploadId}`));
    expect(job).toMatchObject({ state: "completed", result: { status: "confirmed", stored: 2_500 } });
  });

  it("the same file handed over again is recognised by its SHA-256 when read, points to the first, and is not listed", async () => {
    const again = await handOver(officer, "positions", book(2_500, "JOB"));
    expect((await worker.runOne())?.outcome).toBe("completed");
    const preview = await getUploadPreview(officer, again.uploadId);
    expect(preview.upload.status).toBe("duplicate");
    expect(preview.upload.summary).toEqual({ duplicateOf: uploadId });
    expect((await listUploads(officer)).map((u) => u.id)).not.toContain(again.uploadId);
  });

  it("a file cancelled while it is read keeps nothing of what was read", async () => {
    const { uploadId: id } = await handOver(officer, "positions", book(10, "CANCEL"));
    await cancelUpload(officer, id);
    expect((await worker.runOne())?.outcome).toBe("completed");
    expect(await statusOf(id)).toBe("cancelled");
    expect(await partsOf(id)).toBe(0);
  });

  it("re-reading with other settings queues the reading again and answers before it is done", async () => {
    const { uploadId: id } = await handOver(officer, "positions", enc(`${HEADER}\n2026-11-30,T,RR-1,Alpha,equity,EUR,"1,000",5,"5,000",\n`));
    await worker.runOne();
    expect((await getUploadPreview(officer, id)).upload.errorCount).toBeGreaterThan(0);
    const asked = await updateUploadOptions(officer, id, { numberFormat: "comma-thousands" });
    expect(asked.upload.status).toBe("reading");
    await expect(updateUploadOptions(officer, id, { numberFormat: "comma-thousands" })).rejects.toMatchObject({ kind: "conflict" });
    await worker.runOne();
    const reread = await getUploadPreview(officer, id);
    expect(reread.upload).toMatchObject({ status: "pending", errorCount: 0, rowCount: 1 });
    await cancelUpload(officer, id);
  });
});

describe("an interrupted confirmation", () => {
  it("of positions leaves the period as it was, and a second try stores every row once", async () => {
    const { uploadId } = await receiveUploadBytes(context(officer, "positions"), { key: "int-1", name: "interrupted.csv", ufsUrl: "http://127.0.0.1:9/f/int-1" }, book(45_000, "INT"));
    const before = (await listUploads(officer)).filter((u) => u.kind === "positions" && u.status === "confirmed").map((u) => u.id);
    const controller = new AbortController();
    const stages: string[] = [];
    const by = { userId: officer.userId, name: officer.name };
    await expect(
      applyConfirm(officer.firmId, uploadId, {
        from: "pending",
        by,
        warningsAcknowledged: 0,
        signal: controller.signal,
        progress: async (stage) => {
          stages.push(stage);
          if (stage.startsWith("Stored")) controller.abort(); // the worker loses its lease after the first batch
        },
      }),
    ).rejects.toThrow(/Stopped/);
    expect(stages[0]).toMatch(/^Stored 5,000 positions of 45,000$/);
    expect(await statusOf(uploadId)).toBe("pending");
    expect(await positionsOf(uploadId)).toBe(5_000); // staged under an upload no reader reads
    expect((await listUploads(officer)).filter((u) => u.kind === "positions" && u.status === "confirmed").map((u) => u.id)).toEqual(before);
    await expect(confirmUpload(officer, uploadId, { acknowledgeWarnings: false })).resolves.toMatchObject({ status: "confirmed", stored: 45_000 });
    expect(await positionsOf(uploadId)).toBe(45_000);
  }, 120_000);

  it("of prices shows none of its closes until the last step, and a second try counts each once", async () => {
    const lines = ["date,instrument,close"];
    for (let i = 0; i < 25_000; i++) lines.push(`2026-${String(1 + (i % 10)).padStart(2, "0")}-${String(1 + Math.floor(i / 10) % 28).padStart(2, "0")},STG-${Math.floor(i / 280)},${100 + (i % 7)}`);
    const { uploadId } = await receiveUploadBytes(context(analyst, "prices"), { key: "int-2", name: "staged.csv", ufsUrl: "http://127.0.0.1:9/f/int-2" }, enc(lines.join("\n") + "\n"));
    const pending = await getUploadPreview(analyst, uploadId);
    expect(pending.upload.errorCount).toBe(0);
    const points = pending.upload.rowCount;
    const coverage = JSON.stringify(await priceCoverage(analyst));
    const controller = new AbortController();
    await expect(
      applyConfirm(analyst.firmId, uploadId, { from: "pending", by: { userId: analyst.userId, name: analyst.name }, warningsAcknowledged: 0, signal: controller.signal, progress: async (stage) => void (stage.startsWith("Stored") && controller.abort()) }),
    ).rejects.toThrow(/Stopped/);
    const staged = await db.select({ current: pricePoints.current }).from(pricePoints).where(and(eq(pricePoints.uploadId, uploadId), eq(pricePoints.staged, true)));
    expect(staged.length).toBe(5_000);
    expect(staged.every((p) => !p.current)).toBe(true);
    expect(JSON.stringify(await priceCoverage(analyst))).toBe(coverage);
    await expect(confirmUpload(analyst, uploadId, { acknowledgeWarnings: false })).resolves.toMatchObject({ status: "confirmed", added: points, corrected: 0 });
    const stored = await db.select({ current: pricePoints.current, staged: pricePoints.staged }).from(pricePoints).where(eq(pricePoints.uploadId, uploadId));
    expect(stored).toHaveLength(points);
    expect(stored.every((p) => p.current && !p.staged)).toBe(true);
    expect(await db.select({ id: instruments.id }).from(instruments).where(and(eq(instruments.firmId, analyst.firmId), eq(instruments.pendingUpload, uploadId)))).toEqual([]);
  }, 120_000);

  it("of prices, then cancelled, leaves no instrument it added: the new codes were pending, listed nowhere", async () => {
    const { uploadId } = await receiveUploadBytes(context(analyst, "prices"), { key: "int-3", name: "pending.csv", ufsUrl: "http://127.0.0.1:9/f/int-3" }, enc("date,instrument,close\n2026-11-26,PEND-A,10\n2026-11-27,PEND-A,11\n2026-11-27,PEND-B,5\n"));
    const coverage = JSON.stringify(await priceCoverage(analyst));
    await expect(
      applyConfirm(analyst.firmId, uploadId, { from: "pending", by: { userId: analyst.userId, name: analyst.name }, warningsAcknowledged: 0, progress: async (stage) => void (stage.startsWith("Making") && (() => { throw new Error("Stopped before the last step"); })()) }),
    ).rejects.toThrow(/Stopped/);
    const pending = await db.select({ code: instruments.code, pendingUpload: instruments.pendingUpload }).from(instruments).where(and(eq(instruments.firmId, analyst.firmId), eq(instruments.pendingUpload, uploadId)));
    expect(pending.map((i) => i.code).sort()).toEqual(["PEND-A", "PEND-B"]);
    expect(JSON.stringify(await priceCoverage(analyst))).toBe(coverage);
    await cancelUpload(analyst, uploadId);
    expect(await db.select({ id: instruments.id }).from(instruments).where(and(eq(instruments.firmId, analyst.firmId), inArray(instruments.code, ["PEND-A", "PEND-B"])))).toEqual([]);
    expect(await db.select({ id: pricePoints.id }).from(pricePoints).where(eq(pricePoints.uploadId, uploadId))).toEqual([]);
  });

  it("of prices that finds the history changed meanwhile starts again and accounts for the change", async () => {
    const first = await receiveUploadBytes(context(analyst, "prices"), { key: "race-1", name: "race-1.csv", ufsUrl: "http://127.0.0.1:9/f/race-1" }, enc("date,instrument,close\n2026-11-26,RACE,10\n2026-11-27,RACE,11\n"));
    const second = await receiveUploadBytes(context(analyst, "prices"), { key: "race-2", name: "race-2.csv", ufsUrl: "http://127.0.0.1:9/f/race-2" }, enc("date,instrument,close\n2026-11-27,RACE,12\n"));
    let raced = false;
    const result = await applyConfirm(analyst.firmId, first.uploadId, {
      from: "pending",
      by: { userId: analyst.userId, name: analyst.name },
      warningsAcknowledged: 0,
      progress: async (stage) => {
        if (stage.startsWith("Making") && !raced) {
          raced = true; // another upload setting 2026-11-27 is confirmed between the staging and the last step
          await confirmUpload(analyst, second.uploadId, { acknowledgeWarnings: false });
        }
      },
    });
    // on its second try the first file finds 11-27 at 12 (from the second) and corrects it to 11
    expect(result).toMatchObject({ status: "confirmed", added: 1, corrected: 1, unchanged: 0 });
    const current = await db.select({ date: pricePoints.date, close: pricePoints.close }).from(pricePoints).where(and(eq(pricePoints.firmId, analyst.firmId), eq(pricePoints.current, true), eq(pricePoints.uploadId, first.uploadId)));
    expect(current.sort((a, b) => a.date.localeCompare(b.date))).toEqual([
      { date: "2026-11-26", close: 10 },
      { date: "2026-11-27", close: 11 },
    ]);
    const stale = await db.select({ id: pricePoints.id }).from(pricePoints).where(and(eq(pricePoints.uploadId, first.uploadId), eq(pricePoints.staged, true)));
    expect(stale).toHaveLength(0);
  });

  it("given up by the worker puts the upload back to pending, saying why", async () => {
    const { uploadId } = await handOver(officer, "positions", book(5, "GIVEUP"));
    expect((await worker.runOne())?.outcome).toBe("completed");
    await requestConfirm(officer, uploadId, { acknowledgeWarnings: false });
    const [job] = await db.select().from(jobs).where(eq(jobs.dedupeKey, `upload-confirm:${uploadId}`));
    await uploadConfirmJob.onGivenUp!(job, db, "Interrupted: the worker running this job stopped.");
    const preview = await getUploadPreview(officer, uploadId);
    expect(preview.upload.status).toBe("pending");
    expect(String((preview.upload.summary as { confirmError?: string }).confirmError)).toMatch(/^Confirming did not finish: Interrupted/);
    await db.update(jobs).set({ state: "failed" }).where(eq(jobs.id, job.id));
    await expect(requestConfirm(officer, uploadId, { acknowledgeWarnings: false })).resolves.toEqual({ status: "confirming" });
    expect((await worker.runOne())?.outcome).toBe("completed");
    expect(await positionsOf(uploadId)).toBe(5);
  });

  it("a reading that cannot finish marks the upload failed, and it can be read again", async () => {
    const { uploadId } = await handOver(officer, "positions", book(3, "FAIL"));
    const [job] = await db.select().from(jobs).where(eq(jobs.dedupeKey, `upload-read:${uploadId}`));
    await uploadReadJob.onGivenUp!(job, db, "Interrupted: the worker running this job stopped.");
    await db.update(jobs).set({ state: "interrupted" }).where(eq(jobs.id, job.id));
    const failed = await getUploadPreview(officer, uploadId);
    expect(failed.upload.status).toBe("failed");
    await expect(requestConfirm(officer, uploadId, { acknowledgeWarnings: false })).rejects.toMatchObject({ kind: "conflict" });
    await updateUploadOptions(officer, uploadId, { numberFormat: "plain" });
    expect(await readUpload(officer.firmId, uploadId)).toMatchObject({ status: "pending", rows: 3 });
    // the file's receipt is in the audit trail once, from the read that got through
    expect(await db.select().from(auditEvents).where(and(eq(auditEvents.action, "upload.receive"), eq(auditEvents.entityId, uploadId)))).toHaveLength(1);
  });
});
