/**
 * Execute a queued run on the server, after its request has been answered: read its stored inputs, compute,
 * record stage and percentage as it goes (with a heartbeat), then store the results and its completion in one
 * transaction with the audit record. A failure is stored with its reason; earlier runs are never touched.
 */
import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { runInputs, runs, users } from "@/db/schema";
import { recordAudit } from "@/lib/audit/record";
import { now } from "@/lib/clock";
import { ENGINE_VERSION } from "@/lib/risk/version";
import { unpackInputs } from "@/lib/data/runs";
import { inputHashesOf, compareRuns, asStored } from "./compare";
import { computeRun } from "./compute";
import { RUN_STAGES, type RunInputHashes, type RunResults } from "./types";

/** Progress 0..1 of a stage at a fraction of its own work. */
export function progressOf(stage: string, fraction: number): number {
  const i = RUN_STAGES.findIndex((s) => s.key === stage);
  if (i < 0) return 0;
  const start = i === 0 ? 0 : RUN_STAGES[i - 1].endsAt;
  const end = RUN_STAGES[i].endsAt;
  return start + (end - start) * Math.min(1, Math.max(0, fraction));
}

const running = new Set<string>();

/** Run a queued run to completion or failure. Never throws: the outcome is stored on the run. */
export async function executeRun(runId: string): Promise<"completed" | "failed" | "skipped"> {
  if (running.has(runId)) return "skipped";
  running.add(runId);
  const db = getDb();
  try {
    const [run] = await db.select().from(runs).where(eq(runs.id, runId));
    if (!run || run.status !== "queued") return "skipped";
    const [person] = await db.select({ name: users.name }).from(users).where(eq(users.id, run.startedBy));
    const actor = { userId: run.startedBy, name: person?.name ?? "", firmId: run.firmId };
    const where = and(eq(runs.id, runId), eq(runs.firmId, run.firmId));
    let lastStage = "";
    let lastProgress = -1;
    const report = async (stage: string, fraction: number) => {
      const progress = progressOf(stage, fraction);
      if (stage === lastStage && progress - lastProgress < 0.02 && fraction < 1) return;
      lastStage = stage;
      lastProgress = progress;
      await db.update(runs).set({ status: "running", stage, progress, heartbeatAt: new Date().toISOString() }).where(where);
    };
    try {
      await report("inputs", 0);
      const [stored] = await db.select({ data: runInputs.data }).from(runInputs).where(and(eq(runInputs.runId, runId), eq(runInputs.firmId, run.firmId)));
      if (!stored) throw new Error("the run's stored inputs are missing");
      const inputs = unpackInputs(stored.data);
      const hashes = inputHashesOf(inputs);
      const recorded = run.inputHashes as unknown as RunInputHashes | null;
      if (recorded && recorded.combined !== hashes.combined) throw new Error("the stored inputs no longer match the hashes recorded when the run started");
      let results: RunResults = await computeRun(inputs, { fromStoredInputsOf: run.reproducesRunId }, report);
      await report("storing", 0);
      results = asStored(results);
      if (run.reproducesRunId) {
        const [original] = await db.select().from(runs).where(and(eq(runs.id, run.reproducesRunId), eq(runs.firmId, run.firmId)));
        if (original?.results) {
          const originalResults = original.results as unknown as RunResults;
          // the data-quality report belongs to the original's start; a reproduction reads no live data
          results = { ...results, dataQuality: originalResults.dataQuality };
          results.reproduction = compareRuns(
            { id: original.id, results: originalResults, inputHashes: original.inputHashes as unknown as RunInputHashes | null, engineVersion: original.engineVersion },
            { results, inputHashes: hashes, engineVersion: ENGINE_VERSION },
          );
        }
      }
      const finishedAt = now().toISOString();
      await db.transaction(async (tx) => {
        await tx
          .update(runs)
          .set({ status: "completed", stage: "done", progress: 1, results: results as unknown as Record<string, unknown>, engineVersion: ENGINE_VERSION, finishedAt, heartbeatAt: finishedAt })
          .where(where);
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
          await tx.update(runs).set({ status: "failed", stage: "failed", error: `The run failed: ${message}`, finishedAt, heartbeatAt: finishedAt }).where(where);
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
