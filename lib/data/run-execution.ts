/**
 * Execute a queued run in a worker process (job kind "run", lib/jobs/kinds/run.ts): gather its inputs as they stand
 * (or read the stored ones: a reproduction, or a run given back by a stopping worker), store them with their hashes,
 * check the method can be computed, compute, record stage and percentage as it goes (extending the job's lease),
 * then store the results (the figures in the run's row, the per-position detail in run_details) and its completion
 * in one transaction with the audit record. A failure is stored with its
 * reason; earlier runs are never touched.
 */
import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { getDb, type Database } from "@/db/client";
import { firms, memberships, runDetails, runInputs, runs, users } from "@/db/schema";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import { parseRoles } from "@/lib/auth/roles";
import { now } from "@/lib/clock";
import { ENGINE_VERSION } from "@/lib/risk/version";
import { gatherRunInputs, packDetail, packInputs, unpackInputs, withStoredDetail } from "./runs";
import { splitDetail } from "@/lib/runs/detail";
import { jobByKey } from "@/lib/jobs/queue";
import { readPayload, runPayloadSchema } from "@/lib/jobs/payload";
import { runJobKey } from "@/lib/data/run-staleness";
import { inputHashesOf, compareRuns, asStored } from "@/lib/runs/compare";
import { computeRun, type ComputeContext, type RunProgress } from "@/lib/runs/compute";
import { RUN_STAGES, type RunInputHashes, type RunInputs, type RunResults } from "@/lib/runs/types";

/** Progress 0..1 of a stage at a fraction of its own work. */
export function progressOf(stage: string, fraction: number): number {
  const i = RUN_STAGES.findIndex((s) => s.key === stage);
  if (i < 0) return 0;
  const start = i === 0 ? 0 : RUN_STAGES[i - 1].endsAt;
  const end = RUN_STAGES[i].endsAt;
  return start + (end - start) * Math.min(1, Math.max(0, fraction));
}

const running = new Set<string>();

export interface ExecuteOptions {
  /** leave out the factors short of the method's minimum history (as asked at the start) */
  excludeShortHistory?: boolean;
  /** extend the job's lease; false when it was lost (the run is then interrupted: stop) */
  heartbeat?: () => Promise<boolean>;
  signal?: AbortSignal;
  /** how to compute: computeRun here (the default), or in a thread of its own (the job worker: computeInThread) */
  compute?: (inputs: RunInputs, context: ComputeContext, onProgress?: RunProgress, signal?: AbortSignal) => Promise<RunResults>;
}

/** How often a progress report also extends the job's lease (the worker's own timer cannot fire during a long step). */
const LEASE_EXTEND_MS = 2000;

/** The person who started the run, as the gate would build their actor in the run's firm. */
async function starterOf(db: Database, run: { startedBy: string; firmId: string }): Promise<Actor> {
  const [row] = await db
    .select({ user: users, firm: firms, roles: memberships.roles })
    .from(firms)
    .leftJoin(users, eq(users.id, run.startedBy))
    .leftJoin(memberships, and(eq(memberships.userId, run.startedBy), eq(memberships.firmId, run.firmId)))
    .where(eq(firms.id, run.firmId));
  if (!row) throw new Error("the run's firm is not stored");
  return {
    userId: run.startedBy,
    name: row.user?.name ?? "",
    email: row.user?.email ?? "",
    firmId: row.firm.id,
    firmName: row.firm.name,
    reportingCurrency: row.firm.reportingCurrency,
    roles: row.roles ? parseRoles(row.roles) : [],
    firms: [{ id: row.firm.id, name: row.firm.name }],
  };
}

/** Run a queued run to completion or failure. Never throws: the outcome is stored on the run. */
export async function executeRun(runId: string, options: ExecuteOptions = {}): Promise<"completed" | "failed" | "skipped"> {
  if (running.has(runId)) return "skipped";
  running.add(runId);
  const db = getDb();
  try {
    const [run] = await db.select().from(runs).where(eq(runs.id, runId));
    // "running": a run given back by a worker that stopped gracefully starts again from its stored inputs
    if (!run || (run.status !== "queued" && run.status !== "running")) return "skipped";
    const actor = await starterOf(db, run);
    const where = and(eq(runs.id, runId), eq(runs.firmId, run.firmId));
    const active = and(where, inArray(runs.status, ["queued", "running"]));
    let lastStage = "";
    let lastProgress = -1;
    let lastLease = Date.now();
    const keepLease = async (force = false) => {
      if (options.signal?.aborted) throw new Error("the worker stopped computing it");
      if (!options.heartbeat || (!force && Date.now() - lastLease < LEASE_EXTEND_MS)) return;
      lastLease = Date.now();
      if (!(await options.heartbeat())) throw new Error("the worker lost the run's lease (it was taken as interrupted)");
    };
    const report = async (stage: string, fraction: number) => {
      await keepLease();
      const progress = progressOf(stage, fraction);
      if (stage === lastStage && progress - lastProgress < 0.02 && fraction < 1) return;
      lastStage = stage;
      lastProgress = progress;
      await db.update(runs).set({ status: "running", stage, progress, heartbeatAt: new Date().toISOString() }).where(active);
    };
    try {
      await report("inputs", 0);
      const [stored] = await db.select({ data: runInputs.data }).from(runInputs).where(and(eq(runInputs.runId, runId), eq(runInputs.firmId, run.firmId)));
      let inputs: RunInputs;
      let hashes: RunInputHashes;
      if (stored) {
        inputs = unpackInputs(stored.data);
        hashes = inputHashesOf(inputs);
        const recorded = run.inputHashes;
        if (recorded && recorded.combined !== hashes.combined) throw new Error("the stored inputs no longer match the hashes recorded when the run started");
      } else {
        // gathered here, not in the request: positions, closes, data quality; refused like a start would be
        // what the person asked at the start travels in the run's job
        const job = options.excludeShortHistory === undefined ? await jobByKey(db, runJobKey(runId)) : undefined;
        const excludeShortHistory = options.excludeShortHistory ?? Boolean(job && readPayload(job, runPayloadSchema).excludeShortHistory);
        inputs = await gatherRunInputs(actor, run, { excludeShortHistory });
        await keepLease(true);
        hashes = inputHashesOf(inputs);
        const packed = await packInputs(inputs);
        await keepLease(true);
        const kept = await db.transaction(async (tx) => {
          const rows = await tx.update(runs).set({ inputHashes: hashes }).where(active).returning({ id: runs.id });
          if (rows.length === 0) return false;
          await tx.insert(runInputs).values({ runId, firmId: run.firmId, data: packed.data, bytes: packed.bytes });
          return true;
        });
        if (!kept) throw new Error("the run was finished meanwhile (interrupted)");
        // compute from exactly what was stored (its canonical JSON read back), as a reproduction or the CLI would
        inputs = JSON.parse(packed.json) as RunInputs;
        await report("inputs", 1);
      }
      let results: RunResults = await (options.compute ?? computeRun)(inputs, { fromStoredInputsOf: run.reproducesRunId }, report, options.signal);
      await keepLease(true);
      await report("storing", 0);
      results = asStored(results);
      if (run.reproducesRunId) {
        const [original] = await db.select().from(runs).where(and(eq(runs.id, run.reproducesRunId), eq(runs.firmId, run.firmId)));
        if (original?.results) {
          const originalResults = await withStoredDetail(db, run.firmId, original.id, original.results);
          // the data-quality report belongs to the original's start; a reproduction reads no live data
          results = { ...results, dataQuality: originalResults.dataQuality };
          results.reproduction = compareRuns(
            { id: original.id, results: originalResults, inputHashes: original.inputHashes, engineVersion: original.engineVersion },
            { results, inputHashes: hashes, engineVersion: ENGINE_VERSION },
          );
        }
      }
      // the figures in the run's row, the per-position detail apart (the run's page and lists read only the figures)
      const { figures, detail } = splitDetail(results);
      const packedDetail = await packDetail(detail);
      // Every long step of storing extends the lease as it ends: the worker's timer cannot beat during a synchronous one.
      await keepLease(true);
      const finishedAt = now().toISOString();
      await db.transaction(async (tx) => {
        const completed = await tx
          .update(runs)
          .set({ status: "completed", stage: "done", progress: 1, results: figures, engineVersion: ENGINE_VERSION, finishedAt, heartbeatAt: finishedAt })
          .where(active)
          .returning({ id: runs.id });
        if (completed.length === 0) throw new Error("the run was finished meanwhile (interrupted)");
        await tx.insert(runDetails).values({ runId, firmId: run.firmId, data: packedDetail.data, bytes: packedDetail.bytes });
        const r = results.reproduction;
        await recordAudit(tx, actor, {
          action: "run.complete",
          entityType: "run",
          entityId: runId,
          summary: r
            ? `Reproduction finished: ${r.matches ? `all ${r.compared} figures match the original` : `${r.differences.length}${r.truncated ? "+" : ""} figure(s) differ from the original`}`
            : `Run finished for the period ending ${inputs.periodEnd} (engine ${ENGINE_VERSION})`,
          detail: { engineVersion: ENGINE_VERSION, inputHashes: hashes, ...(r ? { reproduces: r.originalRunId, matches: r.matches } : {}) },
        });
      });
      return "completed";
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      const finishedAt = now().toISOString();
      try {
        await db.transaction(async (tx) => {
          const failed = await tx.update(runs).set({ status: "failed", stage: "failed", error: `The run failed: ${message}`, finishedAt, heartbeatAt: finishedAt }).where(active).returning({ id: runs.id });
          if (failed.length === 0) throw new Error("the run was already finished");
          await recordAudit(tx, actor, { action: "run.fail", entityType: "run", entityId: runId, summary: `Run failed: ${message.slice(0, 200)}`, detail: { error: message } });
        });
      } catch (storeError) {
        // the run was already finished (e.g. marked interrupted meanwhile): its stored state stands
        console.error(`run ${runId}: could not store its failure`, storeError);
      }
      return "failed";
    }
  } finally {
    running.delete(runId);
  }
}
