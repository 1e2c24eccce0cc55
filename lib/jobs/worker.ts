/**
 * A worker: claims jobs of every registered kind (lib/jobs/registry.ts) one at a time, runs each with a heartbeat
 * that extends its lease every HEARTBEAT_MS, and finishes it (complete, or fail with the kind's backoff). Every few
 * seconds it also sweeps: jobs whose lease ran out (their worker stopped) are queued again or given up (the kind's
 * onGivenUp marks what they worked on, e.g. a run "Interrupted"), and each scheduled kind keeps one job queued.
 * Any number of workers share one database; `stop()` stops claiming, lets the job in hand finish for a grace
 * period, then gives it back (release) so another worker starts it again.
 */
import { hostname } from "node:os";
import { and, desc, eq, inArray, isNotNull } from "drizzle-orm";
import type { Database } from "@/db/client";
import { jobs, type Job } from "@/db/schema";
import { claim, complete, enqueue, fail, heartbeat, HEARTBEAT_MS, isDuplicateJob, LEASE_MS, release, takeOverExpired, wallClock, type Clock } from "./queue";
import type { JobContext, JobKind } from "./types";

export interface WorkerOptions {
  db: Database;
  kinds: Record<string, JobKind>;
  owner?: string;
  clock?: Clock;
  leaseMs?: number;
  heartbeatMs?: number;
  /** how long to wait when nothing is due */
  pollMs?: number;
  /** how often to take over expired leases and keep scheduled kinds queued */
  sweepMs?: number;
  log?: (line: string) => void;
}

export type JobOutcome = "completed" | "failed" | "retrying" | "lost";

export class Worker {
  readonly owner: string;
  private readonly db: Database;
  private readonly kinds: Record<string, JobKind>;
  private readonly clock: Clock;
  private readonly leaseMs: number;
  private readonly heartbeatMs: number;
  private readonly pollMs: number;
  private readonly sweepMs: number;
  private readonly log: (line: string) => void;
  private stopping = false;
  private wake: (() => void) | null = null;
  private current: { job: Job; done: Promise<JobOutcome>; controller: AbortController } | null = null;
  private loop: Promise<void> | null = null;

  constructor(options: WorkerOptions) {
    this.db = options.db;
    this.kinds = options.kinds;
    this.owner = options.owner ?? `${hostname()}:${process.pid}:${crypto.randomUUID().slice(0, 8)}`;
    this.clock = options.clock ?? wallClock;
    this.leaseMs = options.leaseMs ?? LEASE_MS;
    this.heartbeatMs = options.heartbeatMs ?? HEARTBEAT_MS;
    this.pollMs = options.pollMs ?? 1000;
    this.sweepMs = options.sweepMs ?? HEARTBEAT_MS;
    this.log = options.log ?? ((line) => console.log(line));
  }

  /** Take over expired leases and keep each scheduled kind queued. */
  async sweep(): Promise<{ requeued: Job[]; interrupted: Job[] }> {
    const taken = await takeOverExpired(this.db, { clock: this.clock });
    for (const job of taken.requeued) this.log(`worker ${this.owner}: job ${job.id} (${job.kind}) queued again: its worker stopped`);
    for (const job of taken.interrupted) {
      this.log(`worker ${this.owner}: job ${job.id} (${job.kind}) interrupted: its worker stopped`);
      await this.giveUp(job, job.error ?? "Interrupted: the worker running this job stopped.");
    }
    for (const [name, kind] of Object.entries(this.kinds)) if (kind.schedule) await this.keepScheduled(name, kind);
    return taken;
  }

  private async giveUp(job: Job, reason: string) {
    try {
      await this.kinds[job.kind]?.onGivenUp?.(job, this.db, reason);
    } catch (error) {
      this.log(`worker ${this.owner}: job ${job.id} (${job.kind}): could not mark it given up: ${error instanceof Error ? error.message : error}`);
    }
  }

  private async keepScheduled(name: string, kind: JobKind) {
    const every = kind.schedule!.everyMs();
    if (every <= 0) return;
    const [active] = await this.db.select({ id: jobs.id }).from(jobs).where(and(eq(jobs.kind, name), inArray(jobs.state, ["queued", "running"]))).limit(1);
    if (active) return;
    const [last] = await this.db
      .select({ finishedAt: jobs.finishedAt })
      .from(jobs)
      .where(and(eq(jobs.kind, name), isNotNull(jobs.finishedAt)))
      .orderBy(desc(jobs.finishedAt))
      .limit(1);
    const at = this.clock.now().getTime();
    const due = last?.finishedAt ? Math.max(at, Date.parse(last.finishedAt) + every) : at;
    try {
      await enqueue(this.db, { kind: name, firmId: null, payload: {}, maxAttempts: kind.schedule!.maxAttempts ?? 1, runAfter: new Date(due), dedupeKey: `schedule:${name}` }, this.clock);
    } catch (error) {
      if (!isDuplicateJob(error)) throw error; // another worker scheduled it first
    }
  }

  /** Claim one due job and run it to its end. Null when nothing was due. */
  async runOne(): Promise<{ job: Job; outcome: JobOutcome } | null> {
    if (this.stopping) return null;
    const job = await claim(this.db, { owner: this.owner, kinds: Object.keys(this.kinds), leaseMs: this.leaseMs, clock: this.clock });
    if (!job) return null;
    const controller = new AbortController();
    const done = this.execute(job, controller);
    this.current = { job, done, controller };
    try {
      return { job, outcome: await done };
    } finally {
      this.current = null;
    }
  }

  private async execute(job: Job, controller: AbortController): Promise<JobOutcome> {
    const kind = this.kinds[job.kind];
    const beat = async () => {
      const held = await heartbeat(this.db, job.id, this.owner, { leaseMs: this.leaseMs, clock: this.clock });
      if (!held) controller.abort();
      return held;
    };
    const timer = setInterval(() => void beat().catch(() => undefined), this.heartbeatMs);
    timer.unref?.();
    const context: JobContext = {
      job,
      db: this.db,
      owner: this.owner,
      signal: controller.signal,
      heartbeat: beat,
      progress: async (stage, fraction) => {
        const held = await heartbeat(this.db, job.id, this.owner, { stage, progress: Math.min(1, Math.max(0, fraction)), leaseMs: this.leaseMs, clock: this.clock });
        if (!held) controller.abort();
        return held;
      },
    };
    try {
      const result = await kind.handle(context);
      if (controller.signal.aborted && this.stopping) return "lost";
      const stored = await complete(this.db, job.id, this.owner, result ?? null, this.clock);
      return stored ? "completed" : "lost";
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      const state = await fail(this.db, job.id, this.owner, message, { backoffMs: kind.backoffMs, clock: this.clock });
      if (state === null) return "lost";
      this.log(`worker ${this.owner}: job ${job.id} (${job.kind}) ${state === "queued" ? "failed, will retry" : "failed"}: ${message}`);
      if (state === "failed") await this.giveUp(job, message);
      return state === "queued" ? "retrying" : "failed";
    } finally {
      clearInterval(timer);
    }
  }

  /** Work until stop(): sweep every sweepMs, claim and run jobs, wait pollMs when nothing is due. */
  start(): void {
    if (this.loop) return;
    this.loop = (async () => {
      let lastSweep = 0;
      while (!this.stopping) {
        try {
          if (Date.now() - lastSweep >= this.sweepMs) {
            lastSweep = Date.now();
            await this.sweep();
          }
          const ran = await this.runOne();
          if (ran) {
            this.log(`worker ${this.owner}: job ${ran.job.id} (${ran.job.kind}) ${ran.outcome}`);
            continue;
          }
        } catch (error) {
          this.log(`worker ${this.owner}: ${error instanceof Error ? error.message : error}`);
        }
        await new Promise<void>((resolve) => {
          const timer = setTimeout(resolve, Math.min(this.pollMs, this.sweepMs));
          this.wake = () => {
            clearTimeout(timer);
            resolve();
          };
        });
        this.wake = null;
      }
    })();
  }

  /**
   * Stop claiming; let the job in hand finish for up to graceMs, then give it back (another worker starts it
   * again). Resolves when nothing of this worker holds a lease.
   */
  async stop(graceMs = 20_000): Promise<void> {
    this.stopping = true;
    this.wake?.();
    const current = this.current;
    if (current) {
      const finished = await Promise.race([current.done.then(() => true), new Promise<false>((resolve) => setTimeout(() => resolve(false), graceMs).unref?.())]);
      if (!finished) {
        current.controller.abort();
        const given = await release(this.db, current.job.id, this.owner, this.clock);
        this.log(`worker ${this.owner}: job ${current.job.id} (${current.job.kind}) ${given ? "given back to the queue" : "no longer held"}`);
        return; // the handler may still be computing: the caller exits the process
      }
    }
    await this.loop?.catch(() => undefined);
  }
}
