/**
 * Runs against a seeded demo database: the refusals (nothing stored), one run at a time, stored inputs and their
 * hashes, execution and failure, reproduction (matching, and differing when an input is tampered with in a copy),
 * the filing run, staleness, triggers on finished runs, and firm scope.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import type { Database } from "@/db/client";
import { runDetails, runInputs, runs } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { AppError } from "@/lib/errors";
import { openPeriod } from "@/lib/data/periods";
import { filingRunOf, getRun, getRunInputs, listRuns, packInputs, reproduceRun, runChange, startRun, useForFiling } from "@/lib/data/runs";
import { executeRun } from "@/lib/data/run-execution";
import { computeRun } from "@/lib/runs/compute";
import { compareRuns, inputHashesOf } from "@/lib/runs/compare";
import { volatilityDetail } from "@/lib/runs/volatility-detail";
import { ENGINE_VERSION } from "@/lib/risk/version";
import type { RunInputs, RunRecord } from "@/lib/runs/types";
import { snapshot } from "../helpers/db";
import { actorFor, demoWorldAs, PEOPLE, seedDemoMethod } from "./setup";

let db: Database;
let analyst: Actor;
let auditor: Actor;
let pellam: Actor;
let periodId: string;

async function refusal(promise: Promise<unknown>): Promise<AppError> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(AppError);
  return error as AppError;
}

beforeAll(async () => {
  ({ db, periodId, analyst, auditor, pellam } = await demoWorldAs({ withMethod: false }, { analyst: PEOPLE.analyst, auditor: PEOPLE.auditor, pellam: PEOPLE.pellamAnalyst }));
}, 120_000);

describe("refusals store nothing", () => {
  it("refuses without an approved method statement, naming it", async () => {
    const before = await snapshot(db);
    const error = await refusal(startRun(analyst, periodId, { excludeShortHistory: true }));
    expect(error.code).toBe("unprocessable:run");
    expect(error.message).toContain("no method statement is approved");
    expect(await snapshot(db)).toEqual(before);
  });

  it("refuses a period without confirmed positions, naming them", async () => {
    await seedDemoMethod(db);
    const officer = await actorFor(PEOPLE.officer);
    const october = await openPeriod(officer, "2026-10");
    const before = await snapshot(db);
    const error = await refusal(startRun(analyst, october.id, { excludeShortHistory: true }));
    expect(error.code).toBe("unprocessable:run");
    expect(error.message).toContain("no positions are confirmed for this period");
    expect(error.message).not.toContain("method statement");
    expect(await snapshot(db)).toEqual(before);
  }, 120_000);

  it("refuses factors short of the method's minimum history, listing them and the positions they leave out", async () => {
    const before = await snapshot(db);
    const error = await refusal(startRun(analyst, periodId));
    expect(error.code).toBe("unprocessable:history");
    // the demo's NMB-EQ-WYNCOTE has no price history at all (templates/demo/README.md)
    expect(error.message).toContain("NMB-EQ-WYNCOTE (no price history up to the period end)");
    expect(error.fields?.excludeShortHistory).toContain("TRADING · NMB-EQ-WYNCOTE");
    expect(await snapshot(db)).toEqual(before);
  });

  it("refuses another firm's period as absent", async () => {
    const error = await refusal(startRun(pellam, periodId, { excludeShortHistory: true }));
    expect(error.code).toBe("not_found:period");
  });
});

describe("a run of the demo period", () => {
  let run: RunRecord;
  let inputs: RunInputs;

  beforeAll(async () => {
    const queued = await startRun(analyst, periodId, { excludeShortHistory: true });
    expect(queued.status).toBe("queued");
    expect(queued.progress).toBe(0);
    expect(await executeRun(queued.id)).toBe("completed");
    run = await getRun(analyst, queued.id);
    inputs = await getRunInputs(analyst, run.id);
  }, 120_000);

  it("completes with every figure, the method version and the engine version", () => {
    expect(run.status).toBe("completed");
    expect(run.stage).toBe("done");
    expect(run.progress).toBe(1);
    expect(run.engineVersion).toBe(ENGINE_VERSION);
    expect(run.methodVersion?.version).toBe(1);
    expect(run.startedByName).toBe(analyst.name);
    const r = run.results!;
    expect(r.method.version).toBe(1);
    expect(r.monthEnd.primaryMethod).toBe("parametric");
    expect(r.monthEnd.methods.map((m) => m.method)).toEqual(["parametric", "historical"]);
    expect(r.monthEnd.confidences).toEqual([0.99, 0.975]);
    expect(r.monthEnd.capital.capital).toBeGreaterThan(0);
    expect(r.monthEnd.backtest.days).toBe(250);
    expect(r.inputs.excludedFactors.map((f) => f.factor)).toContain("NMB-EQ-WYNCOTE");
    expect(r.monthEnd.excludedPositions.map((p) => p.instrument)).toEqual(["TRADING · NMB-EQ-WYNCOTE"]);
    // every row of the demo November file (templates/demo/README.md: 56 positions)
    expect(r.positions.rows).toBe(56);
    expect(r.dataQuality.items).toBe(r.dataQuality.report.items.length);
    expect(r.dataQuality.items).toBeGreaterThan(0);
    // the demo statement keeps one EWMA covariance for every factor, and the run says so
    expect(r.factorVolatility.statement).toContain("one EWMA covariance for every factor");
  });

  it("stores each position's contributions apart from the figures, and joins them back on a read", async () => {
    const [row] = await db.select({ results: runs.results }).from(runs).where(eq(runs.id, run.id));
    expect(row.results!.detailApart).toBe(true);
    expect(row.results!.monthEnd.methods.flatMap((m) => m.byConfidence.map((c) => c.contributions.length))).toEqual([0, 0, 0, 0]);
    const [detail] = await db.select({ bytes: runDetails.bytes }).from(runDetails).where(eq(runDetails.runId, run.id));
    expect(detail.bytes).toBeGreaterThan(0);
    // the default read is whole: 55 positions of the 56 count (one is excluded for its missing history), per method and confidence
    expect(run.results!.detailApart).toBeUndefined();
    expect(run.results!.monthEnd.methods.flatMap((m) => m.byConfidence.map((c) => c.contributions.length))).toEqual([55, 55, 55, 55]);
    // component VaRs add up to the VaR (Euler allocation of a homogeneous risk measure; relative 1e-9, common practice, no source)
    const c99 = run.results!.monthEnd.methods[0].byConfidence[0];
    expect(Math.abs(c99.contributions.reduce((a, p) => a + p.componentVar, 0) - c99.oneDay.var) / c99.oneDay.var).toBeLessThan(1e-9);
    const figures = await getRun(analyst, run.id, { detail: false });
    expect(figures.results!.detailApart).toBe(true);
    expect({ ...figures.results!, monthEnd: { ...figures.results!.monthEnd, methods: [] }, detailApart: undefined }).toEqual({ ...run.results!, monthEnd: { ...run.results!.monthEnd, methods: [] }, detailApart: undefined });
    // written once, like the stored inputs
    await expect(db.$client.execute({ sql: "UPDATE run_details SET bytes = 1 WHERE run_id = ?", args: [run.id] })).rejects.toThrow(/cannot be changed/);
    await expect(db.$client.execute({ sql: "DELETE FROM run_details WHERE run_id = ?", args: [run.id] })).rejects.toThrow(/cannot be deleted/);
  });

  it("reports parametric VaR as the normal quantile times the book's volatility", () => {
    // z(0.99) = 2.3263478740408408 and z(0.975) = 1.959963984540054: Wichura (1988), algorithm AS 241.
    // Ten days by the square root of time under the method's "sqrt" scaling.
    const p = run.results!.monthEnd.methods[0];
    const [c99, c975] = p.byConfidence;
    expect(c99.oneDay.var / p.portfolioVolatility).toBeCloseTo(2.3263478740408408, 10);
    expect(c975.oneDay.var / p.portfolioVolatility).toBeCloseTo(1.959963984540054, 10);
    expect(c99.horizon.var / c99.oneDay.var).toBeCloseTo(Math.sqrt(10), 10);
  });

  it("keeps 60 days of VaR history and the backtest day by day, with the engine's exceptions", () => {
    const r = run.results!;
    expect(r.monthEnd.varHistory.points).toHaveLength(60);
    expect(r.monthEnd.choices.historyDays).toBe(60);
    const s = r.backtestSeries;
    expect(s.dates).toHaveLength(250);
    expect(s.dates.at(-1)).toBe(r.monthEnd.asOf);
    expect(s.exception.filter(Boolean).length).toBe(r.monthEnd.backtest.exceptions);
    expect(s.dates.filter((_d, i) => s.exception[i])).toEqual(r.monthEnd.backtest.exceptionList.map((e) => e.date));
    // the last VaR history point is today's figure: the one-day VaR reported for the primary method. The history
    // runs the EWMA recursion on the book's P&L, the figure the EWMA covariance's quadratic form: algebraically the
    // same, so they agree to rounding (relative 1e-12: double precision, common practice, no source)
    const last = r.monthEnd.varHistory.points.at(-1)!.var1d[0];
    const today = r.monthEnd.methods[0].byConfidence[0].oneDay.var;
    expect(Math.abs(last - today) / today).toBeLessThan(1e-12);
  });

  it("fits every factor under every estimator and reports the chosen one by asset class", () => {
    const { factors } = run.results!.factorVolatility;
    const alder = factors.find((f) => f.factor === "NMB-EQ-ALDER")!;
    expect(alder.estimates.map((e) => e.estimator)).toEqual(["ma", "ewma", "arch", "garch"]);
    // the demo method chooses GARCH(1,1) Student-t for equities (db/seed-method.ts)
    expect(alder.chosen).toMatchObject({ kind: "garch", distribution: "t" });
    expect(alder.chosenFrom).toBe("asset-class");
    const usd = factors.find((f) => f.factor === "USDEUR")!;
    expect(usd.assetClass).toBe("fx");
    expect(usd.chosen).toMatchObject({ kind: "ewma", lambda: 0.94 });
    expect(usd.chosenFrom).toBe("default");
    expect(usd.chosenVolatility).toBe(usd.estimates[1].currentVolatility);
  });

  it("stores the exact inputs, whose hashes are the ones recorded", () => {
    expect(inputs.positions).toHaveLength(56);
    // the positions' standardised attributes are stored with them (the demo bond's maturity and coupon)
    expect(inputs.positions.find((p) => p.instrument === "NMB-GB-AUR-2031")?.attributes).toMatchObject({ instrumentType: "bond", issuerCategory: "government", maturityDate: "2031-06-15", coupon: 2.25 });
    expect(inputs.method.version).toBe(1);
    // the seed loads the price history to 2026-11-20 (templates/demo/README.md); nothing after the period end is read
    expect(inputs.prices.dates.at(-1)).toBe("2026-11-20");
    expect(inputs.prices.dates.every((d) => d <= "2026-11-30")).toBe(true);
    expect(Object.keys(inputs.prices.factors)).toContain("USDEUR");
    expect(inputHashesOf(inputs)).toEqual(run.inputHashes);
    for (const h of Object.values(run.inputHashes!)) expect(h).toMatch(/^[0-9a-f]{64}$/);
  });

  it("gives the same hashes to the same inputs gathered again", async () => {
    const second = await startRun(analyst, periodId, { excludeShortHistory: true });
    // the start answers before reading the book: the worker gathers the inputs and records their hashes
    expect(second.inputHashes).toBeNull();
    await executeRun(second.id);
    expect((await getRun(analyst, second.id)).inputHashes).toEqual(run.inputHashes);
  }, 60_000);

  it("reproduces from the stored inputs: every figure matches", async () => {
    const reproduction = await reproduceRun(analyst, run.id);
    expect(reproduction.reproducesRunId).toBe(run.id);
    expect(reproduction.inputHashes).toEqual(run.inputHashes);
    await executeRun(reproduction.id);
    const done = await getRun(analyst, reproduction.id);
    expect(done.status).toBe("completed");
    const r = done.results!.reproduction!;
    expect(r.differences).toEqual([]);
    expect(r.matches).toBe(true);
    expect(r.compared).toBeGreaterThan(1000);
    expect(r.inputHashesMatch).toBe(true);
    expect(r.reasons).toEqual([]);
    expect(done.results!.inputs.fromStoredInputsOf).toBe(run.id);
  }, 60_000);

  it("reports exactly which figures differ, and why, when an input is tampered with in a copy", async () => {
    const copy: RunInputs = structuredClone(inputs);
    const closes = copy.prices.factors["NMB-EQ-ALDER"].closes;
    closes[closes.length - 1] = (closes[closes.length - 1] as number) * 1.1;
    const results = await computeRun(copy, { fromStoredInputsOf: run.id });
    const r = compareRuns({ id: run.id, results: run.results!, inputHashes: run.inputHashes, engineVersion: run.engineVersion }, { results, inputHashes: inputHashesOf(copy), engineVersion: ENGINE_VERSION });
    expect(r.matches).toBe(false);
    expect(r.inputHashesMatch).toBe(false);
    expect(r.reasons).toHaveLength(1);
    expect(r.reasons[0]).toMatch(/^The price history input differs from the one recorded with the original run/);
    const paths = r.differences.map((d) => d.path);
    expect(paths).toContain("monthEnd.methods[0].byConfidence[0].oneDay.var");
    // positions, method and capital profile inputs were not touched: their figures do not differ
    expect(paths.some((p) => p.startsWith("positions.") || p.startsWith("method.") || p.startsWith("capitalProfile."))).toBe(false);
  }, 60_000);

  it("names a change of engine version as a reason", () => {
    const r = compareRuns({ id: run.id, results: run.results!, inputHashes: run.inputHashes, engineVersion: "0.9.0" }, { results: run.results!, inputHashes: run.inputHashes!, engineVersion: ENGINE_VERSION });
    expect(r.matches).toBe(true);
    expect(r.reasons).toEqual([`The engine version changed from 0.9.0 to ${ENGINE_VERSION}.`]);
  });

  it("computes a factor's volatility detail from the stored inputs", () => {
    const d = volatilityDetail(inputs, "NMB-EQ-ALDER")!;
    expect(d.series.map((s) => s.estimator)).toEqual(["ma", "ewma", "arch", "garch"]);
    expect(d.series.find((s) => s.chosen)!.estimator).toBe("garch");
    expect(d.dates.length).toBe(d.returns.length);
    expect(d.squaredReturns[5]).toBe(d.returns[5] ** 2);
    for (const s of d.series) expect(s.volatility.length).toBe(d.dates.length);
    expect(d.termStructure!.volatility).toHaveLength(250);
    expect(volatilityDetail(inputs, "NOT-A-FACTOR")).toBeNull();
  });

  it("lists the period's runs with headline figures, newest first", async () => {
    const list = await listRuns(auditor, periodId);
    expect(list.length).toBeGreaterThanOrEqual(3);
    const mine = list.find((r) => r.id === run.id)!;
    expect(mine.headline!.varHorizon).toBe(run.results!.monthEnd.methods[0].byConfidence[0].horizon.var);
    expect("results" in mine).toBe(false);
  });

  it("marks one completed run for the filing, moving the mark when another is chosen", async () => {
    expect(await filingRunOf(analyst, periodId)).toBeNull();
    await useForFiling(analyst, run.id);
    expect((await filingRunOf(auditor, periodId))!.id).toBe(run.id);
    const other = (await listRuns(analyst, periodId)).find((r) => r.id !== run.id && r.status === "completed")!;
    await useForFiling(analyst, other.id);
    expect((await filingRunOf(analyst, periodId))!.id).toBe(other.id);
    expect((await getRun(analyst, run.id)).isFilingRun).toBe(false);
    await useForFiling(analyst, run.id);
    const marked = (await listRuns(analyst, periodId)).filter((r) => r.isFilingRun);
    expect(marked.map((r) => r.id)).toEqual([run.id]);
  });

  it("explains the change against an earlier period's filing run, or says there is none", async () => {
    const none = await runChange(analyst, run.id);
    expect(none.explanation).toBeNull();
    expect(none.note).toContain("No earlier period has a run chosen for its filing");
  });

  it("keeps another firm out of every run function", async () => {
    for (const attempt of [getRun(pellam, run.id), getRunInputs(pellam, run.id), reproduceRun(pellam, run.id), useForFiling(pellam, run.id), runChange(pellam, run.id), listRuns(pellam, periodId)]) {
      const error = await refusal(attempt);
      expect(error.kind).toBe("not_found");
    }
    expect(await filingRunOf(pellam, periodId)).toBeNull();
  });

  describe("triggers on finished runs", () => {
    it("refuses changing or deleting a completed run's results, inputs or hashes", async () => {
      const c = db.$client;
      await expect(c.execute({ sql: "UPDATE runs SET results = '{}' WHERE id = ?", args: [run.id] })).rejects.toThrow(/a finished run cannot be changed/);
      await expect(c.execute({ sql: "UPDATE runs SET input_hashes = '{}' WHERE id = ?", args: [run.id] })).rejects.toThrow(/a finished run cannot be changed/);
      await expect(c.execute({ sql: "UPDATE runs SET engine_version = '9.9.9' WHERE id = ?", args: [run.id] })).rejects.toThrow(/a finished run cannot be changed/);
      await expect(c.execute({ sql: "UPDATE runs SET status = 'failed' WHERE id = ?", args: [run.id] })).rejects.toThrow(/a finished run cannot be changed/);
      await expect(c.execute({ sql: "DELETE FROM runs WHERE id = ?", args: [run.id] })).rejects.toThrow(/a finished run cannot be deleted/);
      await expect(c.execute({ sql: "UPDATE run_inputs SET bytes = 1 WHERE run_id = ?", args: [run.id] })).rejects.toThrow(/stored inputs of a run cannot be changed/);
      await expect(c.execute({ sql: "DELETE FROM run_inputs WHERE run_id = ?", args: [run.id] })).rejects.toThrow(/stored inputs of a run cannot be deleted/);
      expect(inputHashesOf(await getRunInputs(analyst, run.id))).toEqual(run.inputHashes);
      expect((await getRun(analyst, run.id)).results).toEqual(run.results);
    });

    it("lets only the filing mark of a completed run change", async () => {
      const c = db.$client;
      await c.execute({ sql: "UPDATE runs SET is_filing_run = 0 WHERE id = ?", args: [run.id] });
      await c.execute({ sql: "UPDATE runs SET is_filing_run = 1 WHERE id = ?", args: [run.id] });
      expect((await getRun(analyst, run.id)).isFilingRun).toBe(true);
    });
  });
});

describe("one run at a time per period", () => {
  it("lets one of two runs started at once go ahead and tells the other", async () => {
    const outcomes = await Promise.allSettled([startRun(analyst, periodId, { excludeShortHistory: true }), startRun(analyst, periodId, { excludeShortHistory: true })]);
    const started = outcomes.filter((o) => o.status === "fulfilled") as PromiseFulfilledResult<RunRecord>[];
    const refused = outcomes.filter((o) => o.status === "rejected") as PromiseRejectedResult[];
    expect(started).toHaveLength(1);
    expect(refused).toHaveLength(1);
    expect(refused[0].reason).toBeInstanceOf(AppError);
    expect((refused[0].reason as AppError).code).toBe("conflict:run");
    expect((refused[0].reason as AppError).status).toBe(409);
    expect((refused[0].reason as AppError).message).toContain("already in progress");
    // a reproduction waits its turn too
    const completed = (await listRuns(analyst, periodId)).find((r) => r.status === "completed")!;
    expect((await refusal(reproduceRun(analyst, completed.id))).code).toBe("conflict:run");
    // the database itself refuses a second active run, whatever the code above does
    const row = (await db.select().from(runs).where(eq(runs.id, started[0].value.id)))[0];
    await expect(
      db.$client.execute({ sql: "INSERT INTO runs (id, firm_id, period_id, method_statement_id, positions_upload_id, status, started_by, created_at) VALUES ('x1', ?, ?, ?, ?, 'running', ?, ?)", args: [row.firmId, row.periodId, row.methodStatementId, row.positionsUploadId, row.startedBy, row.startedAt] }),
    ).rejects.toThrow(/UNIQUE constraint failed/);
    expect(await executeRun(started[0].value.id)).toBe("completed");
    // the slot is free again
    const next = await startRun(analyst, periodId, { excludeShortHistory: true });
    await executeRun(next.id);
  }, 120_000);
});

describe("failure and interruption", () => {
  it("stores why a run failed and leaves earlier runs as they were", async () => {
    const before = await listRuns(analyst, periodId);
    const completed = before.filter((r) => r.status === "completed");
    const original = await getRunInputs(analyst, completed[0].id);
    // a run whose stored inputs no longer match the hashes recorded at its start
    const row = (await db.select().from(runs).where(eq(runs.id, completed[0].id)))[0];
    const [queued] = await db
      .insert(runs)
      .values({ firmId: row.firmId, periodId, methodStatementId: row.methodStatementId, positionsUploadId: row.positionsUploadId, status: "queued", startedBy: analyst.userId, inputHashes: row.inputHashes, heartbeatAt: new Date().toISOString() })
      .returning();
    const tampered = structuredClone(original);
    tampered.positions[0].marketValue += 1;
    const { data, bytes } = await packInputs(tampered);
    await db.insert(runInputs).values({ runId: queued.id, firmId: row.firmId, data, bytes });
    expect(await executeRun(queued.id)).toBe("failed");
    const failed = await getRun(analyst, queued.id);
    expect(failed.status).toBe("failed");
    expect(failed.error).toBe("The run failed: the stored inputs no longer match the hashes recorded when the run started");
    expect(failed.results).toBeNull();
    const after = await listRuns(analyst, periodId);
    for (const r of before) expect(after.find((x) => x.id === r.id)).toEqual(r);
    // a failed run cannot be chosen for the filing, nor changed
    expect((await refusal(useForFiling(analyst, failed.id))).code).toBe("conflict:run");
    await expect(db.$client.execute({ sql: "UPDATE runs SET is_filing_run = 1 WHERE id = ?", args: [failed.id] })).rejects.toThrow(/only a completed run/);
  }, 60_000);

  it("marks a run left running by a stopped server as interrupted when it is next read", async () => {
    const row = (await db.select().from(runs).where(eq(runs.periodId, periodId)).limit(1))[0];
    const stale = "2026-01-01T00:00:00.000Z";
    const [left] = await db
      .insert(runs)
      .values({ firmId: row.firmId, periodId, methodStatementId: row.methodStatementId, positionsUploadId: row.positionsUploadId, status: "running", stage: "factor-volatility", progress: 0.2, startedBy: analyst.userId, startedAt: stale, heartbeatAt: stale })
      .returning();
    const read = await getRun(auditor, left.id);
    expect(read.status).toBe("failed");
    expect(read.error).toMatch(/^Interrupted: the worker computing this run stopped \(no heartbeat for 15 seconds\)\. Start the run again/);
    // and the period's slot is free for a new run
    const next = await startRun(analyst, periodId, { excludeShortHistory: true });
    expect(next.status).toBe("queued");
    await executeRun(next.id);
  }, 60_000);
});
