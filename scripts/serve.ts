/**
 * `npm run serve`: the production web tier. A primary process forks WEB_CONCURRENCY web processes (default: the
 * number of cores) with node:cluster; each runs Next's programmatic server (`next({ dev: false })`) behind its own
 * http.createServer on the shared port, and the primary hands connections out in turn. The app keeps no state
 * in a web process that another needs (sessions are signed cookies, limits and runs live in the database), so any
 * process may answer any request. A process that dies is replaced; SIGINT/SIGTERM stops them all.
 *
 * Settings: PORT (3000), HOST (the interface to listen on; all when unset, as `next start`), WEB_CONCURRENCY.
 * Build first (`next build`, or NEXT_DIST_DIR's folder); the build is read from next.config.ts as usual.
 */
import cluster from "node:cluster";
import { createServer } from "node:http";
import { availableParallelism } from "node:os";
import path from "node:path";

/** How many web processes: WEB_CONCURRENCY when a positive whole number, else the number of cores. */
export function webConcurrency(value = process.env.WEB_CONCURRENCY, cores = availableParallelism()): number {
  const n = Number(value);
  return Number.isInteger(n) && n > 0 ? n : Math.max(1, cores);
}

const port = Number(process.env.PORT ?? 3000);
const host = process.env.HOST?.trim() || undefined;

async function serveOne(): Promise<void> {
  // Next reads NODE_ENV when it loads; a production server runs as production.
  (process.env as Record<string, string>).NODE_ENV = "production";
  const { default: next } = await import("next");
  const app = next({ dev: false, dir: path.resolve(__dirname, ".."), hostname: host ?? "localhost", port });
  const handle = app.getRequestHandler();
  await app.prepare();
  const server = createServer((request, response) => void handle(request, response));
  // Slow clients must not hold a process: the same limits `next start` uses by default.
  server.keepAliveTimeout = 5_000;
  server.listen(port, host, () => process.send?.({ ready: true }));
  const stop = () => {
    server.close(() => process.exit(0));
    // Open keep-alive connections end at once; requests in flight finish.
    server.closeIdleConnections();
    setTimeout(() => process.exit(0), 10_000).unref();
  };
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
}

function primary(): void {
  const count = webConcurrency();
  let stopping = false;
  let ready = 0;
  let restarts = 0;
  const fork = () => {
    if (stopping) return;
    const worker = cluster.fork();
    worker.on("message", (message: { ready?: boolean }) => {
      if (!message?.ready) return;
      restarts = 0;
      if (++ready === count) console.log(`> Ballast serving on http://${host ?? "localhost"}:${port} with ${count} web process${count === 1 ? "" : "es"}`);
    });
  };
  for (let i = 0; i < count; i++) fork();
  cluster.on("exit", (worker, code, signal) => {
    if (stopping) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
      return;
    }
    console.error(`serve: web process ${worker.process.pid} stopped (${signal ?? `exit ${code}`}); starting another`);
    // A process that cannot start (no build, port taken) would be replaced forever: give up after a few in a row.
    if (++restarts > count * 5) {
      console.error("serve: web processes keep stopping; giving up");
      process.exit(1);
    }
    setTimeout(fork, Math.min(5_000, 200 * restarts));
  });
  for (const signal of ["SIGINT", "SIGTERM"] as const) {
    process.on(signal, () => {
      if (stopping) return;
      stopping = true;
      for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill("SIGTERM");
      setTimeout(() => process.exit(0), 12_000).unref();
    });
  }
}

if (typeof require !== "undefined" && require.main === module) {
  if (cluster.isPrimary) primary();
  else
    serveOne().catch((error: unknown) => {
      console.error("serve: the web process could not start:", error);
      process.exit(1);
    });
}
