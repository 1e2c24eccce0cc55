/**
 * Runs of a reporting period: reading them (firm-scoped), the one the filing uses. Starting, executing and
 * reproducing runs live in lib/runs/ (start.ts, execute.ts, reproduce.ts) and are re-exported here.
 */
import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { methodStatements, runs, users } from "@/db/schema";
import { AppError } from "@/lib/errors";
import type { Actor } from "@/lib/auth/actor";
import type { RunInputHashes, RunListItem, RunRecord, RunResults, RunStatus } from "@/lib/runs/types";
import { markIfInterrupted } from "@/lib/runs/staleness";

type RunRow = typeof runs.$inferSelect;

const selection = {
  run: runs,
  startedByName: users.name,
  methodVersion: methodStatements.version,
};

function toRecord(row: { run: RunRow; startedByName: string | null; methodVersion: number | null }): RunRecord {
  const r = row.run;
  return {
    id: r.id,
    periodId: r.periodId,
    status: r.status as RunStatus,
    stage: r.stage,
    progress: r.progress,
    inputHashes: (r.inputHashes as unknown as RunInputHashes | null) ?? null,
    engineVersion: r.engineVersion,
    results: (r.results as unknown as RunResults | null) ?? null,
    error: r.error,
    isFilingRun: r.isFilingRun,
    reproducesRunId: r.reproducesRunId,
    startedBy: r.startedBy,
    startedByName: row.startedByName ?? "",
    startedAt: r.startedAt,
    finishedAt: r.finishedAt,
    methodVersion: row.methodVersion === null ? null : { id: r.methodStatementId, version: row.methodVersion },
  };
}

function headlineOf(results: RunResults | null): RunListItem["headline"] {
  if (!results) return null;
  const m = results.monthEnd;
  const primary = m.methods.find((x) => x.method === m.primaryMethod) ?? m.methods[0];
  const c = primary.byConfidence.find((x) => x.confidence === m.capital.profile.confidence) ?? primary.byConfidence[0];
  return { var1d: c.oneDay.var, var10d: c.tenDay.var, es10d: c.tenDay.es, confidence: c.confidence, capital: m.capital.capital, zone: m.backtest.zone };
}

async function selectRuns(firmId: string, where: ReturnType<typeof and>) {
  return getDb()
    .select(selection)
    .from(runs)
    .leftJoin(users, eq(users.id, runs.startedBy))
    .leftJoin(methodStatements, and(eq(methodStatements.id, runs.methodStatementId), eq(methodStatements.firmId, firmId)))
    .where(where)
    .orderBy(desc(runs.startedAt), desc(runs.id));
}

/** One run of the actor's firm; another firm's run looks absent. A run left running by a dead server is marked failed first. */
export async function getRun(actor: Actor, runId: string): Promise<RunRecord> {
  await markIfInterrupted(actor.firmId, { runId });
  const [row] = await selectRuns(actor.firmId, and(eq(runs.id, runId), eq(runs.firmId, actor.firmId)));
  if (!row) throw new AppError("not_found:run", "No such run.");
  return toRecord(row);
}

/** Every run of a period, newest first, without the stored results (the headline figures instead). */
export async function listRuns(actor: Actor, periodId: string): Promise<RunListItem[]> {
  await markIfInterrupted(actor.firmId, { periodId });
  const rows = await selectRuns(actor.firmId, and(eq(runs.firmId, actor.firmId), eq(runs.periodId, periodId)));
  return rows.map((row) => {
    const record = toRecord(row);
    const { results, ...rest } = record;
    return { ...rest, headline: headlineOf(results) };
  });
}

/** The run marked as the one the period's filing uses, or null. */
export async function filingRunOf(actor: Actor, periodId: string): Promise<RunRecord | null> {
  const [row] = await selectRuns(actor.firmId, and(eq(runs.firmId, actor.firmId), eq(runs.periodId, periodId), eq(runs.isFilingRun, true)));
  return row ? toRecord(row) : null;
}
