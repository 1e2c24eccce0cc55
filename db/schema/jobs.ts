import { sql } from "drizzle-orm";
import { sqliteTable, text, integer, real, index, uniqueIndex } from "drizzle-orm/sqlite-core";
import { id, createdAt } from "../columns";

/**
 * The durable job queue (lib/jobs/queue.ts): work done by worker processes (`npm run worker`), off the request path.
 * A job is claimed by one worker at a time under a lease it extends with heartbeats; a lease that runs out means the
 * worker stopped, and the job is queued again (when its kind is safe to retry and attempts are left) or marked
 * interrupted. Times are ISO-8601 UTC text of the wall clock (never the pinned business clock).
 */
export const jobs = sqliteTable(
  "jobs",
  {
    id: id(),
    /** the firm the job works for; null for a job across firms (the reminder round) */
    firmId: text("firm_id"),
    /** the handler's name in lib/jobs/registry.ts */
    kind: text("kind").notNull(),
    payload: text("payload", { mode: "json" }).$type<Record<string, unknown>>().notNull(),
    /** queued → running → completed | failed | interrupted (running → queued again on a retry) */
    state: text("state").notNull().default("queued"),
    attempts: integer("attempts").notNull().default(0),
    maxAttempts: integer("max_attempts").notNull().default(1),
    /** not claimed before this time (backoff of a retry, a scheduled job) */
    runAfter: text("run_after").notNull(),
    leaseOwner: text("lease_owner"),
    leaseExpiresAt: text("lease_expires_at"),
    heartbeatAt: text("heartbeat_at"),
    stage: text("stage"),
    progress: real("progress"),
    result: text("result", { mode: "json" }).$type<unknown>(),
    error: text("error"),
    /** at most one queued or running job per key (e.g. `run:<runId>`); kept after it ends, to find the job again */
    dedupeKey: text("dedupe_key"),
    createdAt: createdAt(),
    startedAt: text("started_at"),
    finishedAt: text("finished_at"),
  },
  (t) => [
    index("jobs_claim").on(t.state, t.runAfter),
    index("jobs_lease").on(t.state, t.leaseExpiresAt),
    index("jobs_dedupe_key").on(t.dedupeKey),
    uniqueIndex("jobs_one_active_per_key").on(t.dedupeKey).where(sql`state in ('queued', 'running') and dedupe_key is not null`),
  ],
);
export type Job = typeof jobs.$inferSelect;
