/**
 * The durable job queue, in the database (table `jobs`, db/schema/jobs.ts). Web processes enqueue; worker processes
 * (`npm run worker`, lib/jobs/worker.ts) claim, run and finish. Pointing DATABASE_URL at a libSQL server makes web
 * instances and workers independent of machines.
 *
 * Life of a job: `enqueue` (queued) → `claim` (running, attempts + 1, a lease of LEASE_MS owned by one worker) →
 * `heartbeat`/`progress` (the lease extended) → `complete` | `fail` (queued again after a backoff while attempts are
 * left, else failed) | `release` (a worker shutting down gives it back, the attempt not counted). A lease that runs
 * out means the worker stopped: `takeOverExpired` queues the job again when attempts are left (its kind said retrying
 * is safe by enqueuing with maxAttempts > 1), else marks it interrupted.
 *
 * Enqueue inside the caller's transaction, so the job exists exactly when the caller's rows do:
 *
 *   await getDb().transaction(async (tx) => {
 *     const [row] = await tx.insert(things).values(…).returning({ id: things.id });
 *     await enqueue(tx, { kind: "thing", firmId: actor.firmId, payload: { thingId: row.id }, dedupeKey: `thing:${row.id}` });
 *     await recordAudit(tx, actor, …);
 *   });
 *
 * Adding a kind: see lib/jobs/registry.ts. This module knows no kinds (so lib/data can enqueue without importing
 * the handlers). Times are the wall clock, injectable (`Clock`) so tests drive leases without sleeping.
 */
import { and, asc, eq, inArray, lt, lte, sql } from "drizzle-orm";
import type { Database, Tx } from "@/db/client";
import { jobs, type Job } from "@/db/schema";

/** How long a claim lasts without a heartbeat: a killed worker's job is noticed within this (plus one sweep). */
export const LEASE_MS = 15_000;
/** How often a worker extends the lease of the job it runs. */
export const HEARTBEAT_MS = 5_000;

export type JobState = "queued" | "running" | "completed" | "failed" | "interrupted";
export const ACTIVE_JOB_STATES: JobState[] = ["queued", "running"];

/** The wall clock, or a test's. */
export interface Clock {
  now(): Date;
}
export const wallClock: Clock = { now: () => new Date() };

type Db = Database | Tx;

export interface NewJob {
  kind: string;
  /** the firm the job works for; null for work across firms */
  firmId: string | null;
  payload: Record<string, unknown>;
  /** 1 (the default): never run twice. More only for a kind whose handler is safe to run again. */
  maxAttempts?: number;
  /** not before this time */
  runAfter?: Date;
  /** at most one queued or running job per key; enqueueing a second one throws (isDuplicateJob) */
  dedupeKey?: string | null;
}

/** Add a job (in the caller's transaction when given one). */
export async function enqueue(db: Db, job: NewJob, clock: Clock = wallClock): Promise<Job> {
  const at = clock.now().toISOString();
  const [row] = await db
    .insert(jobs)
    .values({
      kind: job.kind,
      firmId: job.firmId,
      payload: job.payload,
      state: "queued",
      attempts: 0,
      maxAttempts: Math.max(1, job.maxAttempts ?? 1),
      runAfter: (job.runAfter ?? clock.now()).toISOString(),
      dedupeKey: job.dedupeKey ?? null,
      createdAt: at,
    })
    .returning();
  return row;
}

/**
 * Ask for work on the newest state of something (a period's report, a filing's packs) inside the caller's
 * transaction: nothing is added while a job under `keys` is still queued (it reads the newest state when it runs);
 * while one runs, the next is queued under the second key.
 */
export async function enqueueLatest(tx: Db, job: Omit<NewJob, "dedupeKey">, keys: readonly [string, string]): Promise<void> {
  const active = await tx
    .select({ state: jobs.state, dedupeKey: jobs.dedupeKey })
    .from(jobs)
    .where(and(inArray(jobs.dedupeKey, [...keys]), inArray(jobs.state, ["queued", "running"])));
  if (active.some((j) => j.state === "queued")) return;
  const free = keys.find((k) => !active.some((j) => j.dedupeKey === k));
  if (free) await enqueue(tx, { ...job, dedupeKey: free });
}

/** Whether an error is the one-active-job-per-key index refusing a second job. */
export function isDuplicateJob(error: unknown): boolean {
  for (let e: unknown = error; e; e = (e as { cause?: unknown }).cause) {
    const message = e instanceof Error ? e.message : String(e);
    if (message.includes("UNIQUE constraint failed") && message.includes("jobs.dedupe_key")) return true;
    if (!(e instanceof Error)) break;
  }
  return false;
}

export interface ClaimOptions {
  /** this worker's name (lease owner) */
  owner: string;
  /** the kinds this worker runs */
  kinds: readonly string[];
  leaseMs?: number;
  clock?: Clock;
}

/**
 * Claim the next due job of the given kinds: one UPDATE … WHERE id IN (SELECT … ORDER BY … LIMIT 1) AND state =
 * 'queued' RETURNING, atomic in SQLite, so two workers never get the same job. Null when nothing is due.
 */
export async function claim(db: Database, options: ClaimOptions): Promise<Job | null> {
  if (options.kinds.length === 0) return null;
  const clock = options.clock ?? wallClock;
  const at = clock.now();
  const next = db
    .select({ id: jobs.id })
    .from(jobs)
    .where(and(eq(jobs.state, "queued"), lte(jobs.runAfter, at.toISOString()), inArray(jobs.kind, [...options.kinds])))
    .orderBy(asc(jobs.runAfter), asc(jobs.createdAt), asc(jobs.id))
    .limit(1);
  const [row] = await db
    .update(jobs)
    .set({
      state: "running",
      attempts: sql`${jobs.attempts} + 1`,
      leaseOwner: options.owner,
      leaseExpiresAt: new Date(at.getTime() + (options.leaseMs ?? LEASE_MS)).toISOString(),
      heartbeatAt: at.toISOString(),
      startedAt: at.toISOString(),
      error: null,
    })
    .where(and(inArray(jobs.id, next), eq(jobs.state, "queued")))
    .returning();
  return row ?? null;
}

const held = (jobId: string, owner: string) => and(eq(jobs.id, jobId), eq(jobs.leaseOwner, owner), eq(jobs.state, "running"));

/** Extend the lease (and record stage/progress when given). False when the lease is no longer this worker's. */
export async function heartbeat(
  db: Db,
  jobId: string,
  owner: string,
  options: { stage?: string; progress?: number; leaseMs?: number; clock?: Clock } = {},
): Promise<boolean> {
  const at = (options.clock ?? wallClock).now();
  const rows = await db
    .update(jobs)
    .set({
      heartbeatAt: at.toISOString(),
      leaseExpiresAt: new Date(at.getTime() + (options.leaseMs ?? LEASE_MS)).toISOString(),
      ...(options.stage !== undefined ? { stage: options.stage } : {}),
      ...(options.progress !== undefined ? { progress: options.progress } : {}),
    })
    .where(held(jobId, owner))
    .returning({ id: jobs.id });
  return rows.length === 1;
}

/** Record stage and progress 0..1 (extends the lease too). */
export function progress(db: Db, jobId: string, owner: string, stage: string, fraction: number, clock?: Clock): Promise<boolean> {
  return heartbeat(db, jobId, owner, { stage, progress: Math.min(1, Math.max(0, fraction)), clock });
}

/** The job is done. False when the lease was lost meanwhile (the result is then not stored). */
export async function complete(db: Db, jobId: string, owner: string, result: unknown = null, clock: Clock = wallClock): Promise<boolean> {
  const at = clock.now().toISOString();
  const rows = await db
    .update(jobs)
    .set({ state: "completed", result: result ?? null, progress: 1, finishedAt: at, heartbeatAt: at, leaseExpiresAt: null })
    .where(held(jobId, owner))
    .returning({ id: jobs.id });
  return rows.length === 1;
}

/** Exponential backoff: 2 s, 4 s, 8 s … capped at 5 minutes. */
export function defaultBackoffMs(attempt: number): number {
  return Math.min(5 * 60_000, 1000 * 2 ** Math.max(1, attempt));
}

/**
 * The attempt failed: queued again after `backoffMs(attempts)` while attempts are left, else failed for good.
 * Returns the new state, or null when the lease was no longer this worker's.
 */
export async function fail(
  db: Db,
  jobId: string,
  owner: string,
  error: string,
  options: { backoffMs?: (attempt: number) => number; clock?: Clock } = {},
): Promise<"queued" | "failed" | null> {
  const at = (options.clock ?? wallClock).now();
  const [row] = await db.select({ attempts: jobs.attempts, maxAttempts: jobs.maxAttempts }).from(jobs).where(held(jobId, owner));
  if (!row) return null;
  const retry = row.attempts < row.maxAttempts;
  const rows = await db
    .update(jobs)
    .set(
      retry
        ? { state: "queued", error, leaseOwner: null, leaseExpiresAt: null, runAfter: new Date(at.getTime() + (options.backoffMs ?? defaultBackoffMs)(row.attempts)).toISOString() }
        : { state: "failed", error, finishedAt: at.toISOString(), leaseExpiresAt: null },
    )
    .where(held(jobId, owner))
    .returning({ id: jobs.id });
  return rows.length === 1 ? (retry ? "queued" : "failed") : null;
}

/** A worker shutting down gives the job back, due now; the attempt it made is not counted. */
export async function release(db: Db, jobId: string, owner: string, clock: Clock = wallClock): Promise<boolean> {
  const rows = await db
    .update(jobs)
    .set({ state: "queued", attempts: sql`max(0, ${jobs.attempts} - 1)`, leaseOwner: null, leaseExpiresAt: null, runAfter: clock.now().toISOString() })
    .where(held(jobId, owner))
    .returning({ id: jobs.id });
  return rows.length === 1;
}

/**
 * Take over jobs whose lease ran out (their worker stopped): queued again when attempts are left, else interrupted.
 * Optionally only of some kinds or one firm. Returns the jobs of each outcome.
 */
export async function takeOverExpired(
  db: Db,
  options: { clock?: Clock; kinds?: readonly string[]; firmId?: string } = {},
): Promise<{ requeued: Job[]; interrupted: Job[] }> {
  const at = (options.clock ?? wallClock).now().toISOString();
  const scope = [eq(jobs.state, "running"), lt(jobs.leaseExpiresAt, at)];
  if (options.kinds) scope.push(inArray(jobs.kind, [...options.kinds]));
  if (options.firmId) scope.push(eq(jobs.firmId, options.firmId));
  const requeued = await db
    .update(jobs)
    .set({ state: "queued", leaseOwner: null, leaseExpiresAt: null, runAfter: at, error: "The worker running this job stopped; queued again." })
    .where(and(...scope, lt(jobs.attempts, jobs.maxAttempts)))
    .returning();
  const interrupted = await db
    .update(jobs)
    .set({ state: "interrupted", finishedAt: at, error: "Interrupted: the worker running this job stopped." })
    .where(and(...scope, sql`${jobs.attempts} >= ${jobs.maxAttempts}`))
    .returning();
  return { requeued, interrupted };
}

/** The newest job with a dedupe key (e.g. a run's), or null. */
export async function jobByKey(db: Db, dedupeKey: string): Promise<Job | null> {
  const [row] = await db.select().from(jobs).where(eq(jobs.dedupeKey, dedupeKey)).orderBy(sql`${jobs.createdAt} desc`).limit(1);
  return row ?? null;
}
