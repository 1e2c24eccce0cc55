/** Assembling a filing's content from the marked run, and rebuilding it when the draft changes. */
import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { filings, methodStatements, signatures } from "@/db/schema";
import { AppError } from "@/lib/errors";
import type { Actor } from "@/lib/auth/actor";
import type { RunRecord } from "@/lib/runs/types";
import { correlationFromRunInputs, filingInputFromRun } from "@/reports/run-adapter";
import { storedCorrelationOf } from "@/lib/runs/stored-state";
import { buildFilingViewModel, contentHash, type CorrelationView, type FilingStatus, type FilingViewModel, type SupersededSignature } from "@/reports/view-model";
import { filingRunOf, getRun, getRunInputs } from "../runs";
import { assertRunFresh } from "../run-freshness";
import { FilingRow, PeriodRow, AssembleArgs } from "./types";
import { findPeriod, firmOf } from "./read";
import { userNames } from "../people";
import { changesSinceLast } from "./narrative";

/** Runs never change, so the correlation recomputed from a run's stored inputs is kept for the few runs last used. */
const correlationCache = new Map<string, Promise<CorrelationView | null>>();

/**
 * The correlation behind the run's parametric figures: the one the run stored; runs stored before the engine returned
 * it are recomputed from their stored inputs (null when that fails).
 */
function correlationOf(actor: Actor, run: RunRecord): Promise<CorrelationView | null> {
  const stored = run.results ? storedCorrelationOf(run.results) : null;
  if (stored) return Promise.resolve(stored);
  const key = `${actor.firmId}:${run.id}`;
  let hit = correlationCache.get(key);
  if (!hit) {
    hit = getRunInputs(actor, run.id)
      .then((inputs) => correlationFromRunInputs(inputs))
      .catch((error: unknown) => {
        console.error("[ballast] filing: the correlation could not be recomputed from the run's stored inputs", error);
        return null;
      });
    correlationCache.set(key, hit);
    while (correlationCache.size > 6) correlationCache.delete(correlationCache.keys().next().value!);
  }
  return hit;
}


export async function assemble(actor: Actor, args: AssembleArgs): Promise<FilingViewModel> {
  const { run } = args;
  const results = run.results;
  if (run.status !== "completed" || !results) throw new AppError("conflict:filing_run", "The period's filing run has not completed, so there are no figures to file yet.");
  const db = getDb();
  const [firm, method, people, correlation] = await Promise.all([
    firmOf(actor),
    db
      .select({ rationale: methodStatements.rationale, limitations: methodStatements.limitations })
      .from(methodStatements)
      .where(and(eq(methodStatements.id, results.method.id), eq(methodStatements.firmId, actor.firmId)))
      .then((rows) => rows[0] ?? null),
    userNames([args.preparedBy, args.submittedBy]),
    correlationOf(actor, run),
  ]);
  const exceptionDates = new Set(results.monthEnd.backtest.exceptionList.map((e) => e.date));
  const explanations = Object.fromEntries(Object.entries(args.explanations).filter(([d, t]) => exceptionDates.has(d) && t.trim() !== ""));
  const filing = {
    version: args.version,
    previousVersion: args.previous?.version ?? null,
    status: args.status,
    preparedBy: people.get(args.preparedBy) ?? "",
    submittedBy: args.submittedBy ? (people.get(args.submittedBy) ?? "") : null,
    coverNote: args.coverNote,
    reason: args.reason,
    changesSinceLast: [] as string[],
    exceptionExplanations: explanations,
  };
  const input = () =>
    filingInputFromRun({
      run,
      method: { rationale: method?.rationale ?? "", limitations: method?.limitations ?? [] },
      firm: { name: firm.name, reportingCurrency: firm.reportingCurrency, regulatorName: firm.regulatorName, licenceLabel: firm.licenceLabel },
      period: { end: args.period.periodEnd, deadline: args.period.deadline },
      filing,
      correlation,
      signature: null,
      supersededSignatures: args.supersededSignatures,
    });
  let vm: FilingViewModel;
  try {
    vm = buildFilingViewModel(input());
    filing.changesSinceLast = await changesSinceLast(actor, args, vm);
    vm = buildFilingViewModel(input());
  } catch (error) {
    if (error instanceof AppError) throw error;
    throw new AppError("unprocessable:filing_content", `The draft filing cannot be assembled from this run: ${error instanceof Error ? error.message : String(error)}`);
  }
  // exactly what is stored: a JSON round trip, and the canonical form must exist
  const stored = JSON.parse(JSON.stringify(vm)) as FilingViewModel;
  contentHash(stored);
  return stored;
}

export function explanationsOf(vm: FilingViewModel): Record<string, string> {
  return Object.fromEntries(vm.filing.exceptionExplanations.map((e) => [e.date, e.text]));
}

/** The period's marked filing run, completed, or a clear refusal. */
export async function markedCompletedRun(actor: Actor, period: PeriodRow): Promise<RunRecord> {
  const marked = await filingRunOf(actor, period.id);
  if (!marked) {
    throw new AppError(
      "conflict:filing_run",
      `The period ending ${period.periodEnd} has no run marked for its filing. The risk analyst completes a run and chooses "use for the filing" on it first.`,
    );
  }
  const run = marked.results ? marked : await getRun(actor, marked.id);
  if (run.status !== "completed" || !run.results) {
    throw new AppError("conflict:filing_run", `The run marked for the filing of the period ending ${period.periodEnd} has not completed (it is ${run.status}); a draft filing is assembled from a completed run only.`);
  }
  await assertRunFresh(actor, run.id, "be assembled into the draft filing");
  return run;
}

async function previousOf(actor: Actor, row: FilingRow): Promise<AssembleArgs["previous"]> {
  if (!row.previousId) return null;
  const [prev] = await getDb()
    .select()
    .from(filings)
    .where(and(eq(filings.id, row.previousId), eq(filings.firmId, actor.firmId)));
  return prev ? { version: prev.version, content: prev.content, runId: prev.runId, coverNote: prev.coverNote } : null;
}

export async function supersededOf(actor: Actor, periodId: string): Promise<SupersededSignature[]> {
  const rows = await getDb()
    .select({ s: signatures, version: filings.version })
    .from(signatures)
    .innerJoin(filings, and(eq(filings.id, signatures.filingId), eq(filings.firmId, actor.firmId)))
    .where(and(eq(signatures.firmId, actor.firmId), eq(filings.periodId, periodId)))
    .orderBy(signatures.signedAt);
  return rows
    .filter((r) => r.s.supersededAt !== null)
    .map((r) => ({ version: r.version, signerName: r.s.signerName, licenceReference: r.s.licenceReference, signedAt: r.s.signedAt, contentHash: r.s.contentHash, supersededAt: r.s.supersededAt!, reason: r.s.supersededReason ?? "" }));
}

/** Rebuild an editable version's content from its run with changed fields. */
export async function rebuild(actor: Actor, row: FilingRow, changes: { run?: RunRecord; coverNote?: string; explanations?: Record<string, string>; status?: FilingStatus; submittedBy?: string | null }) {
  const period = await findPeriod(actor, row.periodId);
  const run = changes.run ?? (await getRun(actor, row.runId));
  const current = row.content;
  return assemble(actor, {
    period,
    run,
    version: row.version,
    previous: await previousOf(actor, row),
    status: changes.status ?? (row.status as FilingStatus),
    preparedBy: row.preparedBy,
    submittedBy: changes.submittedBy !== undefined ? changes.submittedBy : row.submittedBy,
    coverNote: changes.coverNote ?? row.coverNote,
    reason: row.reason,
    explanations: changes.explanations ?? explanationsOf(current),
    supersededSignatures: await supersededOf(actor, row.periodId),
  });
}

export function lockedMessage(row: FilingRow): string {
  if (row.status === "superseded") return `Version ${row.version} was signed and has been superseded by a later version; it cannot be changed.`;
  if (row.status === "filed") return `Version ${row.version} was signed and filed (reference ${row.filingReference}); it cannot be changed.`;
  return `Version ${row.version} is signed and locked. A change makes a new version: start version ${row.version + 1} with the reason for the change.`;
}

/** A conditional update that lost a race (the status moved underneath it). */
export function raced(): AppError {
  return new AppError("conflict:filing", "The filing changed while this was being saved; reload the page and try again.");
}

/** Set fields of this firm's filing `id` in the transaction only while its status is still `status`; otherwise it changed meanwhile (raced). */
export async function updateFilingWhile(tx: Tx, actor: Actor, id: string, status: string, values: Partial<typeof filings.$inferInsert>): Promise<void> {
  const updated = await tx
    .update(filings)
    .set(values)
    .where(and(eq(filings.id, id), eq(filings.firmId, actor.firmId), eq(filings.status, status)))
    .returning({ id: filings.id });
  if (!updated.length) throw raced();
}
