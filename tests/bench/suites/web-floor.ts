/**
 * web-floor: what the production web tier (scripts/serve.ts, WEB_CONCURRENCY = cores) serves on this machine with
 * nothing else running — no worker, no heavy work — one route at a time under 50 signed-in connections for a few
 * seconds each, on the seeded demo database. It is the ceiling load-50-users works under: a target above a route's
 * floor here cannot be met there, where the same cores also run a worker. Printed, never asserted.
 * BENCH_FLOOR_SECONDS sets each route's duration (default 10); NEXT_DIST_DIR picks the build (built when missing).
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, rmSync } from "node:fs";
import { availableParallelism } from "node:os";
import path from "node:path";
import { randomBytes } from "node:crypto";
import autocannon from "autocannon";
import { emit } from "../emit";
import { quantile, signIn, waitFor } from "../web";

const PORT = 3230;
const BASE = `http://localhost:${PORT}`;
const SECONDS = Number(process.env.BENCH_FLOOR_SECONDS ?? 10);
const CONNECTIONS = 50;
const CORES = availableParallelism();
const root = path.resolve(__dirname, "..", "..", "..");
const distDir = process.env.NEXT_DIST_DIR ?? ".next";
const database = "data/bench-floor.db";
const env: NodeJS.ProcessEnv = {
  ...process.env,
  DATABASE_URL: `file:./${database}`,
  AUTH_SECRET: randomBytes(32).toString("base64url"),
  AUTH_TRUST_HOST: "true",
  BALLAST_CLOCK: "2026-12-01",
  BALLAST_ALLOW_CLOCK: "1",
  NEXT_TELEMETRY_DISABLED: "1",
  NODE_ENV: "production",
  PORT: String(PORT),
  WEB_CONCURRENCY: String(CORES),
};

/** One route under 50 connections of one signed-in person for SECONDS: throughput and latency quantiles. */
async function floorOf(route: { group: string; path: string }, cookie: string): Promise<void> {
  const times: number[] = [];
  let errors = 0;
  const instance = autocannon({
    url: `${BASE}${route.path}`,
    connections: CONNECTIONS,
    duration: SECONDS,
    timeout: 30,
    headers: { cookie },
    requests: [
      {
        method: "GET",
        setupRequest: (request: autocannon.Request, context: object) => {
          (context as { t0?: number }).t0 = performance.now();
          return request;
        },
        onResponse: (status: number, _body: string, context: object) => {
          times.push(performance.now() - ((context as { t0?: number }).t0 ?? performance.now()));
          if (status >= 400) errors++;
        },
      },
    ],
  });
  const result = await new Promise<autocannon.Result>((resolve) => (instance as unknown as { on(event: "done", listener: (r: autocannon.Result) => void): void }).on("done", resolve));
  times.sort((a, b) => a - b);
  emit({
    name: "web-floor",
    group: route.group,
    path: route.path.replace(/[0-9a-f]{8}-[0-9a-f-]{27}/g, ":id"),
    value: Math.round(result.requests.average),
    unit: "req/s",
    runs: times.length,
    p50: Math.round(quantile(times, 0.5)),
    p95: Math.round(quantile(times, 0.95)),
    p99: Math.round(quantile(times, 0.99)),
    errors: errors + result.errors + result.timeouts,
    connections: CONNECTIONS,
    seconds: SECONDS,
    webProcesses: CORES,
  });
}

(async () => {
  if (!existsSync(path.join(root, distDir, "BUILD_ID"))) {
    const built = spawnSync(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "build"], { cwd: root, env, stdio: "inherit" });
    if (built.status !== 0) throw new Error("next build failed");
  }
  for (const suffix of ["", "-wal", "-shm"]) rmSync(path.join(root, database + suffix), { force: true });
  const seeded = spawnSync(process.execPath, ["--conditions=react-server", "--import", "tsx", "db/seed.ts"], { cwd: root, env, stdio: ["ignore", "ignore", "inherit"] });
  if (seeded.status !== 0) throw new Error("seeding failed");

  const children: ChildProcess[] = [];
  try {
    children.push(spawn(process.execPath, ["--import", "tsx", "scripts/serve.ts"], { cwd: root, env, stdio: ["ignore", "ignore", "inherit"] }));
    await waitFor(`${BASE}/api/health`, 120);
    const cookie = await signIn(BASE, "ada.quayle@northmoor.example");
    const routes = [
      { group: "health", path: "/api/health" },
      { group: "periods API", path: "/api/periods" },
      { group: "home page", path: "/home" },
      { group: "periods page", path: "/periods" },
    ];
    // Each route warmed by a few requests first, so the figures are of a warm process (compiled, connected).
    for (const route of routes) {
      for (let i = 0; i < 2 * CORES; i++) await fetch(`${BASE}${route.path}`, { headers: { cookie } }).then((r) => r.arrayBuffer());
      await floorOf(route, cookie);
    }
  } finally {
    for (const child of children) child.kill("SIGTERM");
    await Promise.all(children.map((child) => (child.exitCode !== null ? Promise.resolve() : new Promise((r) => child.once("exit", r)))));
  }
})().catch((error) => {
  console.error(`web-floor bench failed: ${error instanceof Error ? (error.stack ?? error.message) : error}`);
  process.exit(1);
});
