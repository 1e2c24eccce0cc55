/**
 * A fixed filing for the pack tests and the LibreOffice check, built the way the product builds one: stored run
 * inputs (a small synthetic book, seeded, with closes made from its returns) go through the runs' own computeRun, so
 * every figure is the engine's; the completed run goes through filingInputFromRun and buildFilingViewModel. The
 * firm and the people are the invented demo ones. Formula-looking text is planted in a position's instrument (which
 * has no prices and is left out), the cover note, the exception explanations and the method statement's limitations.
 */
import { beforeAll } from "vitest";
import { BASEL_CAPITAL_PROFILE } from "@/lib/risk/capital/capital";
import { computeRun } from "@/lib/runs/compute";
import { inputHashesOf } from "@/lib/runs/compare";
import type { RunInputs, RunRecord, StoredPosition } from "@/lib/runs/types";
import { dataQualityReport, type QualityPosition } from "@/lib/uploads/data-quality";
import { DEFAULT_METHOD_CONTENT } from "@/lib/validation/method";
import { correlationFromRunInputs, filingInputFromRun } from "@/reports/run-adapter";
import { buildFilingViewModel, contentHash, type FilingPackInput, type FilingViewModel } from "@/reports/view-model";
import { syntheticBook } from "../risk/portfolio/synthetic-book";

export const FORMULA_TEXT = '=HYPERLINK("x")';

const CLASS_MAP: Record<string, string> = { equity: "equity", bond: "government_bond", fund: "etf" };

/** Stored inputs of a EUR firm's run: the synthetic book with USD as the foreign currency (USDEUR its rate). */
function fixtureInputs(): RunInputs {
  const book = syntheticBook(8, 800, 20, 7);
  const dates = book.returns.dates;
  const periodEnd = dates[dates.length - 1];
  const closesOf = (rets: ArrayLike<number>): number[] => {
    const out: number[] = [];
    let level = 100;
    out.push(level);
    for (let t = 1; t < rets.length; t++) {
      level *= Math.exp(rets[t]);
      out.push(level);
    }
    return out;
  };
  const factors: RunInputs["prices"]["factors"] = {};
  for (const [id, rets] of Object.entries(book.returns.factors)) {
    const name = id === "EURUSD" ? "USDEUR" : id;
    const i = Number(id.slice(4));
    factors[name] = name === "USDEUR" ? { assetClass: "fx", currency: "USD", closes: closesOf(rets) } : { assetClass: CLASS_MAP[["equity", "bond", "fund"][i % 3]], currency: i % 4 === 0 ? "USD" : "EUR", closes: closesOf(rets) };
  }
  const usdRate = factors.USDEUR.closes[dates.length - 1] as number;
  const positions: StoredPosition[] = book.positions.map((p, j) => {
    const f = factors[p.instrument];
    const price = f.closes[dates.length - 1] as number;
    const currency = p.currency === "EUR" ? "USD" : "EUR";
    const rate = currency === "USD" ? usdRate : 1;
    return { row: j + 2, book: "Main", instrument: p.instrument, name: `Instrument ${p.instrument.slice(4)}`, assetClass: f.assetClass, currency, quantity: p.marketValue / (price * rate), price, marketValue: p.marketValue, deltaExposure: null, asOf: periodEnd };
  });
  // a position whose instrument has no prices: left out of every figure and listed; its name looks like a formula
  positions.push({ row: positions.length + 2, book: "Main", instrument: FORMULA_TEXT, name: "Unpriced note", assetClass: "other", currency: "EUR", quantity: 250, price: 100, marketValue: 25_000, deltaExposure: null, asOf: periodEnd });

  // the data-quality report from the real checks, with two planted problems
  const series = new Map<string, { dates: string[]; closes: number[] }>();
  for (const [id, f] of Object.entries(factors)) series.set(id, { dates: [...dates], closes: f.closes.map((c) => Math.round((c as number) * 10_000) / 10_000) });
  const stale = series.get("INST0003")!;
  for (let t = stale.closes.length - 6; t < stale.closes.length; t++) stale.closes[t] = stale.closes[stale.closes.length - 7];
  const qualityPositions: QualityPosition[] = positions.map((p, j) => ({ instrument: p.instrument, currency: p.currency, quantity: p.quantity, price: p.price, marketValue: j === 2 ? p.marketValue * 1.02 : p.marketValue }));
  const report = dataQualityReport(qualityPositions, series, { reportingCurrency: "EUR", periodEnd, minReturns: 250 });

  return {
    positions,
    prices: { dates: [...dates], factors },
    method: { id: "met_fixture_3", version: 3, approvedAt: "2026-10-14T09:30:00.000Z", content: DEFAULT_METHOD_CONTENT },
    capitalProfile: { id: null, name: "Default (Basel market-risk framework)", profile: BASEL_CAPITAL_PROFILE, plusFactors: { "5": 0.4, "6": 0.5, "7": 0.65, "8": 0.75, "9": 0.85, "10": 1 }, backtestDays: 250 },
    periodEnd,
    reportingCurrency: "EUR",
    context: {
      periodId: "per_fixture",
      upload: { uploadId: "upl_fixture", fileName: "northmoor-positions.csv" },
      dataQuality: { report, items: report.items.length, errors: report.counts.error, warnings: report.counts.warning },
    },
  };
}

export interface PackFixture {
  runInputs: RunInputs;
  run: RunRecord;
  input: FilingPackInput;
  vm: FilingViewModel;
  /** the same filing, signed over its own content hash, with an earlier signature superseded */
  signed: FilingViewModel;
}

let cached: Promise<PackFixture> | null = null;

/** Builds once per test file. */
export function packFixture(): Promise<PackFixture> {
  cached ??= build();
  return cached;
}

async function build(): Promise<PackFixture> {
  const runInputs = fixtureInputs();
  const results = await computeRun(runInputs);
  const run: RunRecord = {
    id: "run_fixture_0001",
    periodId: "per_fixture",
    status: "completed",
    stage: "done",
    progress: 1,
    inputHashes: inputHashesOf(runInputs),
    engineVersion: results.monthEnd.engineVersion,
    results,
    error: null,
    isFilingRun: true,
    reproducesRunId: null,
    startedBy: "usr_priya",
    startedByName: "Priya Castell",
    startedAt: "2026-12-01T09:00:00.000Z",
    finishedAt: "2026-12-01T09:00:04.000Z",
    methodVersion: { id: "met_fixture_3", version: 3 },
  };
  const exceptions = results.monthEnd.backtest.exceptionList;
  const explanations: Record<string, string> = {};
  if (exceptions[0]) explanations[exceptions[0].date] = "+2.1 % gap in government bond prices after the rate announcement; no model change needed.";
  if (exceptions[1]) explanations[exceptions[1].date] = "-Loss concentrated in two equity positions; see the cover note.";
  if (exceptions[2]) explanations[exceptions[2].date] = "@desk: exchange-rate move on the USD book.";

  const input = filingInputFromRun({
    run,
    correlation: correlationFromRunInputs(runInputs),
    method: {
      rationale:
        "EWMA with λ = 0.94 tracks the book's volatility closely enough for a monthly draft, and parametric VaR keeps the figures explainable to the board.\nHistorical simulation is shown beside it as a check.",
      limitations: ["The book's few option positions are carried at delta; their gamma is not captured.", "=SUM(A1:A9) is how the desk's own sheet totals the book; it is not used here."],
    },
    firm: { name: "Northmoor Brokerage Ltd", reportingCurrency: "EUR", regulatorName: "Financial Markets Authority (demo)", licenceLabel: "Registration no." },
    period: { end: runInputs.periodEnd, deadline: "2025-02-14" },
    filing: {
      id: "fil_fixture_0002",
      version: 2,
      previousVersion: 1,
      status: "in_review",
      preparedBy: "Tomas Reyne",
      submittedBy: "Tomas Reyne",
      coverNote: `${FORMULA_TEXT} was found in the positions file and is listed as left out.\nThe book is otherwise unchanged from the previous month.`,
      reason: "The reviewer asked for the exception explanations to be completed.",
      changesSinceLast: ["Exception explanations added for every backtest exception.", "Cover note rewritten."],
      exceptionExplanations: explanations,
    },
  });
  const vm = buildFilingViewModel(input);
  const signed = buildFilingViewModel({
    ...input,
    filing: { ...input.filing, status: "signed" },
    signature: { signerName: "Helen Marsh", licenceReference: "FMA-CO-20931", signedAt: "2026-12-03T15:42:00.000Z", contentHash: contentHash(vm) },
    supersededSignatures: [
      { version: 1, signerName: "Helen Marsh", licenceReference: "FMA-CO-20931", signedAt: "2026-12-02T11:05:00.000Z", contentHash: "5".repeat(64), supersededAt: "2026-12-02T16:00:00.000Z", reason: "Explanations were missing." },
    ],
  });
  return { runInputs, run, input, vm, signed };
}

/** The fixture's draft and its signed version, each built into a pack by `build` and read back by `read` (in that order). */
export async function builtPacks<T>(build: (vm: FilingViewModel) => Promise<Buffer>, read: (bytes: Buffer) => Promise<T>) {
  const f = await packFixture();
  const draftBytes = await build(f.vm);
  const draft = await read(draftBytes);
  const signed = await read(await build(f.signed));
  return { vm: f.vm, signedVm: f.signed, draftBytes, draft, signed };
}

export type BuiltPacks<T> = Awaited<ReturnType<typeof builtPacks<T>>>;

/** `builtPacks` in the test file's beforeAll: the object returned is filled in then, for the file's tests to read. */
export function packsBuiltBeforeAll<T>(build: (vm: FilingViewModel) => Promise<Buffer>, read: (bytes: Buffer) => Promise<T>): BuiltPacks<T> {
  const packs = {} as BuiltPacks<T>;
  beforeAll(async () => {
    Object.assign(packs, await builtPacks(build, read));
  });
  return packs;
}
