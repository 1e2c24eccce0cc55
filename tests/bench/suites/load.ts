/**
 * load-50-users: 50 concurrent signed-in users for 60 s against `next start` on loopback, across the dashboard,
 * results and audit routes, while a run computes (when the runs routes exist). Prints throughput, p50/p95/p99
 * latency and the error count. Target: 0 errors, p95 ≤ 150 ms on the read routes. Bounded: 60 s, loopback only.
 * BENCH_LOAD_SECONDS shortens it for a quick look.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, rmSync } from "node:fs";
import path from "node:path";
import { randomBytes } from "node:crypto";
import autocannon from "autocannon";
import { emit } from "../emit";
import { startUploadStandIn } from "../../../scripts/upload-standin";
import { DEMO_PASSWORD, DEMO_USERS } from "../../../db/seed";

const PORT = 3210;
const BASE = `http://localhost:${PORT}`;
const SECONDS = Number(process.env.BENCH_LOAD_SECONDS ?? 60);
const root = path.resolve(__dirname, "..", "..", "..");
const token = Buffer.from(JSON.stringify({ apiKey: `sk_bench_${randomBytes(8).toString("hex")}`, appId: "bench", regions: ["local"] })).toString("base64");
const env = {
  ...process.env,
  DATABASE_URL: "file:./data/bench-load.db",
  AUTH_SECRET: randomBytes(32).toString("base64url"),
  AUTH_TRUST_HOST: "true",
  BALLAST_CLOCK: "2026-12-01",
  BALLAST_ALLOW_CLOCK: "1",
  NEXT_TELEMETRY_DISABLED: "1",
  UPLOADTHING_TOKEN: token,
  UPLOADTHING_INGEST_URL: "http://127.0.0.1:4210",
  UPLOADTHING_API_URL: "http://127.0.0.1:4210",
  UPLOAD_STANDIN_DIR: "data/bench-load-uploads",
  NODE_ENV: "production" as const,
};

async function signIn(email: string): Promise<string> {
  const csrf = await fetch(`${BASE}/api/auth/csrf`);
  const jar = (csrf.headers.getSetCookie?.() ?? []).map((c) => c.split(";")[0]);
  const { csrfToken } = await csrf.json();
  const response = await fetch(`${BASE}/api/auth/callback/credentials`, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: jar.join("; ") },
    body: new URLSearchParams({ csrfToken, email, password: DEMO_PASSWORD, callbackUrl: `${BASE}/home` }),
    redirect: "manual",
  });
  const cookies = [...jar, ...(response.headers.getSetCookie?.() ?? []).map((c) => c.split(";")[0])];
  const session = cookies.find((c) => c.startsWith("authjs.session-token="));
  if (!session) throw new Error(`sign-in failed for ${email} (${response.status})`);
  return session;
}

async function waitFor(url: string, seconds: number): Promise<void> {
  const deadline = Date.now() + seconds * 1000;
  for (;;) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not up yet
    }
    if (Date.now() > deadline) throw new Error(`${url} did not answer within ${seconds} s`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

(async () => {
  if (!existsSync(path.join(root, ".next", "BUILD_ID"))) {
    const built = spawnSync(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "build"], { cwd: root, env, stdio: "inherit" });
    if (built.status !== 0) throw new Error("next build failed");
  }
  for (const p of ["data/bench-load.db", "data/bench-load.db-wal", "data/bench-load.db-shm", "data/bench-load-uploads"]) rmSync(path.join(root, p), { recursive: true, force: true });
  const standIn = await startUploadStandIn({ token, port: 4210, dir: path.join(root, "data/bench-load-uploads") });
  const seeded = spawnSync(process.execPath, ["--conditions=react-server", "--import", "tsx", "db/seed.ts"], { cwd: root, env, stdio: "inherit" });
  if (seeded.status !== 0) throw new Error("seeding failed");
  let server: ChildProcess | undefined;
  try {
    server = spawn(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "start", "-p", String(PORT)], { cwd: root, env, stdio: "ignore" });
    await waitFor(`${BASE}/api/health`, 60);

    const sessions: string[] = [];
    // Administrators and auditors may read every route in the mix (the audit trail is theirs only).
    const readers = DEMO_USERS.filter((u) => u.roles.some((r) => r === "admin" || r === "auditor"));
    for (let i = 0; i < 50; i++) sessions.push(await signIn(readers[i % readers.length].email));
    const probe = { headers: { cookie: sessions[0] } };
    const periodId = (await (await fetch(`${BASE}/api/periods`, probe)).json()).periods[0].id as string;

    // Start a run for the period while the load runs, when the runs routes exist.
    const analyst = await signIn(DEMO_USERS[2].email);
    const started = await fetch(`${BASE}/api/periods/${periodId}/runs`, { method: "POST", headers: { cookie: analyst, "content-type": "application/json" }, body: JSON.stringify({ excludeShortHistory: true }) });
    const runNote = started.status < 300 ? "a run computing" : `no run (POST runs answered ${started.status})`;
    const runs = started.status < 300 ? await (await fetch(`${BASE}/api/periods/${periodId}/runs`, { headers: { cookie: analyst } })).json() : null;
    const runId: string | undefined = runs?.runs?.[0]?.id;

    // The dashboard, the results and the audit trail.
    const paths = ["/home", "/api/periods", "/api/audit?page=1&pageSize=50"];
    if (runId) paths.push(`/api/runs/${runId}`, `/api/runs/${runId}/factors`);
    // One request per route first, to see which route costs what (median of 5, one connection).
    for (const p of paths) {
      const each: number[] = [];
      let size = 0;
      for (let i = 0; i < 5; i++) {
        const t0 = performance.now();
        const r = await fetch(`${BASE}${p}`, { headers: { cookie: sessions[0] } });
        size = (await r.arrayBuffer()).byteLength;
        each.push(performance.now() - t0);
      }
      each.sort((a, b) => a - b);
      emit({ name: "load-route-single", route: p.replace(/[0-9a-f-]{36}/g, ":id"), value: Math.round(each[2]), unit: "ms", runs: 5, bytes: size });
    }
    let client = 0;
    const times: number[] = [];
    const instance = autocannon({
      url: BASE,
      connections: 50,
      duration: SECONDS,
      // Each connection is one signed-in person: its context keeps the session cookie for all its requests.
      requests: paths.map((p): autocannon.Request => ({
        method: "GET",
        path: p,
        setupRequest: (request: autocannon.Request, context: object) => {
          const ctx = context as { cookie?: string };
          ctx.cookie ??= sessions[client++ % sessions.length];
          return { ...request, headers: { ...(request.headers ?? {}), cookie: ctx.cookie } } as autocannon.Request;
        },
      })),
    });
    const statuses = new Map<number, number>();
    (instance as unknown as { on(event: "response", listener: (client: unknown, status: number, bytes: number, time: number) => void): void }).on("response", (_client, status, _bytes, responseTime) => {
      times.push(responseTime);
      statuses.set(status, (statuses.get(status) ?? 0) + 1);
    });
    const result = await new Promise<autocannon.Result>((resolve) => (instance as unknown as { on(event: "done", listener: (r: autocannon.Result) => void): void }).on("done", resolve));
    times.sort((a, b) => a - b);
    const percentile = (p: number) => times[Math.min(times.length - 1, Math.ceil(p * times.length) - 1)];
    const errors = result.errors + result.timeouts + result.non2xx;
    const common = { runs: 1, connections: 50, seconds: SECONDS, routes: paths.length, during: runNote };
    emit({ name: "load-50-users", metric: "throughput", value: Math.round(result.requests.average), unit: "req/s", ...common });
    emit({ name: "load-50-users", metric: "p50", value: Math.round(percentile(0.5)), unit: "ms", ...common });
    emit({ name: "load-50-users", metric: "p95", value: Math.round(percentile(0.95)), unit: "ms", target: 150, ...common });
    emit({ name: "load-50-users", metric: "p99", value: Math.round(percentile(0.99)), unit: "ms", ...common });
    emit({ name: "load-50-users", metric: "errors", value: errors, unit: "count", requests: result.requests.total, statuses: Object.fromEntries(statuses), ...common });
  } finally {
    server?.kill("SIGTERM");
    await standIn.close();
  }
})().catch((error) => {
  console.error(`load bench failed: ${error instanceof Error ? error.message : error}`);
  process.exit(1);
});
