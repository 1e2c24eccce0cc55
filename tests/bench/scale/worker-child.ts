/**
 * A worker process of the scale-2x2 bench (tests/bench/suites/scale-2x2.ts): the real Worker (lib/jobs/worker.ts) with
 * the real lease and heartbeat, running two bench kinds: "bench-tally" (logs each call of its handler, so the bench
 * counts how often each job ran) and "bench-hold" (holds its job, heartbeating, until the bench kills this process).
 */
import { openDatabase } from "@/db/client";
import { Worker } from "@/lib/jobs/worker";
import type { JobKind } from "@/lib/jobs/types";

const [url, owner] = process.argv.slice(2);
const db = openDatabase(url);

const tally: JobKind = {
  async handle({ job }) {
    await db.$client.execute({ sql: "INSERT INTO bench_calls (job_id, owner) VALUES (?, ?)", args: [job.id, owner] });
    return { by: owner };
  },
};
const hold: JobKind = {
  async handle({ job, signal }) {
    await db.$client.execute({ sql: "INSERT INTO bench_calls (job_id, owner) VALUES (?, ?)", args: [job.id, owner] });
    if (owner !== "A") return { by: owner }; // the taking-over worker finishes it at once
    await new Promise<void>((resolve) => signal.addEventListener("abort", () => resolve()));
    return null;
  },
};

const worker = new Worker({ db, kinds: { "bench-tally": tally, "bench-hold": hold }, owner, pollMs: 200, log: () => undefined });
worker.start();
process.on("SIGTERM", () => void worker.stop(1000).then(() => process.exit(0)));
