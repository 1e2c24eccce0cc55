/**
 * Runs through the job queue: the start answers with a queued run and its job before reading the book; a worker
 * gathers, stores and computes; a reproduction goes through the queue too; the SQL history check of the start gives
 * the same answer as assessHistory over the gathered closes; a run whose worker stopped is interrupted as soon as its
 * lease runs out (by a read, or by another worker's sweep) and frees the period; a run given back by a stopping
 * worker after its inputs were stored computes again to the same figures. Lease time is driven by back-dating the
 * lease or through the worker's injected clock; nothing sleeps.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { createClient } from "@libsql/client";
import type { Database } from "@/db/client";
import { jobs, runInputs, runs } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { assessHistoryOfUpload, getRun, getRunInputs, latestBookInputs, packInputs, reproduceRun, startRun } from "@/lib/data/runs";
import { confirmedPositionsUpload } from "@/lib/data/data-quality";
import { currentMethod } from "@/lib/data/method";
import { assessHistory } from "@/lib/runs/compute";
import { alignReturns } from "@/lib/runs/align";
import { inputHashesOf } from "@/lib/runs/compare";
import { claim, LEASE_MS, release, wallClock } from "@/lib/jobs/queue";
import { runJob } from "@/lib/jobs/kinds/run";
import { Worker } from "@/lib/jobs/worker";
import { demoWorldAs, PEOPLE } from "./setup";

let db: Database;
let analyst: Actor;
let periodId: string;
let worker: Worker;

beforeAll(async () => {
  ({ db, periodId, analyst } = await demoWorldAs({ withMethod: true }, { analyst: PEOPLE.analyst }));
  worker = new Worker({ db, kinds: { run: runJob }, owner: "test-worker", log: () => undefined });
}, 120_000);

const jobOf = async (runId: string) => (await db.select().from(jobs).where(eq(jobs.dedupeKey, `run:${runId}`)))[0];

describe("a run through the queue", () => {
  it("is queued with its job and no inputs; the worker gathers, stores and computes them", async () => {
    const queued = await startRun(analyst, periodId, { excludeShortHistory: true });
    expect(queued).toMatchObject({ status: "queued", progress: 0, inputHashes: null });
    expect(await db.select().from(runInputs).where(eq(runInputs.runId, queued.id))).toEqual([]);
    expect(await jobOf(queued.id)).toMatchObject({ kind: "run", state: "queued", firmId: analyst.firmId, maxAttempts: 1, payload: { runId: queued.id, excludeShortHistory: true } });

    const ran = await worker.runOne();
    expect(ran).toMatchObject({ outcome: "completed" });
    const run = await getRun(analyst, queued.id);
    expect(run).toMatchObject({ status: "completed", stage: "done", progress: 1 });
    expect(inputHashesOf(await getRunInputs(analyst, run.id))).toEqual(run.inputHashes);
    expect(await jobOf(queued.id)).toMatchObject({ state: "completed", result: { outcome: "completed" } });

    const reproduction = await reproduceRun(analyst, run.id);
    expect(reproduction).toMatchObject({ status: "queued", inputHashes: run.inputHashes });
    expect((await worker.runOne())?.outcome).toBe("completed");
    const done = await getRun(analyst, reproduction.id);
    expect(done.status).toBe("completed");
    expect(done.results!.reproduction!.matches).toBe(true);
  }, 180_000);

  it("extends its lease as each long step of storing ends, not only on the worker's timer (which a busy loop holds up)", async () => {
    const queued = await startRun(analyst, periodId, { excludeShortHistory: true });
    // the run's stage at each lease extension the run asks for itself (the worker's timer beats apart from these)
    const stages: string[] = [];
    const recording = new Worker({
      db,
      owner: "recording-worker",
      log: () => undefined,
      kinds: {
        run: {
          ...runJob,
          handle: (context) =>
            runJob.handle({
              ...context,
              heartbeat: async () => {
                const [row] = await db.select({ stage: runs.stage }).from(runs).where(eq(runs.id, queued.id));
                stages.push(row.stage ?? "");
                return context.heartbeat();
              },
            }),
        },
      },
    });
    expect((await recording.runOne())?.outcome).toBe("completed");
    expect(stages, "after compressing the per-position detail, before writing it").toContain("storing");
  }, 180_000);

  it("counts the history in SQL exactly as assessHistory does over the gathered closes", async () => {
    const method = (await currentMethod(analyst))!;
    const upload = (await confirmedPositionsUpload(analyst, periodId))!;
    const check = async (minHistory: number) => {
      const content = { ...method.content, minHistory };
      const book = (await latestBookInputs(analyst, content, periodId))!;
      const fromCloses = assessHistory(book.inputs, alignReturns(book.inputs.prices));
      const fromSql = await assessHistoryOfUpload(analyst, upload.id, book.periodEnd, minHistory);
      expect(fromSql).toEqual(fromCloses);
      return fromSql;
    };
    const demo = await check(method.content.minHistory);
    expect(demo.short.map((s) => s.factor)).toContain("NMB-EQ-WYNCOTE");
    // a date missing inside one factor's history, and another factor whose history stops early
    const [a, b] = demo.factors.filter((f) => f.returns > 100).map((f) => f.factor);
    const datesOf = async (code: string) =>
      (
        await db.$client.execute({
          sql: "SELECT p.instrument_id AS id, p.date AS date FROM price_points p JOIN instruments i ON i.id = p.instrument_id WHERE p.firm_id = ? AND i.code = ? AND p.current = 1 AND p.date <= ? ORDER BY p.date DESC",
          args: [analyst.firmId, code, "2026-11-30"],
        })
      ).rows.map((r) => ({ id: String(r.id), date: String(r.date) }));
    const hidden = [...(await datesOf(a)).slice(40, 41), ...(await datesOf(b)).slice(0, 4)];
    const setCurrent = (value: 0 | 1) =>
      db.$client.batch(hidden.map((h) => ({ sql: "UPDATE price_points SET current = ? WHERE firm_id = ? AND instrument_id = ? AND date = ?", args: [value, analyst.firmId, h.id, h.date] })));
    await setCurrent(0);
    const changed = await check(method.content.minHistory);
    expect(changed.factors.find((f) => f.factor === b)?.returns).toBe(0);
    expect(changed.factors.find((f) => f.factor === a)?.returns).toBeLessThan(demo.factors.find((f) => f.factor === a)!.returns);
    for (const n of [1, 60, 250, 10_000]) await check(n);
    // put the prices back for the tests that follow
    await setCurrent(1);
    expect(await check(method.content.minHistory)).toEqual(demo);
  }, 120_000);
});

describe("a run whose worker stopped", () => {
  it("is interrupted on the next read once its lease ran out, and the period takes a new run", async () => {
    const started = await startRun(analyst, periodId, { excludeShortHistory: true });
    const job = await claim(db, { owner: "killed-worker", kinds: ["run"] });
    expect(job?.payload).toMatchObject({ runId: started.id });
    await db.update(runs).set({ status: "running", stage: "factor-volatility", progress: 0.2 }).where(eq(runs.id, started.id));
    // within the lease, the run is still running
    expect((await getRun(analyst, started.id)).status).toBe("running");
    // the lease runs out (back-dated here instead of waiting LEASE_MS)
    await db.update(jobs).set({ leaseExpiresAt: new Date(Date.now() - 1).toISOString() }).where(eq(jobs.id, job!.id));
    const read = await getRun(analyst, started.id);
    expect(read.status).toBe("failed");
    expect(read.error).toMatch(/^Interrupted: .*Start the run again/);
    expect((await jobOf(started.id)).state).toBe("interrupted");
    const next = await startRun(analyst, periodId, { excludeShortHistory: true });
    expect(next.status).toBe("queued");
    expect((await worker.runOne())?.outcome).toBe("completed");
  }, 180_000);

  it("is interrupted by another worker's sweep when nobody reads it", async () => {
    const started = await startRun(analyst, periodId, { excludeShortHistory: true });
    await claim(db, { owner: "killed-worker", kinds: ["run"] });
    const later = { now: () => new Date(wallClock.now().getTime() + LEASE_MS + 1000) };
    const other = new Worker({ db, kinds: { run: runJob }, owner: "other", clock: later, log: () => undefined });
    const swept = await other.sweep();
    expect(swept.interrupted.map((j) => (j.payload as { runId: string }).runId)).toEqual([started.id]);
    const [row] = await db.select().from(runs).where(and(eq(runs.id, started.id), eq(runs.firmId, analyst.firmId)));
    expect(row.status).toBe("failed");
    expect(row.error).toMatch(/^Interrupted/);
  });

  it("given back after its inputs were stored, computes again from them to the same figures (the handler is idempotent)", async () => {
    const [first] = await db.select().from(runs).where(and(eq(runs.periodId, periodId), eq(runs.status, "completed"), eq(runs.firmId, analyst.firmId))).limit(1);
    const stored = await getRunInputs(analyst, first.id);
    const started = await startRun(analyst, periodId, { excludeShortHistory: true });
    const job = await claim(db, { owner: "stopping-worker", kinds: ["run"] });
    // the stopping worker had stored the inputs and begun computing
    const { data, bytes } = await packInputs(stored);
    await db.transaction(async (tx) => {
      await tx.update(runs).set({ status: "running", stage: "var", progress: 0.55, inputHashes: first.inputHashes }).where(eq(runs.id, started.id));
      await tx.insert(runInputs).values({ runId: started.id, firmId: analyst.firmId, data, bytes });
    });
    expect(await release(db, job!.id, "stopping-worker")).toBe(true);
    expect((await getRun(analyst, started.id)).status).toBe("running");
    expect((await worker.runOne())?.outcome).toBe("completed");
    const again = await getRun(analyst, started.id);
    const original = await getRun(analyst, first.id);
    expect(again.status).toBe("completed");
    expect(again.inputHashes).toEqual(original.inputHashes);
    expect(again.results!.monthEnd).toEqual(original.results!.monthEnd);
  }, 180_000);
});

describe("a read while another process holds the database", () => {
  it("answers without marking an expired run (the workers' sweep does that), and marks it once the database is free", async () => {
    const started = await startRun(analyst, periodId, { excludeShortHistory: true });
    const job = await claim(db, { owner: "killed-worker", kinds: ["run"] });
    await db.update(jobs).set({ leaseExpiresAt: new Date(Date.now() - 1).toISOString() }).where(eq(jobs.id, job!.id));
    // another process (a worker storing a large file) holds the write lock for longer than the busy timeout
    const other = createClient({ url: process.env.DATABASE_URL! });
    const held = await other.transaction("write"); // BEGIN IMMEDIATE: the write lock until rolled back
    try {
      expect((await getRun(analyst, started.id)).status).toBe("queued");
    } finally {
      await held.rollback();
      other.close();
    }
    expect((await getRun(analyst, started.id)).status).toBe("failed");
    expect((await jobOf(started.id)).state).toBe("interrupted");
  }, 60_000);
});
