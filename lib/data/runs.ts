/**
 * Runs of a reporting period: starting one (refused clearly when something is missing, without reading the book;
 * queued with its job in one transaction), reading them (firm-scoped), reproducing one from its stored inputs, and
 * marking the one the filing uses. A worker process (`npm run worker`, job kind "run") gathers the inputs, stores
 * them with their hashes and computes the run (lib/data/run-execution.ts).
 */
import "server-only";
import { approvedMethodRow } from "@/lib/data/approved-method";
import { createHash } from "node:crypto";
import { promisify } from "node:util";
import { gunzipSync, gzip } from "node:zlib";
import { and, desc, eq, inArray, lt, ne, sql } from "drizzle-orm";
import { getDb, isDatabaseBusy, type Database, type Tx } from "@/db/client";
import { capitalRuleProfiles, historyChecks, methodStatements, positions, reportingPeriods, runDetails, runInputs, runs, uploads, users } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import { now, today } from "@/lib/clock";
import type { Actor } from "@/lib/auth/actor";
import { BASEL_CAPITAL_PROFILE } from "@/lib/risk/capital/capital";
import { explainRuns, explainVarChange } from "@/lib/risk";
import { resultsUnderCurrentNames, storedPortfolioStateOf } from "@/lib/runs/stored-state";
import { joinDetail, type RunDetail } from "@/lib/runs/detail";
import { infeasibilityMessage, methodInfeasibilities, type Infeasibility } from "@/lib/runs/feasibility";
import { runInputsExport, runInputsFileName } from "@/lib/runs/export";
import { methodContentSchema, type MethodContent } from "@/lib/validation/method";
import { alignReturns } from "@/lib/runs/align";
import { regimeFieldsOf, storedAttributesOf } from "@/lib/runs/standardised";
import { canonicalJson } from "@/lib/domain/canonical";
import { assessHistory, engineInputOf, neededFactors, type HistoryAssessment } from "@/lib/runs/compute";
import { capitalProfileOf } from "@/lib/runs/method-map";
import { markIfInterrupted, runJobKey, type RunJobPayload } from "@/lib/data/run-staleness";
import { enqueue } from "@/lib/jobs/queue";
import type { RunChange, RunInputHashes, RunInputs, RunListItem, RunRecord, RunResults, RunStatus, StoredPosition } from "@/lib/runs/types";
import { dataQualityReport } from "@/lib/uploads/data-quality";
import { confirmedPositionsUpload, getDataQuality } from "./data-quality";
import { getPeriod } from "./periods";
import { priceSeries } from "./prices";
import { assertRunFresh, periodRunFreshness, priceHistoryState } from "./run-freshness";

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
    inputHashes: r.inputHashes ?? null,
    engineVersion: r.engineVersion,
    results: r.results ? resultsUnderCurrentNames(r.results) : null,
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
  return { var1d: c.oneDay.var, varHorizon: c.horizon.var, esHorizon: c.horizon.es, confidence: c.confidence, capital: m.capital.capital, zone: m.backtest.zone };
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

/** Whether a read of a run joins its per-position detail (stored apart, lib/runs/detail.ts) back into its results. */
export interface RunReadOptions {
  /** false: the figures only (`results.detailApart` stays set, contributions empty); default true */
  detail?: boolean;
}

/** gzip on libuv's thread pool: the worker's event loop (its lease heartbeat) runs on while a big run is compressed. */
const gzipAsync = promisify(gzip);

/** Compress the JSON of a run's per-position detail. */
export async function packDetail(detail: RunDetail): Promise<{ data: Buffer; bytes: number }> {
  const json = JSON.stringify(detail);
  // level 1: written once by the worker at the run's completion, half the time of level 6 for ~15 % more bytes
  return { data: await gzipAsync(Buffer.from(json, "utf8"), { level: 1 }), bytes: Buffer.byteLength(json, "utf8") };
}

/** A run's whole results: its figures, and its per-position detail when that is stored apart. */
export async function withStoredDetail(db: Database | Tx, firmId: string, runId: string, results: RunResults): Promise<RunResults> {
  if (!results.detailApart) return results;
  const [row] = await db.select({ data: runDetails.data }).from(runDetails).where(and(eq(runDetails.runId, runId), eq(runDetails.firmId, firmId)));
  if (!row) throw new Error(`The per-position detail of run ${runId} is missing.`);
  return joinDetail(results, JSON.parse(gunzipSync(row.data).toString("utf8")) as RunDetail);
}

async function recordWith(firmId: string, row: Parameters<typeof toRecord>[0], options: RunReadOptions): Promise<RunRecord> {
  const record = toRecord(row);
  if (options.detail === false || !record.results) return record;
  return { ...record, results: await withStoredDetail(getDb(), firmId, record.id, record.results) };
}

/** One run of the actor's firm; another firm's run looks absent. A run left running by a dead server is marked failed first. */
export async function getRun(actor: Actor, runId: string, options: RunReadOptions = {}): Promise<RunRecord> {
  await markIfInterrupted(actor.firmId, { runId });
  const [row] = await selectRuns(actor.firmId, and(eq(runs.id, runId), eq(runs.firmId, actor.firmId)));
  if (!row) throw new AppError("not_found:run", "No such run.");
  return recordWith(actor.firmId, row, options);
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
export async function filingRunOf(actor: Actor, periodId: string, options: RunReadOptions = {}): Promise<RunRecord | null> {
  const [row] = await selectRuns(actor.firmId, and(eq(runs.firmId, actor.firmId), eq(runs.periodId, periodId), eq(runs.isFilingRun, true)));
  return row ? recordWith(actor.firmId, row, options) : null;
}

// ---------------------------------------------------------------------------------------------------------------
// stored inputs

/** Compress the canonical JSON of a run's inputs; `json` is that JSON (what a read of the stored bytes gives back). */
export async function packInputs(inputs: RunInputs): Promise<{ data: Buffer; bytes: number; json: string }> {
  const json = canonicalJson(inputs);
  return { data: await gzipAsync(Buffer.from(json, "utf8"), { level: 9 }), bytes: Buffer.byteLength(json, "utf8"), json };
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
  const run = await getRun(actor, runId, { detail: false });
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
    instrument: r.instrument,
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
      context: { periodId: p.id, upload: { uploadId: upload.id, fileName: upload.fileName }, dataQuality: { report: dataQualityReport([], new Map(), { reportingCurrency: actor.reportingCurrency, periodEnd }), items: 0, errors: 0, warnings: 0 } },
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

/** The approved method statement version a run would use now, parsed, or a refusal naming what is missing. */
async function runnableBasics(actor: Actor, periodId: string) {
  const period = await getPeriod(actor, periodId);
  assertOpen(period);
  const db = getDb();
  const upload = await confirmedPositionsUpload(actor, periodId);
  const method = await approvedMethodRow(actor.firmId, db);
  const missing: string[] = [];
  if (!upload) missing.push("no positions are confirmed for this period (a compliance officer uploads and confirms them on the Data page)");
  if (!method) missing.push("no method statement is approved (the risk analyst approves one on the Method page)");
  if (!upload || !method) throw new AppError("unprocessable:run", `A run cannot start: ${missing.join("; and ")}.`, { run: missing.join("; ") });
  const parsed = methodContentSchema.safeParse(method.content);
  if (!parsed.success) throw new AppError("unprocessable:run", `The approved method statement (version ${method.version}) cannot be read: ${parsed.error.issues[0]?.message ?? "invalid content"}.`);
  const [profileRow] = await db
    .select({ id: capitalRuleProfiles.id })
    .from(capitalRuleProfiles)
    .where(and(eq(capitalRuleProfiles.firmId, actor.firmId), eq(capitalRuleProfiles.active, true)))
    .orderBy(desc(capitalRuleProfiles.createdAt))
    .limit(1);
  return { period, upload, method, content: parsed.data, capitalProfileId: profileRow?.id ?? null };
}

/**
 * The history check of a run start without loading any close: per factor the book needs (each position's
 * instrument, then each foreign currency's exchange rate, in first-appearance order as `neededFactors`), the
 * returns `alignReturns` would find, counted in SQL over the price dates alone. A date inside a factor's own history
 * (between its first and last close up to the period end) on which the factor has no close is left out for every
 * factor; a factor's usable returns are the kept dates of its history, less one, when its history reaches the last
 * kept date, else none (the same answer as `assessHistory`, tests/unit/runs/queue-runs.test.ts).
 */
export async function assessHistoryOfUpload(
  actor: Pick<Actor, "firmId" | "reportingCurrency">,
  uploadId: string,
  periodEnd: string,
  minHistory: number,
): Promise<HistoryAssessment> {
  const db = getDb();
  const firmId = actor.firmId;
  const rc = actor.reportingCurrency;
  const byInstrument = await db.all<{ code: string; firstRow: number; assetClass: string }>(
    sql`SELECT instrument_code AS code, min(row_number) AS firstRow, asset_class AS assetClass FROM positions WHERE firm_id = ${firmId} AND upload_id = ${uploadId} GROUP BY instrument_code ORDER BY firstRow`,
  );
  const byCurrency = await db.all<{ currency: string; firstRow: number }>(
    sql`SELECT currency, min(row_number) AS firstRow FROM positions WHERE firm_id = ${firmId} AND upload_id = ${uploadId} AND currency <> ${rc} GROUP BY currency ORDER BY firstRow`,
  );
  const needed = new Map<string, string>();
  for (const r of byInstrument) needed.set(r.code, r.assetClass);
  for (const r of byCurrency) if (!needed.has(`${r.currency}${rc}`)) needed.set(`${r.currency}${rc}`, "fx");
  const counted = await db.all<{ code: string; returns: number }>(sql`
    WITH needed AS (SELECT value AS code FROM json_each(${JSON.stringify([...needed.keys()])})),
    ids AS MATERIALIZED (SELECT i.id, i.code FROM instruments i JOIN needed n ON n.code = i.code WHERE i.firm_id = ${firmId} AND i.pending_upload IS NULL),
    p AS MATERIALIZED (SELECT pp.instrument_id AS iid, pp.date AS d FROM price_points pp JOIN ids ON ids.id = pp.instrument_id
          WHERE pp.firm_id = ${firmId} AND pp.current = 1 AND pp.date <= ${periodEnd}),
    spans AS MATERIALIZED (SELECT iid, min(d) AS f, max(d) AS l FROM p GROUP BY iid),
    dates AS MATERIALIZED (SELECT d, count(*) AS present FROM p GROUP BY d),
    kept AS MATERIALIZED (SELECT d FROM dates WHERE present = (SELECT count(*) FROM spans WHERE spans.f <= dates.d AND spans.l >= dates.d)),
    lastKept AS MATERIALIZED (SELECT max(d) AS m FROM kept)
    SELECT ids.code AS code,
      CASE WHEN spans.f <= lastKept.m AND spans.l >= lastKept.m
        THEN max(0, (SELECT count(*) FROM kept WHERE kept.d >= spans.f AND kept.d <= spans.l) - 1) ELSE 0 END AS returns
    FROM ids JOIN spans ON spans.iid = ids.id, lastKept`);
  const returnsOf = new Map(counted.map((r) => [r.code, Number(r.returns)]));
  const factors: HistoryAssessment["factors"] = [];
  const short: HistoryAssessment["short"] = [];
  for (const [factor, assetClass] of needed) {
    const returns = returnsOf.get(factor) ?? 0;
    factors.push({ factor, returns });
    if (!returnsOf.has(factor)) {
      if (assetClass !== "fx") short.push({ factor, reason: "no price history up to the period end" });
    } else if (returns < minHistory) {
      short.push({ factor, reason: `${returns} returns up to the period end without a break; the method statement's minimum history is ${minHistory}` });
    }
  }
  const [{ total }] = await db.all<{ total: number }>(sql`SELECT count(*) AS total FROM positions WHERE firm_id = ${firmId} AND upload_id = ${uploadId}`);
  const shortCodes = short.map((s) => s.factor);
  const affected = shortCodes.length
    ? await db.all<{ book: string; instrument: string }>(
        sql`SELECT book, instrument_code AS instrument FROM positions WHERE firm_id = ${firmId} AND upload_id = ${uploadId} AND instrument_code IN (SELECT value FROM json_each(${JSON.stringify(shortCodes)})) ORDER BY row_number`,
      )
    : [];
  const positionsAffected = affected.map((p) => `${p.book} · ${p.instrument}`);
  return { minHistory, factors, short, positionsAffected, positionsUsable: Number(total) - positionsAffected.length };
}

/** A start's history check as kept (history_checks) for a book, period end, minimum history and price state. */
interface HistoryCheck {
  assessment: HistoryAssessment;
  priceState: string;
  /** whether it was read from history_checks (false: counted now, not yet kept) */
  kept: boolean;
}

/**
 * The history check of a start as kept for this positions upload, period end, minimum history and state of the price
 * history (history_checks), or counted now (`kept: false`): a start on a big book answers without counting again
 * once the data-quality job (after each confirmation) or an earlier start has kept it.
 */
async function historyCheck(actor: Pick<Actor, "firmId" | "reportingCurrency">, uploadId: string, periodEnd: string, minHistory: number): Promise<HistoryCheck> {
  const priceState = await priceHistoryState(actor.firmId);
  const [row] = await getDb()
    .select({ assessment: historyChecks.assessment })
    .from(historyChecks)
    .where(and(historyCheckKey(actor.firmId, uploadId, periodEnd, minHistory), eq(historyChecks.priceState, priceState)));
  if (row) return { assessment: row.assessment, priceState, kept: true };
  return { assessment: await assessHistoryOfUpload(actor, uploadId, periodEnd, minHistory), priceState, kept: false };
}

function historyCheckKey(firmId: string, uploadId: string, periodEnd: string, minHistory: number) {
  return and(eq(historyChecks.firmId, firmId), eq(historyChecks.uploadId, uploadId), eq(historyChecks.periodEnd, periodEnd), eq(historyChecks.minHistory, minHistory));
}

/**
 * Keep a counted history check for every process (replacing an earlier price state's). A courtesy, like keeping a
 * price comparison: skipped when another writer holds the database just then.
 */
async function keepHistoryCheck(firmId: string, uploadId: string, periodEnd: string, minHistory: number, check: HistoryCheck): Promise<void> {
  if (check.kept) return;
  try {
    await getDb().transaction(async (tx) => {
      await tx.delete(historyChecks).where(and(historyCheckKey(firmId, uploadId, periodEnd, minHistory), ne(historyChecks.priceState, check.priceState)));
      await tx.insert(historyChecks).values({ uploadId, firmId, periodEnd, minHistory, priceState: check.priceState, assessment: check.assessment }).onConflictDoNothing();
    });
  } catch (error) {
    if (!isDatabaseBusy(error)) throw error;
  }
}

/** The history check of a start, read from history_checks or counted and kept there. */
export async function keptHistoryAssessment(
  actor: Pick<Actor, "firmId" | "reportingCurrency">,
  uploadId: string,
  periodEnd: string,
  minHistory: number,
): Promise<HistoryAssessment> {
  const check = await historyCheck(actor, uploadId, periodEnd, minHistory);
  await keepHistoryCheck(actor.firmId, uploadId, periodEnd, minHistory, check);
  return check.assessment;
}

/**
 * Keep the history check of the period's current book under the approved method statement, for the next start (the
 * data-quality job, after a confirmation). Nothing when the period has no confirmed positions or no approved method.
 */
export async function keepPeriodHistoryCheck(actor: Actor, periodId: string): Promise<boolean> {
  const period = await getPeriod(actor, periodId);
  const upload = await confirmedPositionsUpload(actor, periodId);
  const method = await approvedMethodRow(actor.firmId, getDb());
  const content = method ? methodContentSchema.safeParse(method.content) : null;
  if (!upload || !content?.success) return false;
  await keptHistoryAssessment(actor, upload.id, period.periodEnd, content.data.minHistory);
  return true;
}

/** Refuse a start (or, in the worker, the computation) on a history assessment, naming the factors. */
function assertHistory(assessment: HistoryAssessment, periodEnd: string, options: StartOptions) {
  if (assessment.positionsUsable === 0) {
    throw new AppError("unprocessable:history", `A run cannot start: no position's price history reaches the method statement's minimum of ${assessment.minHistory} returns up to ${periodEnd}.`, { excludeShortHistory: "No position would be left." });
  }
  if (assessment.short.length && !options.excludeShortHistory) {
    const list = assessment.short.map((s) => `${s.factor} (${s.reason})`).join("; ");
    throw new AppError(
      "unprocessable:history",
      `${assessment.short.length} factor(s) lack the method statement's minimum history of ${assessment.minHistory} returns: ${list}. Start the run without them (the positions on them are left out and listed), or load their price history first.`,
      { excludeShortHistory: `Leaves out ${assessment.positionsAffected.length} position(s): ${assessment.positionsAffected.join(", ")}.` },
    );
  }
}

/**
 * Gather a queued run's inputs as they stand now (the worker does this, not the request): the positions of the
 * upload, the method statement version and capital rule profile recorded at its start, the closes of the factors up
 * to the period end and the period's data-quality report; then check the history and that the method can be
 * computed for every factor (refusing with the same messages as a start, naming asset class, factor and reason).
 */
export async function gatherRunInputs(actor: Actor, run: Pick<RunRow, "periodId" | "positionsUploadId" | "methodStatementId" | "capitalProfileId">, options: StartOptions = {}): Promise<RunInputs> {
  const db = getDb();
  const period = await getPeriod(actor, run.periodId);
  const [upload] = await db.select().from(uploads).where(and(eq(uploads.firmId, actor.firmId), eq(uploads.id, run.positionsUploadId)));
  const [method] = await db.select().from(methodStatements).where(and(eq(methodStatements.firmId, actor.firmId), eq(methodStatements.id, run.methodStatementId)));
  if (!upload || !method) throw new AppError("unprocessable:run", "The run's positions upload or method statement is no longer stored.");
  const parsed = methodContentSchema.safeParse(method.content);
  if (!parsed.success) throw new AppError("unprocessable:run", `The approved method statement (version ${method.version}) cannot be read: ${parsed.error.issues[0]?.message ?? "invalid content"}.`);
  const [profileRow] = run.capitalProfileId
    ? await db.select().from(capitalRuleProfiles).where(and(eq(capitalRuleProfiles.firmId, actor.firmId), eq(capitalRuleProfiles.id, run.capitalProfileId)))
    : [];
  const capitalProfile = profileRow
    ? { ...capitalProfileOf(profileRow), ...regimeFieldsOf(profileRow) }
    : { id: null, name: "Engine default (no capital rule profile stored)", profile: BASEL_CAPITAL_PROFILE, plusFactors: { "5": 0.4, "6": 0.5, "7": 0.65, "8": 0.75, "9": 0.85, "10": 1 }, backtestDays: 250 };

  const stored = await storedPositionsOf(actor, upload.id);
  const { dates, factors } = await closesOf(actor, stored, period.periodEnd);
  const quality = await getDataQuality(actor, run.periodId);
  const inputs: RunInputs = {
    positions: stored,
    prices: { dates, factors },
    method: { id: method.id, version: method.version, approvedAt: method.approvedAt, content: parsed.data },
    capitalProfile,
    periodEnd: period.periodEnd,
    reportingCurrency: actor.reportingCurrency,
    context: {
      periodId: run.periodId,
      upload: { uploadId: upload.id, fileName: upload.fileName },
      dataQuality: { report: quality.report, items: quality.report.items.length, errors: quality.report.counts.error, warnings: quality.report.counts.warning },
    },
  };
  assertHistory(assessHistory(inputs, alignReturns(inputs.prices)), period.periodEnd, options);
  // a choice that cannot be computed for a factor refuses the run, naming the asset class, the factor and why
  const infeasible = methodInfeasibilities(inputs, inputs.method.content);
  if (infeasible.length) {
    throw new AppError("unprocessable:method", infeasibilityMessage(infeasible, `A run cannot be computed with method statement version ${method.version}`), {
      method: infeasible.map((i) => `${i.factor}: ${i.reason}`).join("; "),
    });
  }
  return inputs;
}

export interface StartOptions {
  /** run without the factors short of the method's minimum history (they are listed in the results) */
  excludeShortHistory?: boolean;
}

/**
 * Insert a queued run and its job, in one transaction with its audit record (inputs: copied from an original run's
 * stored inputs for a reproduction; otherwise the worker gathers and stores them).
 */
async function insertRun(
  actor: Actor,
  values: { periodId: string; methodStatementId: string; positionsUploadId: string; capitalProfileId: string | null; reproducesRunId: string | null; inputHashes?: RunInputHashes | null },
  options: StartOptions,
  audit: { action: string; summary: string; detail: Record<string, unknown> },
): Promise<string> {
  const stamp = now().toISOString();
  const { inputHashes, ...columns } = values;
  try {
    return await getDb().transaction(async (tx) => {
      const [row] = await tx
        .insert(runs)
        .values({ firmId: actor.firmId, ...columns, status: "queued", stage: "queued", progress: 0, inputHashes: inputHashes ?? null, startedBy: actor.userId, startedAt: stamp, heartbeatAt: new Date().toISOString() /* wall clock */ })
        .returning({ id: runs.id });
      if (values.reproducesRunId) {
        // the original's stored inputs, byte for byte, copied in the database (never read into this process)
        await tx.run(sql`INSERT INTO run_inputs (run_id, firm_id, data, bytes, created_at) SELECT ${row.id}, firm_id, data, bytes, ${stamp} FROM run_inputs WHERE run_id = ${values.reproducesRunId} AND firm_id = ${actor.firmId}`);
      }
      const payload: RunJobPayload = { runId: row.id, excludeShortHistory: options.excludeShortHistory ?? false };
      await enqueue(tx, { kind: "run", firmId: actor.firmId, payload: { ...payload }, dedupeKey: runJobKey(row.id), maxAttempts: 1 });
      await recordAudit(tx, actor, { action: audit.action, entityType: "run", entityId: row.id, summary: audit.summary, detail: { ...audit.detail, ...(inputHashes ? { inputHashes } : {}) } });
      return row.id;
    });
  } catch (error) {
    if (isUniqueViolation(error, "runs_one_active_per_period")) throw await activeRunConflict(actor.firmId, values.periodId);
    throw error;
  }
}

/** Whether a run of the period is queued or running (one indexed row read). */
async function assertNoActiveRun(actor: Actor, periodId: string) {
  const [active] = await getDb()
    .select({ id: runs.id })
    .from(runs)
    .where(and(eq(runs.firmId, actor.firmId), eq(runs.periodId, periodId), inArray(runs.status, ["queued", "running"])))
    .limit(1);
  if (active) throw await activeRunConflict(actor.firmId, periodId);
}

/**
 * Start a run for a period: refuses, before any heavy read, when a run of the period is in progress, the period is
 * signed or filed, no positions are confirmed, no method statement is approved, or a factor lacks the method's
 * minimum history (unless asked to run without those factors, which are then listed) — the history counted in SQL.
 * Returns the queued run at once; a worker (`npm run worker`, job kind "run") gathers its inputs and computes it.
 */
export async function startRun(actor: Actor, periodId: string, options: StartOptions = {}): Promise<RunRecord> {
  await markIfInterrupted(actor.firmId, { periodId });
  const { period, upload, method, content, capitalProfileId } = await runnableBasics(actor, periodId);
  await assertNoActiveRun(actor, periodId);
  // Read as kept, or counted; a refused start stores nothing, a start that goes ahead keeps what it counted.
  const check = await historyCheck(actor, upload.id, period.periodEnd, content.minHistory);
  const { assessment } = check;
  assertHistory(assessment, period.periodEnd, options);
  const id = await insertRun(
    actor,
    { periodId, methodStatementId: method.id, positionsUploadId: upload.id, capitalProfileId, reproducesRunId: null },
    options,
    {
      action: "run.start",
      summary: `Started a run for the period ending ${period.periodEnd} (method statement version ${method.version}${assessment.short.length ? `, without ${assessment.short.length} factor(s) short of history` : ""})`,
      detail: { periodEnd: period.periodEnd, methodVersion: method.version, positionsUploadId: upload.id, excludedFactors: assessment.short },
    },
  );
  await keepHistoryCheck(actor.firmId, upload.id, period.periodEnd, content.minHistory, check);
  return getRun(actor, id, { detail: false });
}

/** Re-run a completed run from its stored inputs (never today's data) as a new run pointing at it, through the queue. */
export async function reproduceRun(actor: Actor, runId: string): Promise<RunRecord> {
  const original = await getRun(actor, runId, { detail: false });
  if (original.status !== "completed") throw new AppError("conflict:run", "Only a completed run can be reproduced.");
  const period = await getPeriod(actor, original.periodId);
  await markIfInterrupted(actor.firmId, { periodId: original.periodId });
  await assertNoActiveRun(actor, original.periodId);
  const [row] = await getDb().select().from(runs).where(and(eq(runs.id, runId), eq(runs.firmId, actor.firmId)));
  const id = await insertRun(
    actor,
    { periodId: original.periodId, methodStatementId: row.methodStatementId, positionsUploadId: row.positionsUploadId, capitalProfileId: row.capitalProfileId, reproducesRunId: runId, inputHashes: original.inputHashes },
    {},
    {
      action: "run.reproduce",
      summary: `Started reproducing the run of ${original.startedAt.slice(0, 16).replace("T", " ")} UTC for the period ending ${period.periodEnd} from its stored inputs`,
      detail: { originalRunId: runId },
    },
  );
  return getRun(actor, id, { detail: false });
}

/** Mark a completed run as the one the period's filing uses (one per period), with its audit record. */
export async function useForFiling(actor: Actor, runId: string): Promise<RunRecord> {
  const run = await getRun(actor, runId, { detail: false });
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
  return getRun(actor, runId, { detail: false });
}

// ---------------------------------------------------------------------------------------------------------------
// change since last period

/** The explain of this run's one-day parametric VaR against the previous period's filing run. */
export async function runChange(actor: Actor, runId: string): Promise<RunChange> {
  const run = await getRun(actor, runId, { detail: false });
  if (run.status !== "completed" || !run.results) return { previous: null, explanation: null, note: "The run has not completed." };
  const period = await getPeriod(actor, run.periodId);
  const earlier = await getDb()
    .select({ id: reportingPeriods.id, periodEnd: reportingPeriods.periodEnd })
    .from(reportingPeriods)
    .where(and(eq(reportingPeriods.firmId, actor.firmId), lt(reportingPeriods.periodEnd, period.periodEnd)))
    .orderBy(desc(reportingPeriods.periodEnd));
  for (const p of earlier) {
    const filing = await filingRunOf(actor, p.id, { detail: false });
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
