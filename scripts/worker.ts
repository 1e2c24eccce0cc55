/**
 * `npm run worker`: a worker process of the job queue (lib/jobs/worker.ts). Runs every registered kind (runs,
 * reminders, … lib/jobs/registry.ts) against DATABASE_URL. Start as many as you like, on any machine that reaches
 * the database; each claims one job at a time. SIGTERM/SIGINT: stop claiming, let the job in hand finish for up to
 * WORKER_GRACE_SECONDS (20), then give it back to the queue and exit. A second signal exits at once (the job's
 * lease then runs out and another worker takes it over). WORKER_HEALTH_PORT: answer GET on 127.0.0.1:PORT (health
 * check). REMINDERS_INTERVAL_MINUTES: the reminder round's schedule (10; 0 = none: cron calls it instead).
 *
 * Runs with `node --conditions=react-server --import tsx` so that the app's server-only modules load outside Next.js.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { existsSync } from "node:fs";
import path from "node:path";

/** The node arguments a worker process runs with (for scripts that start one). */
export const WORKER_NODE_ARGS = ["--conditions=react-server", "--import", "tsx", path.join("scripts", "worker.ts")];

/**
 * Start one worker beside a web server the script started (the demo, `npm run dev`), with the same settings: a
 * signal stops both, and the script ends with the server, stopping the worker.
 */
export function startWorkerBeside(server: ChildProcess): ChildProcess {
  const worker = spawn(process.execPath, WORKER_NODE_ARGS, { stdio: "inherit", env: process.env });
  for (const signal of ["SIGINT", "SIGTERM"] as const)
    process.on(signal, () => {
      server.kill(signal);
      worker.kill(signal);
    });
  server.on("exit", (code) => {
    worker.kill("SIGTERM");
    process.exit(code ?? 0);
  });
  return worker;
}

async function main() {
  const { getDb } = await import("../db/client");
  const { JOB_KINDS } = await import("../lib/jobs/registry");
  const { Worker } = await import("../lib/jobs/worker");
  const worker = new Worker({ db: getDb(), kinds: JOB_KINDS });
  const graceMs = Number(process.env.WORKER_GRACE_SECONDS ?? 20) * 1000;
  let signals = 0;
  for (const signal of ["SIGINT", "SIGTERM"] as const) {
    process.on(signal, () => {
      signals++;
      if (signals > 1) process.exit(1);
      console.log(`worker ${worker.owner}: ${signal}, stopping`);
      void worker.stop(graceMs).then(() => process.exit(0));
    });
  }
  const healthPort = Number(process.env.WORKER_HEALTH_PORT ?? 0);
  if (healthPort > 0) {
    // for a supervisor or the browser tests: answers once the worker works
    const { createServer } = await import("node:http");
    createServer((_request, response) => {
      response.writeHead(200, { "content-type": "application/json" }).end(JSON.stringify({ ok: true, owner: worker.owner }));
    })
      .listen(healthPort, "127.0.0.1")
      .unref();
  }
  console.log(`worker ${worker.owner}: working on ${Object.keys(JOB_KINDS).join(", ")} (database ${process.env.DATABASE_URL ?? "file:./data/ballast.db"})`);
  worker.start();
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(__filename)) {
  if (existsSync(".env.local")) process.loadEnvFile(".env.local");
  main().catch((error) => {
    console.error(`worker: ${error instanceof Error ? error.message : error}`);
    process.exit(2);
  });
}
