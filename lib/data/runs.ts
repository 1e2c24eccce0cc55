/**
 * Runs of a reporting period: starting one (its inputs gathered and stored with their hashes, refused clearly when
 * something is missing), reading them (firm-scoped), reproducing one from its stored inputs, and marking the one
 * the filing uses. The computation itself runs in lib/runs/execute.ts, after the request has been answered.
 */
import "server-only";
import { createHash } from "node:crypto";
import { gunzipSync, gzipSync } from "node:zlib";
import { and, desc, eq, inArray, lt } from "drizzle-orm";
import { getDb } from "@/db/client";
import { capitalRuleProfiles, methodStatements, positions, reportingPeriods, runInputs, runs, users } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import { now, today } from "@/lib/clock";
import type { Actor } from "@/lib/auth/actor";
import { BASEL_CAPITAL_PROFILE } from "@/lib/risk/capital/capital";
import { explainRuns, explainVarChange } from "@/lib/risk";
import { storedPortfolioStateOf } from "@/lib/runs/stored-state";
import { infeasibilityMessage, methodInfeasibilities, type Infeasibility } from "@/lib/runs/feasibility";
import { runInputsExport, runInputsFileName } from "@/lib/runs/export";
import { methodContentSchema, type MethodContent } from "@/lib/validation/method";
import { alignReturns } from "@/lib/runs/align";
import { regimeFieldsOf, storedAttributesOf } from "@/lib/runs/standardised";
import { canonicalJson } from "@/lib/domain/canonical";
import { inputHashesOf } from "@/lib/runs/compare";
import { assessHistory, engineInputOf, neededFactors } from "@/lib/runs/compute";
import { capitalProfileOf } from "@/lib/runs/method-map";
import { markIfInterrupted } from "@/lib/runs/staleness";
import type { RunChange, RunInputHashes, RunInputs, RunListItem, RunRecord, RunResults, RunStatus, StoredPosition } from "@/lib/runs/types";
import { confirmedPositionsUpload, getDataQuality } from "./data-quality";
import { getPeriod } from "./periods";
import { priceSeries } from "./prices";
import { assertRunFresh, periodRunFreshness } from "./run-freshness";

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

/** Every run of a period, newest first, without the stored results (the headline figures instead), each with its freshness. */
export async function listRuns(actor: Actor, periodId: string): Promise<RunListItem[]> {
  await getPeriod(actor, periodId);
  await markIfInterrupted(actor.firmId, { periodId });
  const rows = await selectRuns(actor.firmId, and(eq(runs.firmId, actor.firmId), eq(runs.periodId, periodId)));
  const freshness = await periodRunFreshness(actor, periodId);
  return rows.map((row) => {
    const { results, ...rest } = toRecord(row);
    return { ...rest, headline: headlineOf(results), freshness: freshness.get(row.run.id) ?? null };
  });
}

/** The run marked as the one the period's filing uses, or null. */
export async function filingRunOf(actor: Actor, periodId: string): Promise<RunRecord | null> {
  const [row] = await selectRuns(actor.firmId, and(eq(runs.firmId, actor.firmId), eq(runs.periodId, periodId), eq(runs.isFilingRun, true)));
  return row ? toRecord(row) : null;
}

// ---------------------------------------------------------------------------------------------------------------
// stored inputs

/** Compress the canonical JSON of a run's inputs. */
export function packInputs(inputs: RunInputs): { data: Buffer; bytes: number } {
  const json = canonicalJson(inputs);
  return { data: gzipSync(Buffer.from(json, "utf8"), { level: 9 }), bytes: Buffer.byteLength(json, "utf8") };
}

export function unpackInputs(data: Buffer | Uint8Array | ArrayBuffer): RunInputs {
  const buffer = Buffer.isBuffer(data) ? data : data instanceof ArrayBuffer ? Buffer.from(new Uint8Array(data)) : Buffer.from(data);
  return JSON.parse(gunzipSync(buffer).toString("utf8")) as RunInputs;
}

/** The stored inputs of a run of the actor's firm. */
export async function getRunInputs(actor: Actor, runId: string): Promise<RunInputs> {
  const [row] = await getDb()
    .select({ data: runInputs.data })
    .from(runInputs)
    .where(and(eq(runInputs.runId, runId), eq(runInputs.firmId, actor.firmId)));
  if (!row) throw new AppError("not_found:run", "No stored inputs for this run.");
  return unpackInputs(row.data);
}

/** A run's stored inputs as one JSON download, recorded in the audit trail with its SHA-256. */
export async function exportRunInputs(actor: Actor, runId: string): Promise<{ fileName: string; contentType: string; bytes: Uint8Array }> {
  const run = await getRun(actor, runId);
  const inputs = await getRunInputs(actor, runId);
  const fileName = runInputsFileName(inputs.periodEnd, run.id);
  const bytes = new Uint8Array(Buffer.from(JSON.stringify(runInputsExport(run, inputs), null, 1), "utf8"));
  await getDb().transaction(async (tx) => {
    await recordAudit(tx, actor, {
      action: "run.export_inputs",
      entityType: "run",
      entityId: run.id,
      summary: `Exported the stored inputs of the run for the period ending ${inputs.periodEnd} (${fileName})`,
      detail: { fileName, bytes: bytes.byteLength, sha256: createHash("sha256").update(bytes).digest("hex"), inputHashes: run.inputHashes },
    });
  });
  return { fileName, contentType: "application/json", bytes };
}

// ---------------------------------------------------------------------------------------------------------------
// starting a run

function isUniqueViolation(error: unknown, index: string): boolean {
  for (let e: unknown = error; e; e = (e as { cause?: unknown }).cause) {
    const message = e instanceof Error ? e.message : String(e);
    if (message.includes("UNIQUE constraint failed") && (message.includes(index) || message.includes("runs.firm_id, runs.period_id"))) return true;
    if (!(e instanceof Error)) break;
  }
  return false;
}

async function activeRunConflict(firmId: string, periodId: string): Promise<AppError> {
  const [active] = await selectRuns(firmId, and(eq(runs.firmId, firmId), eq(runs.periodId, periodId), inArray(runs.status, ["queued", "running"])));
  const who = active ? ` (started by ${active.startedByName ?? "someone"} at ${active.run.startedAt.slice(11, 16)} UTC, ${Math.round(active.run.progress * 100)} % done)` : "";
  return new AppError("conflict:run", `A run for this period is already in progress${who}. Wait for it to finish; only one run at a time per period.`);
}

/** Refuse changes to a period that is signed or filed. */
function assertOpen(period: { state: string; periodEnd: string }) {
  if (period.state === "signed" || period.state === "filed") {
    throw new AppError("conflict:period", `The period ending ${period.periodEnd} is ${period.state}; its runs can be read but no longer started or changed.`);
  }
}

/** Closes of the factors a book needs, as of the period end, on the union of their dates. */
async function closesOf(actor: Actor, stored: readonly StoredPosition[], periodEnd: string): Promise<RunInputs["prices"]> {
  const series = await priceSeries(actor.firmId, periodEnd);
  const needed = neededFactors(stored, actor.reportingCurrency);
  const present = [...needed.keys()].filter((id) => series.has(id)).sort();
  const dateSet = new Set<string>();
  for (const id of present) for (const d of series.get(id)!.dates) dateSet.add(d);
  const dates = [...dateSet].sort();
  const index = new Map(dates.map((d, i) => [d, i]));
  const factors: RunInputs["prices"]["factors"] = {};
  for (const id of present) {
    const s = series.get(id)!;
    const closes: (number | null)[] = new Array(dates.length).fill(null);
    s.dates.forEach((d, i) => (closes[index.get(d)!] = s.closes[i]));
    const meta = needed.get(id)!;
    factors[id] = { assetClass: meta.assetClass, currency: meta.currency, closes };
  }
  return { dates, factors };
}

/** A confirmed upload's positions as a run stores them (row order, with their standardised attributes where given). */
async function storedPositionsOf(actor: Actor, uploadId: string): Promise<StoredPosition[]> {
  const rows = await getDb()
    .select()
    .from(positions)
    .where(and(eq(positions.firmId, actor.firmId), eq(positions.uploadId, uploadId)))
    .orderBy(positions.rowNumber);
  return rows.map((r) => ({
    row: r.rowNumber,
    book: r.book,
    instrument: r.instrumentCode,
    name: r.instrumentName,
    assetClass: r.assetClass,
    currency: r.currency,
    quantity: r.quantity,
    price: r.price,
    marketValue: r.marketValue,
    deltaExposure: r.deltaExposure,
    asOf: r.asOf,
    ...storedAttributesOf(r),
  }));
}

/**
 * The firm's latest book as a run would read it under a content: the newest period with confirmed positions (or the
 * given period), its positions, the closes of their factors up to the earlier of its end and today, the active
 * capital rule profile. Null when no period has confirmed positions.
 */
export async function latestBookInputs(actor: Actor, content: MethodContent, periodId?: string): Promise<{ periodId: string; periodEnd: string; inputs: RunInputs } | null> {
  const db = getDb();
  const periods = await db
    .select({ id: reportingPeriods.id, periodEnd: reportingPeriods.periodEnd })
    .from(reportingPeriods)
    .where(periodId ? and(eq(reportingPeriods.firmId, actor.firmId), eq(reportingPeriods.id, periodId)) : eq(reportingPeriods.firmId, actor.firmId))
    .orderBy(desc(reportingPeriods.periodEnd));
  for (const p of periods) {
    const upload = await confirmedPositionsUpload(actor, p.id);
    if (!upload) continue;
    const stored = await storedPositionsOf(actor, upload.id);
    const periodEnd = p.periodEnd < today() ? p.periodEnd : today();
    const prices = await closesOf(actor, stored, periodEnd);
    const [profileRow] = await db
      .select()
      .from(capitalRuleProfiles)
      .where(and(eq(capitalRuleProfiles.firmId, actor.firmId), eq(capitalRuleProfiles.active, true)))
      .orderBy(desc(capitalRuleProfiles.createdAt))
      .limit(1);
    const capitalProfile = profileRow
      ? capitalProfileOf(profileRow)
      : { id: null, name: "Engine default (no capital rule profile stored)", profile: BASEL_CAPITAL_PROFILE, plusFactors: { "5": 0.4, "6": 0.5, "7": 0.65, "8": 0.75, "9": 0.85, "10": 1 }, backtestDays: 250 };
    const inputs: RunInputs = {
      positions: stored,
      prices,
      method: { id: "", version: 0, approvedAt: null, content },
      capitalProfile,
      periodEnd,
      reportingCurrency: actor.reportingCurrency,
      context: { periodId: p.id, upload: { uploadId: upload.id, fileName: upload.fileName }, dataQuality: { report: { items: [], counts: { error: 0, warning: 0, info: 0 } }, items: 0, errors: 0, warnings: 0 } as unknown as RunInputs["context"]["dataQuality"] },
    };
    return { periodId: p.id, periodEnd, inputs };
  }
  return null;
}

/**
 * Whether a method statement's choices can be computed on the firm's latest book: the factors they cannot be
 * computed for, with the reason. Empty when the firm has no confirmed positions yet (the run start checks again).
 */
export async function methodCheckOnLatestBook(actor: Actor, content: MethodContent): Promise<{ periodEnd: string | null; items: Infeasibility[] }> {
  const book = await latestBookInputs(actor, content);
  if (!book) return { periodEnd: null, items: [] };
  return { periodEnd: book.periodEnd, items: methodInfeasibilities(book.inputs, content) };
}

/** Gather the inputs of a new run as they stand now, or refuse naming what is missing. */
async function gatherInputs(actor: Actor, periodId: string) {
  const period = await getPeriod(actor, periodId);
  assertOpen(period);
  const db = getDb();
  const upload = await confirmedPositionsUpload(actor, periodId);
  const [method] = await db
    .select()
    .from(methodStatements)
    .where(and(eq(methodStatements.firmId, actor.firmId), eq(methodStatements.status, "approved")))
    .orderBy(desc(methodStatements.version))
    .limit(1);
  const missing: string[] = [];
  if (!upload) missing.push("no positions are confirmed for this period (a compliance officer uploads and confirms them on the Data page)");
  if (!method) missing.push("no method statement is approved (the risk analyst approves one on the Method page)");
  if (!upload || !method) throw new AppError("unprocessable:run", `A run cannot start: ${missing.join("; and ")}.`, { run: missing.join("; ") });
  const parsed = methodContentSchema.safeParse(method.content);
  if (!parsed.success) throw new AppError("unprocessable:run", `The approved method statement (version ${method.version}) cannot be read: ${parsed.error.issues[0]?.message ?? "invalid content"}.`);

  const [profileRow] = await db
    .select()
    .from(capitalRuleProfiles)
    .where(and(eq(capitalRuleProfiles.firmId, actor.firmId), eq(capitalRuleProfiles.active, true)))
    .orderBy(desc(capitalRuleProfiles.createdAt))
    .limit(1);
  const capitalProfile = profileRow
    ? { ...capitalProfileOf(profileRow), ...regimeFieldsOf(profileRow) }
    : { id: null, name: "Engine default (no capital rule profile stored)", profile: BASEL_CAPITAL_PROFILE, plusFactors: { "5": 0.4, "6": 0.5, "7": 0.65, "8": 0.75, "9": 0.85, "10": 1 }, backtestDays: 250 };

  const stored = await storedPositionsOf(actor, upload.id);

  const { dates, factors } = await closesOf(actor, stored, period.periodEnd);

  const quality = await getDataQuality(actor, periodId);
  const inputs: RunInputs = {
    positions: stored,
    prices: { dates, factors },
    method: { id: method.id, version: method.version, approvedAt: method.approvedAt, content: parsed.data },
    capitalProfile,
    periodEnd: period.periodEnd,
    reportingCurrency: actor.reportingCurrency,
    context: {
      periodId,
      upload: { uploadId: upload.id, fileName: upload.fileName },
      dataQuality: { report: quality.report, items: quality.report.items.length, errors: quality.report.counts.error, warnings: quality.report.counts.warning },
    },
  };
  return { period, upload, method, inputs };
}

export interface StartOptions {
  /** run without the factors short of the method's minimum history (they are listed in the results) */
  excludeShortHistory?: boolean;
}

/** Insert a queued run with its stored inputs, in one transaction with its audit record. */
async function insertRun(
  actor: Actor,
  values: { periodId: string; methodStatementId: string; positionsUploadId: string; capitalProfileId: string | null; reproducesRunId: string | null },
  inputs: RunInputs,
  audit: { action: string; summary: string; detail: Record<string, unknown> },
): Promise<string> {
  const hashes = inputHashesOf(inputs);
  const packed = packInputs(inputs);
  const stamp = now().toISOString();
  try {
    return await getDb().transaction(async (tx) => {
      const [row] = await tx
        .insert(runs)
        .values({ firmId: actor.firmId, ...values, status: "queued", stage: "queued", progress: 0, inputHashes: hashes as unknown as Record<string, string>, startedBy: actor.userId, startedAt: stamp, heartbeatAt: new Date().toISOString() /* wall clock: staleness */ })
        .returning({ id: runs.id });
      await tx.insert(runInputs).values({ runId: row.id, firmId: actor.firmId, data: packed.data, bytes: packed.bytes });
      await recordAudit(tx, actor, { action: audit.action, entityType: "run", entityId: row.id, summary: audit.summary, detail: { ...audit.detail, inputHashes: hashes } });
      return row.id;
    });
  } catch (error) {
    if (isUniqueViolation(error, "runs_one_active_per_period")) throw await activeRunConflict(actor.firmId, values.periodId);
    throw error;
  }
}

/**
 * Start a run for a period: refuses without confirmed positions, without an approved method statement, or when a
 * factor lacks the method's minimum history (unless asked to run without those factors, which are then listed).
 * Returns the queued run; the caller executes it (lib/runs/execute.ts) after answering.
 */
export async function startRun(actor: Actor, periodId: string, options: StartOptions = {}): Promise<RunRecord> {
  await markIfInterrupted(actor.firmId, { periodId });
  const { period, upload, method, inputs } = await gatherInputs(actor, periodId);
  const assessment = assessHistory(inputs, alignReturns(inputs.prices));
  if (assessment.positionsUsable === 0) {
    throw new AppError("unprocessable:history", `A run cannot start: no position's price history reaches the method statement's minimum of ${assessment.minHistory} returns up to ${period.periodEnd}.`, { excludeShortHistory: "No position would be left." });
  }
  if (assessment.short.length && !options.excludeShortHistory) {
    const list = assessment.short.map((s) => `${s.factor} (${s.reason})`).join("; ");
    throw new AppError(
      "unprocessable:history",
      `${assessment.short.length} factor(s) lack the method statement's minimum history of ${assessment.minHistory} returns: ${list}. Start the run without them (the positions on them are left out and listed), or load their price history first.`,
      { excludeShortHistory: `Leaves out ${assessment.positionsAffected.length} position(s): ${assessment.positionsAffected.join(", ")}.` },
    );
  }
  // a choice that cannot be computed for a factor refuses the run, naming the asset class, the factor and why
  const infeasible = methodInfeasibilities(inputs, inputs.method.content);
  if (infeasible.length) {
    throw new AppError("unprocessable:method", infeasibilityMessage(infeasible, `A run cannot start with method statement version ${method.version}`), {
      method: infeasible.map((i) => `${i.factor}: ${i.reason}`).join("; "),
    });
  }
  const id = await insertRun(
    actor,
    { periodId, methodStatementId: method.id, positionsUploadId: upload.id, capitalProfileId: inputs.capitalProfile.id, reproducesRunId: null },
    inputs,
    {
      action: "run.start",
      summary: `Started a run for the period ending ${period.periodEnd} (method statement version ${method.version}${assessment.short.length ? `, without ${assessment.short.length} factor(s) short of history` : ""})`,
      detail: { periodEnd: period.periodEnd, methodVersion: method.version, positionsUploadId: upload.id, excludedFactors: assessment.short },
    },
  );
  return getRun(actor, id);
}

/** Re-run a completed run from its stored inputs (never today's data) as a new run pointing at it. */
export async function reproduceRun(actor: Actor, runId: string): Promise<RunRecord> {
  const original = await getRun(actor, runId);
  if (original.status !== "completed") throw new AppError("conflict:run", "Only a completed run can be reproduced.");
  const period = await getPeriod(actor, original.periodId);
  await markIfInterrupted(actor.firmId, { periodId: original.periodId });
  const [row] = await getDb().select().from(runs).where(and(eq(runs.id, runId), eq(runs.firmId, actor.firmId)));
  const inputs = await getRunInputs(actor, runId);
  const id = await insertRun(
    actor,
    { periodId: original.periodId, methodStatementId: row.methodStatementId, positionsUploadId: row.positionsUploadId, capitalProfileId: row.capitalProfileId, reproducesRunId: runId },
    inputs,
    {
      action: "run.reproduce",
      summary: `Started reproducing the run of ${original.startedAt.slice(0, 16).replace("T", " ")} UTC for the period ending ${period.periodEnd} from its stored inputs`,
      detail: { originalRunId: runId },
    },
  );
  return getRun(actor, id);
}

/** Mark a completed run as the one the period's filing uses (one per period), with its audit record. */
export async function useForFiling(actor: Actor, runId: string): Promise<RunRecord> {
  const run = await getRun(actor, runId);
  if (run.status !== "completed") throw new AppError("conflict:run", "Only a completed run can be the one the filing uses.");
  const period = await getPeriod(actor, run.periodId);
  assertOpen(period);
  if (run.isFilingRun) return run;
  await assertRunFresh(actor, runId, "be chosen for the filing");
  await getDb().transaction(async (tx) => {
    const previous = await tx
      .update(runs)
      .set({ isFilingRun: false })
      .where(and(eq(runs.firmId, actor.firmId), eq(runs.periodId, run.periodId), eq(runs.isFilingRun, true)))
      .returning({ id: runs.id });
    await tx.update(runs).set({ isFilingRun: true }).where(and(eq(runs.id, runId), eq(runs.firmId, actor.firmId)));
    await recordAudit(tx, actor, {
      action: "run.use_for_filing",
      entityType: "run",
      entityId: runId,
      summary: `Chose the run of ${run.startedAt.slice(0, 16).replace("T", " ")} UTC for the filing of the period ending ${period.periodEnd}`,
      detail: { previousFilingRunId: previous[0]?.id ?? null, inputHashes: run.inputHashes },
    });
  });
  return getRun(actor, runId);
}

// ---------------------------------------------------------------------------------------------------------------
// change since last period

/** The explain of this run's one-day parametric VaR against the previous period's filing run. */
export async function runChange(actor: Actor, runId: string): Promise<RunChange> {
  const run = await getRun(actor, runId);
  if (run.status !== "completed" || !run.results) return { previous: null, explanation: null, note: "The run has not completed." };
  const period = await getPeriod(actor, run.periodId);
  const earlier = await getDb()
    .select({ id: reportingPeriods.id, periodEnd: reportingPeriods.periodEnd })
    .from(reportingPeriods)
    .where(and(eq(reportingPeriods.firmId, actor.firmId), lt(reportingPeriods.periodEnd, period.periodEnd)))
    .orderBy(desc(reportingPeriods.periodEnd));
  for (const p of earlier) {
    const filing = await filingRunOf(actor, p.id);
    if (!filing) continue;
    const confidence = run.results.capitalProfile.profile.confidence;
    // the stored state of both runs (nothing recomputed); runs stored before the engine returned it are recomputed
    const mineState = storedPortfolioStateOf(run.results);
    const theirState = filing.results ? storedPortfolioStateOf(filing.results) : null;
    let explanation: RunChange["explanation"];
    if (mineState && theirState) {
      const method = run.results.engineMethod;
      explanation = explainVarChange(theirState, mineState, confidence, { distribution: method.distribution, nu: method.nu });
    } else {
      const [mine, theirs] = await Promise.all([getRunInputs(actor, runId), getRunInputs(actor, filing.id)]);
      explanation = explainRuns(engineInputOf(theirs), engineInputOf(mine), confidence);
    }
    return { previous: { runId: filing.id, periodId: p.id, periodEnd: p.periodEnd }, explanation, note: null };
  }
  return {
    previous: null,
    explanation: null,
    note: earlier.length === 0 ? "This is the firm's first reporting period in Ballast: there is no earlier period to compare with." : "No earlier period has a run chosen for its filing, so there is nothing to compare with.",
  };
}
