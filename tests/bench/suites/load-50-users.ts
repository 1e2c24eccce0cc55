/**
 * load-50-users: 50 signed-in sessions for 60 s on a mix of pages and API routes, against the production web tier
 * (scripts/serve.ts, WEB_CONCURRENCY = cores) and one worker (`npm run worker`, when scripts/worker.ts exists), on a
 * fresh seeded database of its own, while a run on a 200,000-position book and a 40 MB price-history import execute.
 * Prints throughput, p50/p95/p99 per route group, errors, and /api/health p99, each beside its target (issue 17;
 * printed, never asserted). BENCH_LOAD_SECONDS shortens it; NEXT_DIST_DIR picks the build (built when missing).
 *
 * The files are generated here, from a fixed seed: the book is the demo November book repeated 3,637 times, each copy under its own book names
 * (quantities scaled by a seeded whole factor) cut at 200,000 rows; the price history is a seeded random walk for
 * 500 new instruments over enough business days to make 40 MB. Both are received (read and previewed) before the
 * load starts; the positions are confirmed then too. During the load the run is started and the price file
 * confirmed through the API, as people would.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, readFileSync, rmSync } from "node:fs";
import { availableParallelism } from "node:os";
import path from "node:path";
import { randomBytes } from "node:crypto";
import autocannon from "autocannon";
import Papa from "papaparse";
import { and, desc, eq, inArray } from "drizzle-orm";
import { emit } from "../emit";
import { quantile, signIn as signInAt, waitFor } from "../web";
import { startUploadStandIn, storeFileInStandIn } from "../../../scripts/upload-standin";
import { mulberry32 } from "../../../lib/risk/random";

const PORT = 3210;
const UPLOAD_PORT = 4210;
const BASE = `http://localhost:${PORT}`;
const SECONDS = Number(process.env.BENCH_LOAD_SECONDS ?? 60);
const CONNECTIONS = 50;
const CORES = availableParallelism();
const TARGETS = { throughput: 150, p95: 500, healthP99: 50, errors: 0 };
const root = path.resolve(__dirname, "..", "..", "..");
const distDir = process.env.NEXT_DIST_DIR ?? ".next";
const uploadDir = path.join(root, "data/bench-load-uploads");
const token = Buffer.from(JSON.stringify({ apiKey: `sk_bench_${randomBytes(8).toString("hex")}`, appId: "bench", regions: ["local"] })).toString("base64");
const env: NodeJS.ProcessEnv = {
  ...process.env,
  DATABASE_URL: "file:./data/bench-load.db",
  AUTH_SECRET: randomBytes(32).toString("base64url"),
  AUTH_TRUST_HOST: "true",
  BALLAST_CLOCK: "2026-12-01",
  BALLAST_ALLOW_CLOCK: "1",
  NEXT_TELEMETRY_DISABLED: "1",
  UPLOADTHING_TOKEN: token,
  UPLOADTHING_INGEST_URL: `http://127.0.0.1:${UPLOAD_PORT}`,
  UPLOADTHING_API_URL: `http://127.0.0.1:${UPLOAD_PORT}`,
  UPLOAD_STANDIN_DIR: "data/bench-load-uploads",
  NODE_ENV: "production",
  PORT: String(PORT),
  WEB_CONCURRENCY: String(CORES),
};
// This process reads and writes the same database for the set-up (data functions read DATABASE_URL).
Object.assign(process.env, { DATABASE_URL: env.DATABASE_URL, BALLAST_CLOCK: env.BALLAST_CLOCK, UPLOAD_STANDIN_DIR: env.UPLOAD_STANDIN_DIR });

/** mulberry32 (lib/risk/random.ts): a small seeded generator, so the files are the same on every run. */
const seeded = mulberry32;
const signIn = (email: string) => signInAt(BASE, email);

/** 200,000 positions: the demo November book repeated per book, each copy's sizes scaled by a seeded factor 1–5. */
function bookFile(rows = 200_000): Uint8Array {
  const parsed = Papa.parse<string[]>(readFileSync(path.join(root, "templates/demo/northmoor-positions-2026-11.csv"), "utf8").trim(), { skipEmptyLines: true });
  const [header, ...lines] = parsed.data;
  const col = (name: string) => header.indexOf(name);
  const scaled = ["quantity", "market_value", "delta_exposure", "notional"].map(col).filter((i) => i >= 0);
  const random = seeded(17);
  const out: string[][] = [];
  for (let copy = 0; out.length < rows; copy++) {
    const k = 1 + Math.floor(random() * 5);
    for (const line of lines) {
      if (out.length >= rows) break;
      const cells = [...line];
      cells[col("book")] = `${cells[col("book")]}-${String(copy).padStart(4, "0")}`;
      for (const i of scaled) if (cells[i] !== "") cells[i] = String(Math.round(Number(cells[i]) * k * 100) / 100);
      out.push(cells);
    }
  }
  return new TextEncoder().encode(Papa.unparse([header, ...out], { newline: "\n" }) + "\n");
}

/** About 40 MB of closes: a seeded random walk for 500 new instruments over business days from 2016 on. */
function priceFile(targetBytes = 40 * 1024 * 1024): Uint8Array {
  const random = seeded(40);
  const instruments = Array.from({ length: 500 }, (_, i) => `BENCH-PX-${String(i).padStart(4, "0")}`);
  const perDay = instruments.length * "2016-01-04,BENCH-PX-0000,100.0000\n".length;
  const days: string[] = [];
  for (let d = new Date(Date.UTC(2016, 0, 4)); days.length * perDay < targetBytes && d.toISOString() < "2026-11-21"; d.setUTCDate(d.getUTCDate() + 1)) {
    if (d.getUTCDay() !== 0 && d.getUTCDay() !== 6) days.push(d.toISOString().slice(0, 10));
  }
  const parts: string[] = ["date,instrument,close\n"];
  for (const code of instruments) {
    let price = 50 + random() * 100;
    for (const day of days) {
      price *= Math.exp(0.012 * (random() + random() + random() - 1.5));
      parts.push(`${day},${code},${price.toFixed(4)}\n`);
    }
  }
  return new TextEncoder().encode(parts.join(""));
}

(async () => {
  if (!existsSync(path.join(root, distDir, "BUILD_ID"))) {
    const built = spawnSync(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "build"], { cwd: root, env, stdio: "inherit" });
    if (built.status !== 0) throw new Error("next build failed");
  }
  for (const p of ["data/bench-load.db", "data/bench-load.db-wal", "data/bench-load.db-shm", "data/bench-load-uploads"]) rmSync(path.join(root, p), { recursive: true, force: true });
  const standIn = await startUploadStandIn({ token, port: UPLOAD_PORT, dir: uploadDir });
  const seededDb = spawnSync(process.execPath, ["--conditions=react-server", "--import", "tsx", "db/seed.ts"], { cwd: root, env, stdio: ["ignore", "ignore", "inherit"] });
  if (seededDb.status !== 0) throw new Error("seeding failed");

  // Set-up through the data functions of this process: receive both files, confirm the book.
  const { getDb } = await import("@/db/client");
  const { actorForEmail } = await import("@/db/actor-for");
  const { receiveUploadBytes, receiveUpload, confirmUpload } = await import("@/lib/data/uploads");
  const schema = await import("@/db/schema");
  const db = getDb();
  const admin = await actorForEmail(db, "ada.quayle@northmoor.example");
  const analyst = await actorForEmail(db, "priya.castell@northmoor.example");
  const officer = await actorForEmail(db, "tomas.reyne@northmoor.example");
  const periods = await db.select().from(schema.reportingPeriods).where(eq(schema.reportingPeriods.firmId, admin.firmId)).orderBy(desc(schema.reportingPeriods.periodEnd));
  const open = periods.find((p) => p.state !== "filed" && p.state !== "signed")!;
  const filed = periods.find((p) => p.state === "filed")!;
  const receive = async (actor: typeof admin, kind: "positions" | "prices", name: string, bytes: Uint8Array, periodId: string | null) => {
    const key = `bench-${kind}-${randomBytes(6).toString("hex")}`;
    storeFileInStandIn(uploadDir, key, name, bytes);
    const context = { firmId: actor.firmId, userId: actor.userId, userName: actor.name, periodId, kind, numberFormat: "plain" as const };
    return (await receiveUploadBytes(context, { key, name, ufsUrl: `http://127.0.0.1:${UPLOAD_PORT}/f/${key}` }, bytes)).uploadId;
  };
  const book = bookFile();
  const t0 = performance.now();
  const bookUpload = await receive(officer, "positions", "book-200k.csv", book, open.id);
  const confirmedBook = await confirmUpload(officer, bookUpload, { acknowledgeWarnings: true });
  if (!("stored" in confirmedBook)) throw new Error(`the 200,000-position book was not stored: ${JSON.stringify(confirmedBook).slice(0, 300)}`);
  const bookMs = performance.now() - t0;
  const prices = priceFile();
  // The price file is put in the upload service now and handed over during the load, as its callback would: the
  // worker then reads and checks it, and the confirmation goes through the API to the worker.
  const priceKey = `bench-prices-${randomBytes(6).toString("hex")}`;
  storeFileInStandIn(uploadDir, priceKey, "prices-40mb.csv", prices);
  const [filedRun] = await db.select({ id: schema.runs.id }).from(schema.runs).where(and(eq(schema.runs.firmId, admin.firmId), eq(schema.runs.periodId, filed.id), eq(schema.runs.isFilingRun, true)));
  const [filing] = await db
    .select({ id: schema.filings.id })
    .from(schema.filings)
    .where(and(eq(schema.filings.firmId, admin.firmId), eq(schema.filings.periodId, filed.id), inArray(schema.filings.status, ["signed", "filed"])))
    .orderBy(desc(schema.filings.version));
  emit({ name: "load-50-users-setup", value: Math.round(bookMs), unit: "ms", runs: 1, note: "receive + confirm of the 200,000-position book in the bench process", bookRows: confirmedBook.stored, bookBytes: book.length, priceBytes: prices.length });

  const children: ChildProcess[] = [];
  try {
    children.push(spawn(process.execPath, ["--import", "tsx", "scripts/serve.ts"], { cwd: root, env, stdio: ["ignore", "ignore", "inherit"] }));
    const workerScript = path.join(root, "scripts/worker.ts");
    const withWorker = existsSync(workerScript);
    if (withWorker) children.push(spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", workerScript], { cwd: root, env, stdio: ["ignore", "ignore", "inherit"] }));
    await waitFor(`${BASE}/api/health`, 120);
    // The book's confirmation queued its data-quality job (the report, and the history check a start reads): done by
    // the worker before the load, as it is when the book was confirmed earlier than the run is started.
    const queueStart = performance.now();
    const pendingJobs = async () => (await db.select({ id: schema.jobs.id }).from(schema.jobs).where(inArray(schema.jobs.state, ["queued", "running"]))).length;
    while (withWorker && (await pendingJobs()) > 0 && performance.now() - queueStart < 180_000) await new Promise((r) => setTimeout(r, 500));
    emit({ name: "load-50-users-setup", metric: "queue-settled", value: Math.round(performance.now() - queueStart), unit: "ms", runs: 1, note: "the worker's jobs queued by the set-up (the book's data-quality report and history check) done before the load" });

    // 50 sessions signed in through Auth.js's credentials flow; administrators and auditors may read every route of
    // the mix (the audit trail is theirs only).
    const readers = ["ada.quayle@northmoor.example", "oskar.lind@northmoor.example"];
    const sessions: string[] = [];
    for (let i = 0; i < CONNECTIONS; i++) sessions.push(await signIn(readers[i % readers.length]));
    const analystSession = await signIn(analyst.email);

    // The mix, per 100 requests; each group is what the figures are reported by.
    const runPath = filedRun ? `/periods/${filed.id}/runs/${filedRun.id}` : `/periods/${filed.id}/runs`;
    const mix: { group: string; path: string; weight: number }[] = [
      { group: "home", path: "/home", weight: 12 },
      { group: "periods", path: "/periods", weight: 8 },
      { group: "periods", path: "/api/periods", weight: 10 },
      { group: "runs list", path: "/runs", weight: 6 },
      { group: "runs list", path: `/api/periods/${open.id}/runs`, weight: 10 },
      { group: "run pages", path: runPath, weight: 8 },
      ...(filedRun
        ? [
            { group: "run API", path: `/api/runs/${filedRun.id}`, weight: 10 },
            { group: "run API", path: `/api/runs/${filedRun.id}/factors`, weight: 6 },
          ]
        : [{ group: "run API", path: `/api/periods/${filed.id}/runs`, weight: 16 }]),
      { group: "method", path: "/method", weight: 8 },
      { group: "data", path: "/data", weight: 8 },
      { group: "audit", path: "/audit", weight: 4 },
      { group: "audit", path: "/api/audit?page=1&pageSize=50", weight: 4 },
      { group: "health", path: "/api/health", weight: 4 },
      { group: "pack download", path: filing ? `/api/filings/${filing.id}/packs/xlsx` : "/api/health", weight: 1 },
      { group: "data-quality page", path: `/periods/${open.id}/data-quality`, weight: 1 },
    ];
    // A fixed shuffle of the 100, so the connections do not move through the mix in step.
    const order = mix.flatMap((m) => Array.from({ length: m.weight }, () => m));
    const shuffle = seeded(50);
    for (let i = order.length - 1; i > 0; i--) {
      const j = Math.floor(shuffle() * (i + 1));
      [order[i], order[j]] = [order[j], order[i]];
    }
    const times = new Map<string, number[]>();
    const errorsBy = new Map<string, number>();
    let client = 0;
    type Context = { cookie?: string; next?: number; group?: string; t0?: number };
    const instance = autocannon({
      url: BASE,
      connections: CONNECTIONS,
      duration: SECONDS,
      timeout: 30,
      // Each connection is one signed-in person: its context keeps the session cookies for all its requests and its
      // place in the mix, which starts at a different point for each person (2 apart), so they do not move in step.
      requests: [
        {
          method: "GET",
          setupRequest: (request: autocannon.Request, context: object) => {
            const ctx = context as Context;
            if (ctx.cookie === undefined) {
              ctx.next = (client * 2) % order.length;
              ctx.cookie = sessions[client++ % sessions.length];
            }
            const m = order[ctx.next! % order.length];
            ctx.next = ctx.next! + 1;
            ctx.group = m.group;
            ctx.t0 = performance.now();
            return { ...request, path: m.path, headers: { ...(request.headers ?? {}), cookie: ctx.cookie } } as autocannon.Request;
          },
          onResponse: (status: number, _body: string, context: object) => {
            const ctx = context as Context;
            const group = ctx.group ?? "?";
            const list = times.get(group) ?? [];
            list.push(performance.now() - (ctx.t0 ?? performance.now()));
            times.set(group, list);
            if (status >= 400) errorsBy.set(`${group} ${status}`, (errorsBy.get(`${group} ${status}`) ?? 0) + 1);
          },
        },
      ],
    });
    const done = new Promise<autocannon.Result>((resolve) => (instance as unknown as { on(event: "done", listener: (r: autocannon.Result) => void): void }).on("done", resolve));

    // The heavy work, started as people would while the others click.
    const post = async (url: string, body: unknown) => {
      const t = performance.now();
      const response = await fetch(`${BASE}${url}`, { method: "POST", headers: { cookie: analystSession, "content-type": "application/json", origin: BASE }, body: JSON.stringify(body) });
      const text = await response.text();
      return { status: response.status, ms: performance.now() - t, text };
    };
    const heavyStart = performance.now();
    const statusOfUpload = async (id: string) => (await db.select({ status: schema.uploads.status }).from(schema.uploads).where(eq(schema.uploads.id, id)))[0]?.status;
    const importPrices = async () => {
      const t = performance.now();
      const { uploadId } = await receiveUpload(
        { firmId: analyst.firmId, userId: analyst.userId, userName: analyst.name, periodId: null, kind: "prices", numberFormat: "plain" },
        { key: priceKey, name: "prices-40mb.csv", size: prices.length, ufsUrl: `http://127.0.0.1:${UPLOAD_PORT}/f/${priceKey}` },
      );
      const handOverMs = performance.now() - t;
      while ((await statusOfUpload(uploadId)) === "reading" && performance.now() - heavyStart < SECONDS * 1000 + 120_000) await new Promise((r) => setTimeout(r, 500));
      const readMs = performance.now() - t;
      return { uploadId, handOverMs, readMs, confirm: await post(`/api/uploads/prices/${uploadId}/confirm`, { acknowledgeWarnings: true }) };
    };
    const [runStart, priceImport] = await Promise.all([post(`/api/periods/${open.id}/runs`, { excludeShortHistory: true }), importPrices()]);
    const priceUpload = priceImport.uploadId;
    const priceConfirm = priceImport.confirm;
    const result = await done;
    const loadEnd = performance.now();

    const all = [...times.values()].flat().sort((a, b) => a - b);
    const errors = result.errors + result.timeouts + result.non2xx;
    const common = { runs: 1, connections: CONNECTIONS, seconds: SECONDS, webProcesses: CORES, worker: withWorker };
    emit({ name: "load-50-users", metric: "throughput", value: Math.round(result.requests.average), unit: "req/s", target: `>= ${TARGETS.throughput}`, requests: result.requests.total, ...common });
    emit({ name: "load-50-users", metric: "p50", value: Math.round(quantile(all, 0.5)), unit: "ms", ...common });
    emit({ name: "load-50-users", metric: "p95", value: Math.round(quantile(all, 0.95)), unit: "ms", target: `<= ${TARGETS.p95}`, ...common });
    emit({ name: "load-50-users", metric: "p99", value: Math.round(quantile(all, 0.99)), unit: "ms", ...common });
    emit({ name: "load-50-users", metric: "errors", value: errors, unit: "count", target: `= ${TARGETS.errors}`, timeouts: result.timeouts, non2xx: result.non2xx, byGroup: Object.fromEntries(errorsBy), ...common });
    const health = (times.get("health") ?? []).sort((a, b) => a - b);
    emit({ name: "load-50-users", metric: "health-p99", value: Math.round(quantile(health, 0.99)), unit: "ms", target: `<= ${TARGETS.healthP99}`, samples: health.length, ...common });
    for (const [group, list] of [...times.entries()].sort()) {
      list.sort((a, b) => a - b);
      emit({ name: "load-50-users-group", group, value: Math.round(quantile(list, 0.5)), unit: "ms", runs: list.length, p95: Math.round(quantile(list, 0.95)), p99: Math.round(quantile(list, 0.99)) });
    }
    emit({ name: "load-50-users-heavy", metric: "run-start-answer", value: Math.round(runStart.ms), unit: "ms", runs: 1, target: "<= 200", status: runStart.status, ...(runStart.status >= 300 ? { answer: runStart.text.slice(0, 300) } : {}) });
    emit({ name: "load-50-users-heavy", metric: "price-hand-over", value: Math.round(priceImport.handOverMs), unit: "ms", runs: 1, note: "the upload service's callback: record the file, queue its reading" });
    emit({ name: "load-50-users-heavy", metric: "price-read", value: Math.round(priceImport.readMs), unit: "ms", runs: 1, bytes: prices.length, note: "hand-over until the worker has read and checked the file (queued behind the run when one worker)" });
    emit({ name: "load-50-users-heavy", metric: "price-confirm-answer", value: Math.round(priceConfirm.ms), unit: "ms", runs: 1, status: priceConfirm.status, bytes: prices.length, ...(priceConfirm.status >= 300 ? { answer: priceConfirm.text.slice(0, 300) } : {}) });

    // Where the heavy work stands at the end of the load, then when it finished (waited for at most 3 minutes).
    const runId: string | undefined = runStart.status < 300 ? (JSON.parse(runStart.text).run?.id ?? JSON.parse(runStart.text).id) : undefined;
    const stateOf = async () => {
      const [run] = runId ? await db.select({ status: schema.runs.status, stage: schema.runs.stage, progress: schema.runs.progress }).from(schema.runs).where(eq(schema.runs.id, runId)) : [];
      const [upload] = await db.select({ status: schema.uploads.status }).from(schema.uploads).where(eq(schema.uploads.id, priceUpload));
      return { run, upload };
    };
    const atEnd = await stateOf();
    let finished = atEnd;
    const settleDeadline = Date.now() + 180_000;
    while ((finished.run && ["queued", "running"].includes(finished.run.status)) || ["reading", "pending", "confirming"].includes(finished.upload?.status ?? "")) {
      if (Date.now() > settleDeadline) break;
      await new Promise((r) => setTimeout(r, 1000));
      finished = await stateOf();
    }
    emit({
      name: "load-50-users-heavy",
      metric: "settled-after-start",
      value: Math.round(performance.now() - heavyStart),
      unit: "ms",
      runs: 1,
      loadMs: Math.round(loadEnd - heavyStart),
      atLoadEnd: atEnd,
      settled: finished,
    });
  } finally {
    for (const child of children) child.kill("SIGTERM");
    await Promise.all(children.map((child) => (child.exitCode !== null ? Promise.resolve() : new Promise((r) => child.once("exit", r)))));
    await standIn.close();
    db.$client.close();
  }
})().catch((error) => {
  console.error(`load bench failed: ${error instanceof Error ? (error.stack ?? error.message) : error}`);
  process.exit(1);
});
