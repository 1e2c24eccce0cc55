/**
 * Staleness of a period's runs, in one place: each run's stored input ids and closes against the period's current
 * confirmed positions, approved method statement, capital rule profile and price history (lib/runs/freshness.ts).
 * Every page that shows a run, and the filing choice, read it from here.
 */
import "server-only";
import { approvedMethodVersion } from "@/lib/data/approved-method";
import { gunzipSync } from "node:zlib";
import { and, count, desc, eq, inArray, max, ne } from "drizzle-orm";
import { getDb, isDatabaseBusy } from "@/db/client";
import { capitalRuleProfiles, reportingPeriods, runInputs, runPriceChecks, runs, uploads } from "@/db/schema";
import { AppError } from "@/lib/errors";
import type { Actor } from "@/lib/auth/actor";
import { neededFactors } from "@/lib/runs/compute";
import { priceChanges, runFreshness, staleSummary, type CurrentInputs, type InputChange, type RunFreshness } from "@/lib/runs/freshness";
import type { RunInputs } from "@/lib/runs/types";
import { priceSeries } from "./prices";

export type { RunFreshness } from "@/lib/runs/freshness";

/** The firm's approved method version and capital rule profile in force (what every period's runs are compared to). */
async function firmRules(firmId: string) {
  const db = getDb();
  const method = await approvedMethodVersion(firmId, db);
  const [profile] = await db
    .select({ id: capitalRuleProfiles.id, name: capitalRuleProfiles.name })
    .from(capitalRuleProfiles)
    .where(and(eq(capitalRuleProfiles.firmId, firmId), eq(capitalRuleProfiles.active, true)))
    .orderBy(desc(capitalRuleProfiles.createdAt))
    .limit(1);
  return { method, profile };
}

/** The period's current inputs: confirmed positions, approved method statement, capital rule profile in force. */
export async function currentInputs(actor: Actor, periodId: string): Promise<CurrentInputs> {
  return currentInputsOfFirm(actor.firmId, periodId);
}

async function currentInputsOfFirm(firmId: string, periodId: string): Promise<CurrentInputs> {
  const db = getDb();
  const [upload] = await db
    .select()
    .from(uploads)
    .where(and(eq(uploads.firmId, firmId), eq(uploads.periodId, periodId), eq(uploads.kind, "positions"), eq(uploads.status, "confirmed")));
  const { method, profile } = await firmRules(firmId);
  return {
    positions: upload ? { uploadId: upload.id, fileName: upload.fileName, confirmedAt: upload.confirmedAt } : null,
    method: method ?? null,
    capitalProfile: profile ?? null,
  };
}

// Price comparisons are the costly part (the run's stored closes against the held ones, seconds on a big book): kept
// per run and state of the firm's price history, in run_price_checks for every process and in memory here. Closes
// are written only by confirming a price-history upload (lib/data/uploads.ts), so the state is the count and the
// latest confirmation of those uploads: a page view recomputes only after one.
const priceCache = new Map<string, InputChange[]>();
function rememberPrices(key: string, value: InputChange[]): InputChange[] {
  priceCache.set(key, value);
  while (priceCache.size > 200) priceCache.delete(priceCache.keys().next().value!);
  return value;
}

/**
 * The state of a firm's price history: the count and latest confirmation of its price uploads (closes are written only
 * by confirming one). Kept price comparisons and history checks are keyed by it.
 */
export async function priceHistoryState(firmId: string): Promise<string> {
  const [row] = await getDb()
    .select({ n: count(), latest: max(uploads.confirmedAt) })
    .from(uploads)
    .where(and(eq(uploads.firmId, firmId), eq(uploads.kind, "prices"), inArray(uploads.status, ["confirmed", "superseded"])));
  return `${row?.n ?? 0}:${row?.latest ?? ""}`;
}

/** The price comparison of a run kept for this state of the price history (by any process), or undefined. */
async function keptPriceCheck(firmId: string, runId: string, state: string): Promise<InputChange[] | undefined> {
  const [kept] = await getDb()
    .select({ changes: runPriceChecks.changes })
    .from(runPriceChecks)
    .where(and(eq(runPriceChecks.runId, runId), eq(runPriceChecks.firmId, firmId), eq(runPriceChecks.priceState, state)));
  return kept?.changes;
}

/**
 * Keep a run's price comparison for this state (replacing the earlier state's), for every process to read. A courtesy
 * of the read, like marking an interrupted run: skipped when another writer holds the database just then.
 */
async function keepPriceCheck(firmId: string, runId: string, state: string, changes: InputChange[]): Promise<void> {
  try {
    await getDb().transaction(async (tx) => {
      await tx.delete(runPriceChecks).where(and(eq(runPriceChecks.runId, runId), eq(runPriceChecks.firmId, firmId), ne(runPriceChecks.priceState, state)));
      await tx.insert(runPriceChecks).values({ runId, firmId, priceState: state, changes }).onConflictDoNothing();
    });
  } catch (error) {
    if (!isDatabaseBusy(error)) throw error;
  }
}

/** The freshness of each run of an open period (none for a signed or filed one), by run id. */
export async function periodRunFreshness(actor: Actor, periodId: string, onlyRunIds?: readonly string[]): Promise<Map<string, RunFreshness>> {
  // the three fields freshness needs, read here (the full period summary in ./periods reads the calendar too)
  const [period] = await getDb()
    .select({ id: reportingPeriods.id, periodEnd: reportingPeriods.periodEnd, state: reportingPeriods.state })
    .from(reportingPeriods)
    .where(and(eq(reportingPeriods.id, periodId), eq(reportingPeriods.firmId, actor.firmId)));
  if (!period) throw new AppError("not_found:period", "No such reporting period.");
  return freshnessForPeriod(actor.firmId, period, onlyRunIds);
}

/**
 * The same for a period already read (the period's step list uses it; it must not read the period again). Firm-scoped:
 * every query filters on `firmId`.
 */
export async function freshnessForPeriod(firmId: string, period: { id: string; periodEnd: string; state: string }, onlyRunIds?: readonly string[]): Promise<Map<string, RunFreshness>> {
  return (await freshnessForPeriods(firmId, [period], onlyRunIds)).get(period.id) ?? new Map();
}

/**
 * The freshness of the runs of several periods at once, by period id then run id, in a fixed number of queries
 * however many periods and runs there are (the periods list): the runs, the current inputs of every period and the
 * price-history state, each read once. Only a run whose price comparison is not yet kept for the current state
 * reads its stored inputs and its period's closes (once per run and state of the price history).
 */
export async function freshnessForPeriods(firmId: string, periods: readonly { id: string; periodEnd: string; state: string }[], onlyRunIds?: readonly string[]): Promise<Map<string, Map<string, RunFreshness>>> {
  const out = new Map<string, Map<string, RunFreshness>>();
  // A signed or filed period's inputs are frozen with it: later changes belong to later periods.
  const open = periods.filter((p) => p.state !== "signed" && p.state !== "filed");
  for (const p of periods) out.set(p.id, new Map());
  if (open.length === 0) return out;
  const db = getDb();
  const conditions = [eq(runs.firmId, firmId), inArray(runs.periodId, open.map((p) => p.id))];
  if (onlyRunIds) conditions.push(inArray(runs.id, [...onlyRunIds]));
  const rows = await db
    .select({ id: runs.id, periodId: runs.periodId, positionsUploadId: runs.positionsUploadId, methodStatementId: runs.methodStatementId, capitalProfileId: runs.capitalProfileId })
    .from(runs)
    .where(and(...conditions));
  if (rows.length === 0) return out;
  const withRuns = open.filter((p) => rows.some((r) => r.periodId === p.id));
  const current = await currentInputsOfPeriods(firmId, withRuns.map((p) => p.id));
  const state = await priceHistoryState(firmId);
  for (const period of withRuns) {
    let series: Awaited<ReturnType<typeof priceSeries>> | null = null;
    for (const run of rows.filter((r) => r.periodId === period.id)) {
      const key = `${run.id}:${state}`;
      let prices = priceCache.get(key) ?? (await keptPriceCheck(firmId, run.id, state));
      if (!prices) {
        const [stored] = await db
          .select({ data: runInputs.data })
          .from(runInputs)
          .where(and(eq(runInputs.runId, run.id), eq(runInputs.firmId, firmId)));
        if (stored) {
          const inputs = JSON.parse(gunzipSync(Buffer.from(stored.data)).toString("utf8")) as RunInputs;
          series ??= await priceSeries(firmId, period.periodEnd);
          prices = priceChanges(inputs.prices, series, [...neededFactors(inputs.positions, inputs.reportingCurrency).keys()]);
          await keepPriceCheck(firmId, run.id, state, prices);
          rememberPrices(key, prices);
        } else prices = []; // inputs not stored yet (a queued run): nothing to compare, and nothing kept
      } else rememberPrices(key, prices);
      out.get(period.id)!.set(run.id, runFreshness(run, current.get(period.id)!, prices));
    }
  }
  return out;
}

/** The current inputs of several periods of one firm in three queries (positions of all, then method and profile). */
async function currentInputsOfPeriods(firmId: string, periodIds: readonly string[]): Promise<Map<string, CurrentInputs>> {
  const db = getDb();
  const confirmed = periodIds.length
    ? await db
        .select({ id: uploads.id, periodId: uploads.periodId, fileName: uploads.fileName, confirmedAt: uploads.confirmedAt })
        .from(uploads)
        .where(and(eq(uploads.firmId, firmId), inArray(uploads.periodId, [...periodIds]), eq(uploads.kind, "positions"), eq(uploads.status, "confirmed")))
    : [];
  const { method, profile } = await firmRules(firmId);
  const out = new Map<string, CurrentInputs>();
  for (const periodId of periodIds) {
    const upload = confirmed.find((u) => u.periodId === periodId);
    out.set(periodId, {
      positions: upload ? { uploadId: upload.id, fileName: upload.fileName, confirmedAt: upload.confirmedAt } : null,
      method: method ?? null,
      capitalProfile: profile ?? null,
    });
  }
  return out;
}

/** The freshness of one run of the actor's firm. */
export async function runFreshnessOf(actor: Actor, runId: string): Promise<RunFreshness> {
  const [row] = await getDb().select({ periodId: runs.periodId }).from(runs).where(and(eq(runs.id, runId), eq(runs.firmId, actor.firmId)));
  if (!row) throw new AppError("not_found:run", "No such run.");
  return (await periodRunFreshness(actor, row.periodId, [runId])).get(runId) ?? { stale: false, changes: [] };
}

/** Refuse, naming what changed, when a run's inputs are no longer the period's current ones. */
export async function assertRunFresh(actor: Actor, runId: string, doing: string): Promise<void> {
  const freshness = await runFreshnessOf(actor, runId);
  if (freshness.stale) {
    throw new AppError("conflict:run", `This run is stale, so it cannot ${doing}: ${staleSummary(freshness)} Start a new run on the current inputs.`, { run: staleSummary(freshness) });
  }
}
