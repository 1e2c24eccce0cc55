/**
 * A month-end run over the demo data (Northmoor: 46 positions, 47 factors, price history 2023-01-02 to 2026-11-20),
 * through the data layer as the app does it: gathering and storing the inputs (start), then computing and storing
 * the results (execute), and the reproduction of one run from its stored inputs. Three runs each, medians.
 */
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { emit, median } from "../emit";
import { benchDatabase, peakRssMiB } from "../upload-bench";
import { getDb } from "@/db/client";
import { seedDemoUploads } from "@/db/seed-uploads";
import { seedDemoMethod } from "@/db/seed-method";
import { getRun, reproduceRun, startRun } from "@/lib/data/runs";
import { executeRun } from "@/lib/data/run-execution";

(async () => {
  process.env.UPLOAD_STANDIN_DIR = mkdtempSync(path.join(tmpdir(), "ballast-bench-files-"));
  const { actor, periodId } = await benchDatabase("priya.castell@northmoor.example");
  await seedDemoUploads(getDb(), "2026-11-30");
  await seedDemoMethod(getDb());
  const starts: number[] = [];
  const executes: number[] = [];
  let last = "";
  for (let i = 0; i < 3; i++) {
    const t0 = performance.now();
    const run = await startRun(actor, periodId, { excludeShortHistory: true });
    const t1 = performance.now();
    const outcome = await executeRun(run.id);
    const t2 = performance.now();
    if (outcome !== "completed") throw new Error(`demo run ${outcome}: ${(await getRun(actor, run.id)).error}`);
    starts.push(t1 - t0);
    executes.push(t2 - t1);
    last = run.id;
  }
  emit({ name: "run-demo-start", value: median(starts), unit: "ms", runs: 3, what: "gather positions, closes, method, profile and data-quality report; store inputs with hashes", all: starts.map(Math.round) });
  emit({ name: "run-demo-execute", value: median(executes), unit: "ms", runs: 3, what: "per-factor volatility under four estimators, the engine, storing the results", all: executes.map(Math.round) });
  const reproductions: number[] = [];
  for (let i = 0; i < 3; i++) {
    const t0 = performance.now();
    const run = await reproduceRun(actor, last);
    await executeRun(run.id);
    reproductions.push(performance.now() - t0);
    const done = await getRun(actor, run.id);
    if (!done.results?.reproduction?.matches) throw new Error("the demo run did not reproduce");
  }
  emit({ name: "run-demo-reproduce", value: median(reproductions), unit: "ms", runs: 3, all: reproductions.map(Math.round) });
  emit({ name: "run-demo-rss", value: peakRssMiB(), unit: "MiB", runs: 1 });
})().catch((error) => {
  console.error(error);
  process.exit(1);
});
