/**
 * Single requests that read stored results (issue 17, "compute once, read many"), on the demo data (Northmoor's
 * November: its positions and price history to 2026-11-20), through the data layer the routes and pages call:
 * - the data-quality report: the first read computes and stores it; later reads with unchanged inputs serve the
 *   stored report (its inputs key read and compared) — target 150 ms;
 * - a filing pack download: the first renders and stores it; later downloads serve the stored bytes with the
 *   download's audit record — target 50 ms.
 * Printed, not asserted.
 */
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { emit, median } from "../emit";
import { benchDatabase, peakRssMiB } from "../upload-bench";
import { getDb } from "@/db/client";
import { seedDemoUploads } from "@/db/seed-uploads";
import { seedDemoMethod } from "@/db/seed-method";
import { actorForEmail } from "@/db/actor-for";
import { getDataQuality, qualityComputations } from "@/lib/data/data-quality";
import { getRun, startRun, useForFiling } from "@/lib/data/runs";
import { executeRun } from "@/lib/data/run-execution";
import { downloadPack, prepareFiling } from "@/lib/data/filings";
import { packRenders } from "@/lib/data/packs";

const READS = 20;

async function timed<T>(fn: () => Promise<T>): Promise<number> {
  const t0 = performance.now();
  await fn();
  return performance.now() - t0;
}

(async () => {
  process.env.UPLOAD_STANDIN_DIR = mkdtempSync(path.join(tmpdir(), "ballast-bench-files-"));
  const { actor, periodId } = await benchDatabase("priya.castell@northmoor.example");
  await seedDemoUploads(getDb(), "2026-11-30");
  await seedDemoMethod(getDb());

  const firstQuality = await timed(() => getDataQuality(actor, periodId));
  const qualityReads: number[] = [];
  for (let i = 0; i < READS; i++) qualityReads.push(await timed(() => getDataQuality(actor, periodId)));
  emit({ name: "data-quality-first-read", value: firstQuality, unit: "ms", runs: 1, what: "no stored report: compute from positions and every close to the period end, store" });
  emit({ name: "data-quality-stored-read", value: median(qualityReads), unit: "ms", runs: READS, target: 150, computations: qualityComputations.count, what: "inputs key read and compared, stored report served", max: Math.round(Math.max(...qualityReads)) });

  const run = await startRun(actor, periodId, { excludeShortHistory: true });
  const outcome = await executeRun(run.id);
  if (outcome !== "completed") throw new Error(`demo run ${outcome}: ${(await getRun(actor, run.id)).error}`);
  await useForFiling(actor, run.id);
  const officer = await actorForEmail(getDb(), "tomas.reyne@northmoor.example");
  const filing = await prepareFiling(officer, periodId);
  for (const kind of ["docx", "xlsx"] as const) {
    const first = await timed(() => downloadPack(officer, filing.id, kind));
    const reads: number[] = [];
    for (let i = 0; i < READS; i++) reads.push(await timed(() => downloadPack(officer, filing.id, kind)));
    emit({ name: `pack-${kind}-first-download`, value: first, unit: "ms", runs: 1, what: "nothing stored: render, store with its SHA-256, audit the download" });
    emit({ name: `pack-${kind}-stored-download`, value: median(reads), unit: "ms", runs: READS, target: 50, renders: packRenders.count, what: "filing read, content key, stored bytes served, download audited", max: Math.round(Math.max(...reads)) });
  }
  emit({ name: "stored-reads-rss", value: peakRssMiB(), unit: "MiB", runs: 1 });
})().catch((error) => {
  console.error(error);
  process.exit(1);
});
