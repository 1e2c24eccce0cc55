/**
 * A fixed filing for the pack tests and the LibreOffice check: a real runMonthEnd on a small synthetic book (seeded,
 * so every figure is the engine's own), with the pieces a run stores beside its results computed the way a run
 * would (per-factor volatility by estimator, the correlation behind the parametric figures, the book's daily
 * P&L), a data-quality report from the real checks, and an invented firm and people. Formula-looking text is
 * planted in the cover note, an exception explanation, a position and a data-quality item.
 */
import { prepareRun, runMonthEnd, type MonthEndInput } from "@/lib/risk/portfolio/run-month-end";
import type { Position } from "@/lib/risk/portfolio/exposures";
import { fitEwma } from "@/lib/risk/estimators/ewma";
import { fitMovingAverage } from "@/lib/risk/estimators/moving-average";
import { fitGarch11 } from "@/lib/risk/estimators/garch11";
import { dataQualityReport, type QualityPosition } from "@/lib/uploads/data-quality";
import { DEFAULT_METHOD_CONTENT } from "@/lib/validation/method";
import { buildFilingViewModel, contentHash, type FactorVolatilityInput, type FilingPackInput, type FilingViewModel } from "@/reports/view-model";
import { syntheticBook } from "../risk/portfolio/synthetic-book";

export const FORMULA_TEXT = '=HYPERLINK("x")';

const CLASS_MAP: Record<string, string> = { equity: "equity", bond: "government_bond", fund: "etf" };

/** The synthetic book re-labelled for a EUR firm: USD is the foreign currency, USDEUR its exchange-rate factor. */
function bookForEurFirm(instruments: number, days: number, positionsCount: number, seed: number) {
  const book = syntheticBook(instruments, days, positionsCount, seed);
  const factors = { ...book.returns.factors } as Record<string, Float64Array>;
  factors.USDEUR = factors.EURUSD;
  delete factors.EURUSD;
  const positions: Position[] = book.positions.map((p) => ({
    ...p,
    assetClass: CLASS_MAP[p.assetClass ?? "equity"],
    currency: p.currency === "EUR" ? "USD" : "EUR",
  }));
  // a position whose instrument has no price history: left out of every figure, listed, and formula-looking
  positions.push({ instrument: FORMULA_TEXT, marketValue: 25_000, assetClass: "other", currency: "EUR" });
  return { positions, returns: { dates: book.returns.dates, factors } };
}

export interface PackFixture {
  input: FilingPackInput;
  vm: FilingViewModel;
  /** the same filing, signed over its own content hash */
  signed: FilingViewModel;
}

let cached: PackFixture | null = null;

/** Builds once per test file (the run takes well under a second). */
export function packFixture(): PackFixture {
  if (cached) return cached;
  const book = bookForEurFirm(8, 700, 20, 7);
  const runInput: MonthEndInput = {
    positions: book.positions,
    returns: book.returns,
    reportingCurrency: "EUR",
    method: { methods: ["parametric", "historical"], covariance: "ewma", lambda: 0.94 },
  };
  const results = runMonthEnd(runInput);
  const prepared = prepareRun(runInput);

  // the book's daily P&L (static book): exposure × return summed over the factors
  const pnlHistory = prepared.dates.map((date, t) => {
    let s = 0;
    for (let i = 0; i < prepared.factorIds.length; i++) s += prepared.exposures[i] * prepared.returns[i][t];
    return { date, pnl: s };
  });

  // each factor's one-day volatility under three estimators; the method statement chooses EWMA λ = 0.94
  const riskFactors: FactorVolatilityInput[] = prepared.factorIds.map((factor, i) => {
    const r = prepared.returns[i];
    const ma = fitMovingAverage(r, { window: 250 });
    const ewma = fitEwma(r, { lambda: 0.94 });
    const garch = fitGarch11(r, { mean: "zero", fallback: "ewma" });
    return {
      factor,
      estimates: [
        { estimator: "ma-250", label: "250-day moving average", volatility: Math.sqrt(ma.currentVariance) },
        { estimator: "ewma-0.94", label: "EWMA λ = 0.94", volatility: Math.sqrt(ewma.currentVariance) },
        { estimator: "garch", label: garch.kind === "garch" ? "GARCH(1,1)" : "GARCH(1,1), EWMA fallback", volatility: Math.sqrt(garch.currentVariance) },
      ],
      chosen: "ewma-0.94",
    };
  });

  // the correlation behind the parametric figures (from the EWMA covariance)
  const n = prepared.covariance.size;
  const v = prepared.covariance.values;
  const matrix = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => v[i * n + j] / Math.sqrt(v[i * n + i] * v[j * n + j])));

  // prices from the returns, then the real data-quality checks
  const series = new Map<string, { dates: string[]; closes: number[] }>();
  for (const [id, rets] of Object.entries(book.returns.factors)) {
    const closes: number[] = [];
    let level = 100;
    for (let t = 0; t < rets.length; t++) {
      level *= Math.exp(rets[t]);
      closes.push(Math.round(level * 10_000) / 10_000);
    }
    series.set(id, { dates: [...book.returns.dates], closes });
  }
  // planted: a stale close for INST0003 over its last six days
  const stale = series.get("INST0003")!;
  for (let t = stale.closes.length - 6; t < stale.closes.length; t++) stale.closes[t] = stale.closes[stale.closes.length - 7];
  const periodEnd = results.asOf;
  const qualityPositions: QualityPosition[] = book.positions.map((p, j) => {
    const s = series.get(p.instrument);
    const price = s ? s.closes[s.closes.length - 1] : 1;
    const rate = p.currency === "USD" ? series.get("USDEUR")!.closes.at(-1)! : 1;
    const quantity = p.marketValue / (price * rate);
    // planted: the third position's market value disagrees with quantity × price by 2 %
    return { instrumentId: p.instrument, currency: p.currency ?? "EUR", quantity, price, marketValue: j === 2 ? p.marketValue * 1.02 : p.marketValue };
  });
  const dataQuality = dataQualityReport(qualityPositions, series, { reportingCurrency: "EUR", periodEnd, minReturns: 250 });

  const exceptions = results.backtest.exceptionList;
  const explanations: Record<string, string> = {};
  if (exceptions[0]) explanations[exceptions[0].date] = "+2.1 % gap in government bond prices after the rate announcement; no model change needed.";
  if (exceptions[1]) explanations[exceptions[1].date] = "-Loss concentrated in two equity positions; see the cover note.";
  if (exceptions[2]) explanations[exceptions[2].date] = "@desk: exchange-rate move on the USD book.";

  const input: FilingPackInput = {
    results,
    run: {
      id: "run_fixture_0001",
      startedBy: "Priya Castell",
      inputHashes: {
        positions: "4b1f0c2d9e8a7b6c5d4e3f2a1b0c9d8e7f6a5b4c3d2e1f0a9b8c7d6e5f4a3b2c",
        prices: "9f8e7d6c5b4a39281706f5e4d3c2b1a09f8e7d6c5b4a39281706f5e4d3c2b1a0",
        method: "0a1b2c3d4e5f60718293a4b5c6d7e8f90a1b2c3d4e5f60718293a4b5c6d7e8f9",
      },
    },
    riskFactors,
    correlation: { factors: [...prepared.factorIds], matrix, basis: "EWMA covariance (λ = 0.94, zero mean) scaled to correlations" },
    pnlHistory,
    dataQuality,
    method: {
      version: 3,
      approvedAt: "2026-10-14T09:30:00.000Z",
      content: DEFAULT_METHOD_CONTENT,
      rationale:
        "EWMA with λ = 0.94 tracks the book's volatility closely enough for a monthly draft, and parametric VaR keeps the figures explainable to the board. Historical simulation is shown beside it as a check.",
      limitations: ["The book's few option positions are carried at delta; their gamma is not captured."],
    },
    firm: { name: "Northmoor Brokerage Ltd", reportingCurrency: "EUR", regulatorName: "Financial Markets Authority (demo)", licenceLabel: "Registration no." },
    period: { end: periodEnd, deadline: "2024-09-20" },
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
    signature: null,
    supersededSignatures: [],
  };
  const vm = buildFilingViewModel(input);
  const hash = contentHash(vm);
  const signed = buildFilingViewModel({
    ...input,
    filing: { ...input.filing, status: "signed" },
    signature: { signerName: "Helen Marsh", licenceReference: "FMA-CO-20931", signedAt: "2024-09-12T15:42:00.000Z", contentHash: hash },
    supersededSignatures: [
      { version: 1, signerName: "Helen Marsh", licenceReference: "FMA-CO-20931", signedAt: "2024-09-10T11:05:00.000Z", contentHash: "5".repeat(64), supersededAt: "2024-09-11T08:00:00.000Z", reason: "Explanations were missing." },
    ],
  });
  cached = { input, vm, signed };
  return cached;
}
