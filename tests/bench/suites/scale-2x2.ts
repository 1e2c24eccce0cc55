/**
 * scale-2x2 (the workers' half; the web processes' half is the load bench's): two worker processes on one database
 * file share JOBS small jobs; prints how many ran, how many ran more than once (must be 0) or never (must be 0), and
 * the throughput. Then worker A claims a job and is killed (SIGKILL) while holding it: prints the time until worker
 * B has taken it over (lease LEASE_MS plus one sweep; the bound is 30 s). Figures only; no assertion on time.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { migrateDatabase } from "@/db/migrate";
import { openDatabase } from "@/db/client";
import { enqueue, LEASE_MS } from "@/lib/jobs/queue";
import { emit } from "../emit";

const JOBS = Number(process.env.BENCH_SCALE_JOBS ?? 2000);
const child = path.join(__dirname, "..", "scale", "worker-child.ts");
const wait = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

async function main() {
  const dir = mkdtempSync(path.join(tmpdir(), "ballast-bench-scale-"));
  const url = `file:${path.join(dir, "scale.db")}`;
  await migrateDatabase(url);
  const db = openDatabase(url);
  await db.$client.execute("CREATE TABLE bench_calls (job_id TEXT NOT NULL, owner TEXT NOT NULL)");
  const count = async (sql: string, args: (string | number)[] = []) => Number((await db.$client.execute({ sql, args })).rows[0]?.n ?? 0);

  await db.transaction(async (tx) => {
    for (let i = 0; i < JOBS; i++) await enqueue(tx, { kind: "bench-tally", firmId: null, payload: { i }, maxAttempts: 3 });
  });
  const startWorker = (owner: string): ChildProcess =>
    spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", child, url, owner], { stdio: ["ignore", "inherit", "inherit"] });
  const started = Date.now();
  let a = startWorker("A");
  const b = startWorker("B");
  while ((await count("SELECT count(*) AS n FROM jobs WHERE kind = 'bench-tally' AND state = 'completed'")) < JOBS) {
    if (Date.now() - started > 300_000) throw new Error("the workers did not finish the jobs within 5 minutes");
    await wait(100);
  }
  const seconds = (Date.now() - started) / 1000;
  const calls = await db.$client.execute("SELECT job_id, count(*) AS n FROM bench_calls GROUP BY job_id");
  const twice = calls.rows.filter((r) => Number(r.n) > 1).length;
  const never = JOBS - calls.rows.length;
  const byOwner = await db.$client.execute("SELECT lease_owner AS owner, count(*) AS n FROM jobs WHERE kind = 'bench-tally' GROUP BY lease_owner ORDER BY lease_owner");
  emit({
    name: "scale-2x2-jobs-exactly-once",
    value: JOBS - twice - never,
    unit: "jobs run exactly once",
    runs: 1,
    jobs: JOBS,
    ranTwiceOrMore: twice,
    neverRan: never,
    byWorker: Object.fromEntries(byOwner.rows.map((r) => [String(r.owner), Number(r.n)])),
    jobsPerSecond: Math.round(JOBS / seconds),
    seconds,
  });

  // take-over: stop B, let A claim a held job, start B again, then kill A
  b.kill("SIGTERM");
  await new Promise((resolve) => b.once("exit", resolve));
  a.kill("SIGTERM");
  await new Promise((resolve) => a.once("exit", resolve));
  a = startWorker("A");
  const held = await enqueue(db, { kind: "bench-hold", firmId: null, payload: {}, maxAttempts: 2 });
  while ((await count("SELECT count(*) AS n FROM jobs WHERE id = ? AND state = 'running' AND lease_owner = 'A'", [held.id])) === 0) await wait(50);
  const b2 = startWorker("B");
  await wait(1000);
  a.kill("SIGKILL");
  const killedAt = Date.now();
  while ((await count("SELECT count(*) AS n FROM jobs WHERE id = ? AND lease_owner = 'B' AND state IN ('running', 'completed')", [held.id])) === 0) {
    if (Date.now() - killedAt > 120_000) throw new Error("the killed worker's job was not taken over within 2 minutes");
    await wait(50);
  }
  const takeOver = Date.now() - killedAt;
  while ((await count("SELECT count(*) AS n FROM jobs WHERE id = ? AND state = 'completed'", [held.id])) === 0) await wait(50);
  const row = (await db.$client.execute({ sql: "SELECT attempts, lease_owner FROM jobs WHERE id = ?", args: [held.id] })).rows[0];
  emit({ name: "scale-2x2-killed-worker-take-over", value: takeOver, unit: "ms", runs: 1, leaseMs: LEASE_MS, bound: 30_000, attempts: Number(row.attempts), finishedBy: String(row.lease_owner) });
  b2.kill("SIGTERM");
  await new Promise((resolve) => b2.once("exit", resolve));
  db.$client.close();
}

main().then(
  () => process.exit(0),
  (error) => {
    console.error(error);
    process.exit(1);
  },
);
