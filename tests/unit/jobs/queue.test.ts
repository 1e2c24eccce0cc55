/**
 * The job queue (lib/jobs/queue.ts) and the worker (lib/jobs/worker.ts) on a migrated database file: exactly-once
 * claiming by several claimers on separate connections, lease take-over after expiry, retry with backoff, release,
 * and a handler run again after a take-over doing its work once. Time is driven through an injected clock; nothing
 * sleeps and nothing is timed.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { eq } from "drizzle-orm";
import { migrateDatabase } from "@/db/migrate";
import { openDatabase, type Database } from "@/db/client";
import { jobs } from "@/db/schema";
import { claim, complete, defaultBackoffMs, enqueue, fail, heartbeat, isDuplicateJob, LEASE_MS, release, takeOverExpired, type Clock } from "@/lib/jobs/queue";
import { Worker } from "@/lib/jobs/worker";
import type { JobKind } from "@/lib/jobs/types";

class TestClock implements Clock {
  constructor(private t: number) {}
  now() {
    return new Date(this.t);
  }
  advance(ms: number) {
    this.t += ms;
  }
}

let url: string;
let db: Database;

beforeAll(async () => {
  const dir = mkdtempSync(path.join(tmpdir(), "ballast-jobs-"));
  url = `file:${path.join(dir, "jobs.db")}`;
  await migrateDatabase(url);
  db = openDatabase(url);
});

async function clear() {
  await db.delete(jobs);
}

describe("claiming", () => {
  it("gives every job to exactly one of several claimers on separate connections", async () => {
    await clear();
    const clock = new TestClock(Date.parse("2026-12-01T09:00:00Z"));
    const total = 120;
    for (let i = 0; i < total; i++) await enqueue(db, { kind: "tally", firmId: null, payload: { i } }, clock);
    const connections = [0, 1, 2, 3].map(() => openDatabase(url));
    const claimedBy = new Map<string, string[]>();
    await Promise.all(
      connections.map(async (connection, n) => {
        const owner = `claimer-${n}`;
        for (;;) {
          const job = await claim(connection, { owner, kinds: ["tally"], clock });
          if (!job) break;
          claimedBy.set(job.id, [...(claimedBy.get(job.id) ?? []), owner]);
          expect(await complete(connection, job.id, owner, { by: owner }, clock)).toBe(true);
        }
      }),
    );
    expect(claimedBy.size).toBe(total);
    expect([...claimedBy.values()].every((owners) => owners.length === 1)).toBe(true);
    const rows = await db.select().from(jobs);
    expect(rows.every((r) => r.state === "completed" && r.attempts === 1)).toBe(true);
    for (const c of connections) c.$client.close();
  });

  it("claims only due jobs of the asked kinds, oldest due first", async () => {
    await clear();
    const clock = new TestClock(Date.parse("2026-12-01T09:00:00Z"));
    const later = await enqueue(db, { kind: "a", firmId: null, payload: {}, runAfter: new Date(clock.now().getTime() + 60_000) }, clock);
    const other = await enqueue(db, { kind: "b", firmId: null, payload: {} }, clock);
    const first = await enqueue(db, { kind: "a", firmId: null, payload: {} }, clock);
    expect((await claim(db, { owner: "w", kinds: ["a"], clock }))?.id).toBe(first.id);
    expect(await claim(db, { owner: "w", kinds: ["a"], clock })).toBeNull();
    clock.advance(60_000);
    expect((await claim(db, { owner: "w", kinds: ["a"], clock }))?.id).toBe(later.id);
    expect((await claim(db, { owner: "w", kinds: ["b"], clock }))?.id).toBe(other.id);
  });

  it("allows one active job per dedupe key, and another once it ended", async () => {
    await clear();
    const clock = new TestClock(Date.parse("2026-12-01T09:00:00Z"));
    await enqueue(db, { kind: "a", firmId: null, payload: {}, dedupeKey: "k" }, clock);
    const second = await enqueue(db, { kind: "a", firmId: null, payload: {}, dedupeKey: "k" }, clock).then(
      () => null,
      (error: unknown) => error,
    );
    expect(isDuplicateJob(second)).toBe(true);
    const job = (await claim(db, { owner: "w", kinds: ["a"], clock }))!;
    await complete(db, job.id, "w", null, clock);
    await expect(enqueue(db, { kind: "a", firmId: null, payload: {}, dedupeKey: "k" }, clock)).resolves.toMatchObject({ state: "queued" });
  });

  it("enqueues inside a caller's transaction: a rolled-back transaction leaves no job", async () => {
    await clear();
    await expect(
      db.transaction(async (tx) => {
        await enqueue(tx, { kind: "a", firmId: null, payload: {} });
        throw new Error("the caller's write failed");
      }),
    ).rejects.toThrow(/the caller's write failed/);
    expect(await db.select().from(jobs)).toEqual([]);
  });
});

describe("leases", () => {
  it("extends a lease with each heartbeat and takes over a job whose lease ran out", async () => {
    await clear();
    const clock = new TestClock(Date.parse("2026-12-01T09:00:00Z"));
    const retryable = await enqueue(db, { kind: "a", firmId: null, payload: {}, maxAttempts: 2 }, clock);
    const once = await enqueue(db, { kind: "a", firmId: null, payload: {}, maxAttempts: 1 }, clock);
    await claim(db, { owner: "dead", kinds: ["a"], clock });
    await claim(db, { owner: "dead", kinds: ["a"], clock });
    clock.advance(LEASE_MS - 1000);
    expect(await heartbeat(db, retryable.id, "dead", { clock })).toBe(true); // lease now ends LEASE_MS after this
    clock.advance(2000); // the second job's lease ran out; the first was extended
    let taken = await takeOverExpired(db, { clock });
    expect(taken.requeued).toEqual([]);
    expect(taken.interrupted.map((j) => j.id)).toEqual([once.id]);
    clock.advance(LEASE_MS);
    taken = await takeOverExpired(db, { clock });
    expect(taken.requeued.map((j) => j.id)).toEqual([retryable.id]);
    // the stopped worker, were it to come back, holds nothing any more
    expect(await heartbeat(db, retryable.id, "dead", { clock })).toBe(false);
    expect(await complete(db, once.id, "dead", null, clock)).toBe(false);
    const again = await claim(db, { owner: "alive", kinds: ["a"], clock });
    expect(again?.id).toBe(retryable.id);
    expect(again?.attempts).toBe(2);
    clock.advance(LEASE_MS + 1);
    taken = await takeOverExpired(db, { clock });
    expect(taken.interrupted.map((j) => j.id)).toEqual([retryable.id]); // no attempts left
    const [row] = await db.select().from(jobs).where(eq(jobs.id, once.id));
    expect(row.state).toBe("interrupted");
    expect(row.error).toMatch(/^Interrupted/);
  });

  it("release gives a job back without counting the attempt", async () => {
    await clear();
    const clock = new TestClock(Date.parse("2026-12-01T09:00:00Z"));
    const job = await enqueue(db, { kind: "a", firmId: null, payload: {}, maxAttempts: 1 }, clock);
    await claim(db, { owner: "stopping", kinds: ["a"], clock });
    expect(await release(db, job.id, "stopping", clock)).toBe(true);
    const again = await claim(db, { owner: "next", kinds: ["a"], clock });
    expect(again).toMatchObject({ id: job.id, attempts: 1, leaseOwner: "next" });
  });
});

describe("retry with backoff", () => {
  it("queues a failed attempt again after the backoff while attempts are left, then fails it", async () => {
    await clear();
    const clock = new TestClock(Date.parse("2026-12-01T09:00:00Z"));
    const job = await enqueue(db, { kind: "a", firmId: null, payload: {}, maxAttempts: 3 }, clock);
    // common practice, no source: doubling backoff from 2 s
    expect([1, 2, 3].map(defaultBackoffMs)).toEqual([2000, 4000, 8000]);
    for (const [attempt, backoff] of [
      [1, 2000],
      [2, 4000],
    ] as const) {
      const claimed = await claim(db, { owner: "w", kinds: ["a"], clock });
      expect(claimed?.attempts).toBe(attempt);
      expect(await fail(db, job.id, "w", `attempt ${attempt} failed`, { clock })).toBe("queued");
      clock.advance(backoff - 1);
      expect(await claim(db, { owner: "w", kinds: ["a"], clock })).toBeNull();
      clock.advance(1);
    }
    expect((await claim(db, { owner: "w", kinds: ["a"], clock }))?.attempts).toBe(3);
    expect(await fail(db, job.id, "w", "attempt 3 failed", { clock })).toBe("failed");
    const [row] = await db.select().from(jobs).where(eq(jobs.id, job.id));
    expect(row).toMatchObject({ state: "failed", error: "attempt 3 failed", attempts: 3 });
  });
});

describe("the worker", () => {
  it("runs a handler again after its worker stopped, and the work is done once", async () => {
    await clear();
    await db.$client.execute("CREATE TABLE IF NOT EXISTS tallies (key TEXT PRIMARY KEY, n INTEGER NOT NULL)");
    const clock = new TestClock(Date.parse("2026-12-01T09:00:00Z"));
    let calls = 0;
    const tally: JobKind = {
      async handle({ job, db: conn, progress }) {
        calls++;
        await progress("counting", 0.5);
        // idempotent: the effect is keyed by the job, so a second run changes nothing
        await conn.$client.execute({ sql: "INSERT INTO tallies (key, n) VALUES (?, 1) ON CONFLICT (key) DO NOTHING", args: [job.id] });
        return { counted: job.id };
      },
    };
    const job = await enqueue(db, { kind: "tally", firmId: null, payload: {}, maxAttempts: 2 }, clock);
    // a first worker did the work, then stopped before it could say so
    const dead = await claim(db, { owner: "dead", kinds: ["tally"], clock });
    await tally.handle({ job: dead!, db, owner: "dead", progress: async () => true, heartbeat: async () => true, signal: new AbortController().signal });
    clock.advance(LEASE_MS + 1);
    const worker = new Worker({ db, kinds: { tally }, owner: "alive", clock, log: () => undefined });
    const swept = await worker.sweep();
    expect(swept.requeued.map((j) => j.id)).toEqual([job.id]);
    const ran = await worker.runOne();
    expect(ran?.outcome).toBe("completed");
    expect(calls).toBe(2);
    const counted = await db.$client.execute({ sql: "SELECT n FROM tallies WHERE key = ?", args: [job.id] });
    expect(counted.rows.map((r) => Number(r.n))).toEqual([1]);
    const [row] = await db.select().from(jobs).where(eq(jobs.id, job.id));
    expect(row).toMatchObject({ state: "completed", attempts: 2, leaseOwner: "alive", result: { counted: job.id }, stage: "counting" });
  });

  it("fails a job whose handler throws, retrying with the kind's backoff, then gives it up", async () => {
    await clear();
    const clock = new TestClock(Date.parse("2026-12-01T09:00:00Z"));
    const givenUp: string[] = [];
    const broken: JobKind = {
      async handle() {
        throw new Error("the handler broke");
      },
      backoffMs: () => 10_000,
      async onGivenUp(job, _db, reason) {
        givenUp.push(`${job.id}: ${reason}`);
      },
    };
    const job = await enqueue(db, { kind: "broken", firmId: null, payload: {}, maxAttempts: 2 }, clock);
    const worker = new Worker({ db, kinds: { broken }, owner: "w", clock, log: () => undefined });
    expect((await worker.runOne())?.outcome).toBe("retrying");
    expect(await worker.runOne()).toBeNull();
    clock.advance(10_000);
    expect((await worker.runOne())?.outcome).toBe("failed");
    expect(givenUp).toEqual([`${job.id}: the handler broke`]);
  });

  it("keeps one job of a scheduled kind queued, due its interval after the last one finished", async () => {
    await clear();
    const clock = new TestClock(Date.parse("2026-12-01T09:00:00Z"));
    const round: JobKind = { handle: async () => ({ done: true }), schedule: { everyMs: () => 600_000 } };
    const a = new Worker({ db, kinds: { round }, owner: "a", clock, log: () => undefined });
    const b = new Worker({ db, kinds: { round }, owner: "b", clock, log: () => undefined });
    await Promise.all([a.sweep(), b.sweep(), a.sweep()]);
    expect((await db.select().from(jobs)).filter((j) => j.state === "queued")).toHaveLength(1);
    expect((await a.runOne())?.outcome).toBe("completed");
    await b.sweep();
    const queued = (await db.select().from(jobs)).filter((j) => j.state === "queued");
    expect(queued.map((j) => j.runAfter)).toEqual(["2026-12-01T09:10:00.000Z"]);
    expect(await b.runOne()).toBeNull();
  });
});
