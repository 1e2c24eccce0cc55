/**
 * The filing's view model: one plain object with everything a filing pack shows, built from a run's stored results
 * (MonthEndResult and the pieces stored beside it), the method statement version, the data-quality report, the
 * firm's profile and the filing itself. Both pack builders take only this object, so they test without a database.
 * Pure: no I/O, no clock. Figures are kept exactly as the engine produced them (formatting happens in the packs);
 * `canonicalContent` / `contentHash` (./canonical) serialise the part that is signed.
 */
import type { MonthEndResult, VarMethod } from "@/lib/risk/portfolio/run-month-end";
import type { RegulatoryCapitalView } from "./regulatory-capital";
import type { QualityReport, QualitySeverity } from "@/lib/uploads/data-quality";
import { CHECK_LABELS } from "@/lib/uploads/data-quality";
import type { MethodContent } from "@/lib/validation/method";
import { ASSET_CLASS_LABELS, VAR_METHOD_LABELS } from "@/lib/domain/labels";
import { DRAFT_CAUTION } from "@/lib/domain/caution";
import { describeComputedMethod } from "./method-text";

const MODEL_SOURCE_WORDS: Record<string, string> = { factor: "the factor", "asset-class": "its asset class", default: "the firm-wide default", legacy: "the one covariance model" };
import { formatMonth } from "./format";
import { defaultFxFactorId } from "@/lib/risk/portfolio/exposures";

export { canonicalContent, contentHash, CANONICAL_SCHEMA } from "./canonical";

export type FilingStatus = "draft" | "in_review" | "changes_requested" | "signed" | "filed";

export const FILING_STATUS_LABELS: Record<FilingStatus, string> = {
  draft: "Draft",
  in_review: "In review",
  changes_requested: "Changes requested",
  signed: "Signed",
  filed: "Filed",
};

export { VAR_METHOD_LABELS };

/* ------------------------------------------------------------------------------------------------------------ */
/* The view model                                                                                               */
/* ------------------------------------------------------------------------------------------------------------ */

export interface SignOffBlock {
  signerName: string;
  licenceReference: string;
  /** ISO timestamp (UTC) */
  signedAt: string;
  /** SHA-256 hex of the canonical content signed */
  contentHash: string;
}

export interface SupersededSignature extends SignOffBlock {
  /** the filing version the signature was given to */
  version: number;
  supersededAt: string;
  reason: string;
}

/** VaR and ES of the whole book at one confidence. `horizon` is over `horizonDays` (10 by default). */
export interface TotalFigure {
  confidence: number;
  oneDay: { var: number; es: number };
  horizon: { var: number; es: number };
  /** Σ stand-alone VaR by asset class − total VaR */
  diversificationBenefit1d: number;
  diversificationBenefitHorizon: number;
}

export interface MethodTotals {
  method: VarMethod;
  label: string;
  primary: boolean;
  /** one-day standard deviation of the book's P&L (reporting currency) */
  portfolioVolatility: number;
  scalingStatement: string;
  /** scenarios behind a simulation, null for parametric */
  scenarios: number | null;
  byConfidence: TotalFigure[];
}

export interface AssetClassFigure {
  assetClass: string;
  label: string;
  componentVar1d: number;
  componentEs1d: number;
  componentVarHorizon: number;
  componentEsHorizon: number;
  standAloneVar1d: number;
  standAloneEs1d: number;
  standAloneVarHorizon: number;
  standAloneEsHorizon: number;
}

export interface PositionContributionRow {
  instrument: string;
  assetClass: string;
  currency: string;
  marketValue: number;
  exposure: number;
  componentVar1d: number;
  componentEs1d: number;
  componentVarHorizon: number;
  componentEsHorizon: number;
  /** component VaR per unit of market value */
  marginalVar: number;
  /** component VaR ÷ total one-day VaR */
  shareOfVar: number;
}

export interface CurrencyContribution {
  currency: string;
  componentVar1d: number;
  componentEs1d: number;
  componentVarHorizon: number;
  componentEsHorizon: number;
}

export interface ContributionSet {
  confidence: number;
  byPosition: PositionContributionRow[];
  byAssetClass: AssetClassFigure[];
  byCurrency: CurrencyContribution[];
}

export interface CapitalFigures {
  capital: number;
  formula: string;
  confidence: number;
  horizonDays: number;
  averagingDays: number;
  varLast: number;
  varAverage: number;
  multiplierBase: number;
  plusFactor: number;
  multiplier: number;
  varTerm: number;
  varBinding: "last" | "average";
  includesStressed: boolean;
  stressedVarLast: number | null;
  stressedVarAverage: number | null;
  stressedMultiplierBase: number;
  stressedMultiplier: number | null;
  stressedVarTerm: number;
  stressedBinding: "last" | "average" | null;
  statement: string;
}

export interface StressedFiguresView {
  method: VarMethod;
  window: { start: string; end: string; days: number; chosenBy: "search" | "analyst" };
  searchRule: string | null;
  windowsSearched: number | null;
  byConfidence: { confidence: number; oneDay: { var: number; es: number }; horizon: { var: number; es: number } }[];
  statement: string;
}

export interface BacktestExceptionRow {
  date: string;
  pnl: number;
  var: number;
  excess: number;
  /** the compliance officer's explanation, "" when none was given */
  explanation: string;
}

export interface BacktestFigures {
  method: VarMethod;
  days: number;
  confidence: number;
  exceptions: number;
  expectedExceptions: number;
  zone: "green" | "yellow" | "red";
  plusFactor: number;
  plusFactorRule: string;
  cumulativeProbability: number;
  kupiec: { lr: number; pValue: number; observedRate: number; expectedRate: number };
  christoffersen: { lrInd: number; pValueInd: number; lrCc: number; pValueCc: number } | null;
  exceptionRule: string;
  statement: string;
  exceptionList: BacktestExceptionRow[];
  /** P&L against the VaR forecast for the same day, where the run stored the P&L; oldest first */
  pnlVsVar: { date: string; pnl: number; var: number; exception: boolean }[];
}

export interface VarHistoryRow {
  /** last date of data; the figures are the VaR for the next business day */
  asOf: string;
  /** by confidence, in the order of `figures.confidences` */
  var1d: number[];
  es1d: number[];
  varHorizon: number[];
  esHorizon: number[];
  /** the book's P&L on the day the forecast is for, where known */
  pnlNext: number | null;
}

export interface PositionRow {
  instrument: string;
  assetClass: string;
  assetClassLabel: string;
  currency: string;
  marketValue: number;
  exposure: number | null;
  /** one-day component VaR at the capital confidence (null for a position left out) */
  componentVar1d: number | null;
  included: boolean;
  note: string;
}

export interface RiskFactorRow {
  factor: string;
  kind: "price" | "exchange rate";
  /** summed exposure of the book to the factor (reporting currency) */
  exposure: number;
  /** one-day volatility (decimal) under each estimator the run computed */
  estimates: { estimator: string; label: string; volatility: number | null }[];
  chosen: string | null;
  chosenLabel: string | null;
  chosenVolatility: number | null;
}

export interface CorrelationView {
  factors: string[];
  matrix: number[][];
  /** what the matrix is, in words */
  basis: string;
}

export interface FilingFigures {
  asOf: string;
  currency: string;
  primaryMethod: VarMethod;
  confidences: number[];
  horizonDays: number;
  /** the confidence of the capital rule, backtest and the per-position figures */
  capitalConfidence: number;
  totals: MethodTotals[];
  /** primary method, by confidence */
  byAssetClass: { confidence: number; rows: AssetClassFigure[] }[];
  stressed: StressedFiguresView;
  capital: CapitalFigures;
  backtest: BacktestFigures;
  varHistory: { method: VarMethod; statement: string; points: VarHistoryRow[] };
  positions: PositionRow[];
  riskFactors: RiskFactorRow[];
  /** what the factor volatilities are and how they relate to the portfolio figures ("" when not stated) */
  riskFactorStatement: string;
  excludedFactors: { factor: string; reason: string }[];
  correlation: CorrelationView | null;
  contributions: ContributionSet[];
  /** which capital figure is filed, the other beside it, the standardised blocks (absent in content stored before regimes) */
  regulatoryCapital?: RegulatoryCapitalView | null;
}

export interface FilingViewModel {
  firm: { name: string; reportingCurrency: string; regulator: string; licenceLabel: string };
  period: { end: string; deadline: string | null; label: string };
  filing: {
    id: string | null;
    version: number;
    previousVersion: number | null;
    status: FilingStatus;
    preparedBy: string;
    submittedBy: string | null;
    coverNote: string;
    /** why this version replaces the previous one ("" for a first version) */
    reason: string;
    changesSinceLast: string[];
    exceptionExplanations: { date: string; text: string }[];
    filedAt: string | null;
    filingReference: string | null;
  };
  /** null while unsigned */
  signOff: SignOffBlock | null;
  supersededSignatures: SupersededSignature[];
  figures: FilingFigures;
  method: {
    version: number;
    approvedAt: string | null;
    content: MethodContent | null;
    /** what the run computed, in sentences generated from its resolved model (the content only for older runs) */
    sentences: string[];
    rationale: string;
    /** each factor's volatility model as the run fitted it (empty for runs stored before runs kept their model) */
    models?: MethodModelRow[];
    /** the candidate methods backtested on this book by the run, side by side (null when the run has none) */
    candidates?: MethodCandidatesView | null;
  };
  limitations: { source: "engine" | "backtest" | "method statement"; text: string }[];
  dataQuality: {
    counts: Record<QualitySeverity, number>;
    items: { check: string; label: string; severity: QualitySeverity; instrument: string; message: string; dates: string[] }[];
  };
  engine: {
    version: string;
    runId: string;
    startedBy: string;
    inputHashes: { name: string; hash: string }[];
    sample: { days: number; firstDate: string; lastDate: string };
    choices: { name: string; value: string }[];
    warnings: { code: string; message: string }[];
    /** statements the run adds beyond the engine's */
    notes: string[];
  };
  caution: string;
}

/** One factor's volatility model as the run fitted it for its figures. */
export interface MethodModelRow {
  factor: string;
  assetClass: string | null;
  /** where the model came from: the factor, its asset class, the firm-wide default, the one covariance model */
  source: string;
  label: string;
  parameters: string;
  startUp: string;
  /** one-day volatility forecast */
  volatility: number;
}

/** The candidate methods backtested on the firm's book by the run. */
export interface MethodCandidatesView {
  days: number;
  confidence: number;
  statement: string;
  rows: { label: string; exceptions: number | null; zone: string | null; kupiecPValue: number | null; christoffersenPValue: number | null; meanVar: number | null; capital: number | null; error: string | null }[];
}

/* ------------------------------------------------------------------------------------------------------------ */
/* What the builder takes                                                                                       */
/* ------------------------------------------------------------------------------------------------------------ */

/** One factor's one-day volatility under each estimator, and the estimator the method statement chose for it. */
export interface FactorVolatilityInput {
  factor: string;
  estimates: { estimator: string; label: string; volatility: number | null }[];
  chosen: string;
  /** the chosen estimator with its settings, e.g. "EWMA, λ = 0.94" (default: the estimate's label) */
  chosenLabel?: string;
}

export interface FilingPackInput {
  results: MonthEndResult;
  run: { id: string; startedBy: string; inputHashes: Record<string, string> };
  /** per-factor volatilities by estimator, where the run stored them; otherwise the run's own volatility models */
  riskFactors?: FactorVolatilityInput[] | null;
  /** the correlation matrix behind the parametric figures, where the run stored it */
  correlation?: CorrelationView | null;
  /** the book's daily hypothetical P&L (static book), where the run stored it */
  pnlHistory?: { date: string; pnl: number }[] | null;
  /** the backtest day by day (P&L against the VaR forecast for the day), where the run stored it */
  backtestSeries?: { dates: string[]; pnl: number[]; var: number[]; exception: boolean[] } | null;
  /** what the risk factors' volatilities are, in words */
  riskFactorStatement?: string;
  /** statements the run adds beyond the engine's */
  runNotes?: string[];
  /** which capital figure the run's profile files and the other beside it (reports/regulatory-capital.ts) */
  regulatoryCapital?: RegulatoryCapitalView | null;
  dataQuality: QualityReport | null;
  method: { version: number; content: MethodContent | null; rationale: string; limitations: string[]; approvedAt?: string | null };
  firm: { name: string; reportingCurrency: string; regulatorName: string; licenceLabel: string };
  period: { end: string; deadline?: string | null };
  filing: {
    id?: string | null;
    version: number;
    previousVersion?: number | null;
    status: FilingStatus;
    preparedBy: string;
    submittedBy?: string | null;
    coverNote?: string;
    reason?: string;
    changesSinceLast?: string[];
    /** explanation by exception date (yyyy-mm-dd) */
    exceptionExplanations?: Record<string, string>;
    filedAt?: string | null;
    filingReference?: string | null;
  };
  signature?: SignOffBlock | null;
  supersededSignatures?: SupersededSignature[];
}

/* ------------------------------------------------------------------------------------------------------------ */
/* The builder                                                                                                  */
/* ------------------------------------------------------------------------------------------------------------ */

function assetClassLabel(cls: string): string {
  return (ASSET_CLASS_LABELS as Record<string, string>)[cls] ?? cls;
}

function choiceText(value: string | number | number[] | string[]): string {
  return Array.isArray(value) ? value.join("; ") : String(value);
}

/** The first index whose date is strictly after `date` in an ascending list, or -1. */
function firstAfter(dates: readonly string[], date: string): number {
  let lo = 0;
  let hi = dates.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (dates[mid] <= date) lo = mid + 1;
    else hi = mid;
  }
  return lo < dates.length ? lo : -1;
}

/**
 * Map a run's stored results and the filing's data into the view model.
 * @throws {RangeError} when the pieces disagree (currency, an explanation for a day that is not an exception, a
 * correlation matrix that is not square, a signature without a hash)
 */
export function buildFilingViewModel(input: FilingPackInput): FilingViewModel {
  const r = input.results;
  if (r.reportingCurrency !== input.firm.reportingCurrency) {
    throw new RangeError(`The run is in ${r.reportingCurrency} but the firm reports in ${input.firm.reportingCurrency}.`);
  }
  const primary = r.methods.find((m) => m.method === r.primaryMethod);
  if (!primary) throw new RangeError(`The run's results have no figures for its primary method "${r.primaryMethod}".`);
  const capitalConfidence = r.capital.profile.confidence;
  const ci = r.confidences.indexOf(capitalConfidence);
  if (ci < 0) throw new RangeError(`The run's results have no figures at the capital confidence ${capitalConfidence}.`);
  const atCapital = primary.byConfidence[ci];

  const totals: MethodTotals[] = r.methods.map((m) => ({
    method: m.method,
    label: VAR_METHOD_LABELS[m.method],
    primary: m.method === r.primaryMethod,
    portfolioVolatility: m.portfolioVolatility,
    scalingStatement: m.scalingStatement,
    scenarios: m.scenarios,
    byConfidence: m.byConfidence.map((c) => ({
      confidence: c.confidence,
      oneDay: { var: c.oneDay.var, es: c.oneDay.es },
      horizon: { var: c.horizon.var, es: c.horizon.es },
      diversificationBenefit1d: c.diversificationBenefit,
      diversificationBenefitHorizon: c.diversificationBenefitHorizon,
    })),
  }));

  const assetClassRows = (c: (typeof primary.byConfidence)[number]): AssetClassFigure[] =>
    Object.entries(c.byAssetClass).map(([cls, g]) => ({
      assetClass: cls,
      label: assetClassLabel(cls),
      componentVar1d: g.componentVar,
      componentEs1d: g.componentEs,
      componentVarHorizon: g.componentVarHorizon,
      componentEsHorizon: g.componentEsHorizon,
      standAloneVar1d: g.standAloneVar,
      standAloneEs1d: g.standAloneEs,
      standAloneVarHorizon: g.standAloneVarHorizon,
      standAloneEsHorizon: g.standAloneEsHorizon,
    }));

  const contributions: ContributionSet[] = primary.byConfidence.map((c) => ({
    confidence: c.confidence,
    byPosition: c.contributions.map((p) => ({
      instrument: p.instrument,
      assetClass: p.assetClass,
      currency: p.currency,
      marketValue: p.marketValue,
      exposure: p.exposure,
      componentVar1d: p.componentVar,
      componentEs1d: p.componentEs,
      componentVarHorizon: p.componentVarHorizon,
      componentEsHorizon: p.componentEsHorizon,
      marginalVar: p.marginalVar,
      shareOfVar: c.oneDay.var !== 0 ? p.componentVar / c.oneDay.var : 0,
    })),
    byAssetClass: assetClassRows(c),
    byCurrency: Object.entries(c.byCurrency).map(([currency, g]) => ({
      currency,
      componentVar1d: g.componentVar,
      componentEs1d: g.componentEs,
      componentVarHorizon: g.componentVarHorizon,
      componentEsHorizon: g.componentEsHorizon,
    })),
  }));

  // positions: included ones in the engine's order, then the ones left out
  const positions: PositionRow[] = [
    ...atCapital.contributions.map((p) => ({
      instrument: p.instrument,
      assetClass: p.assetClass,
      assetClassLabel: assetClassLabel(p.assetClass),
      currency: p.currency,
      marketValue: p.marketValue,
      exposure: p.exposure,
      componentVar1d: p.componentVar,
      included: true,
      note: "",
    })),
    ...r.excludedPositions.map((p) => ({
      instrument: p.instrument,
      assetClass: "",
      assetClassLabel: "",
      currency: "",
      marketValue: p.marketValue,
      exposure: null,
      componentVar1d: null,
      included: false,
      note: p.reason,
    })),
  ];

  // risk factors
  const exposureOf = new Map(atCapital.byFactor.map((f) => [f.factor, f.exposure]));
  const fxIds = new Set(atCapital.contributions.filter((p) => p.currency !== r.reportingCurrency).map((p) => defaultFxFactorId(p.currency, r.reportingCurrency)));
  const kindOf = (f: string): RiskFactorRow["kind"] => (fxIds.has(f) ? "exchange rate" : "price");
  let riskFactors: RiskFactorRow[];
  if (input.riskFactors && input.riskFactors.length) {
    const given = new Map(input.riskFactors.map((f) => [f.factor, f]));
    riskFactors = r.factors.used.map((factor) => {
      const f = given.get(factor);
      const estimates = f ? f.estimates.map((e) => ({ estimator: e.estimator, label: e.label, volatility: e.volatility })) : [];
      const chosen = f ? (estimates.find((e) => e.estimator === f.chosen) ?? null) : null;
      if (f && !chosen) throw new RangeError(`Risk factor ${factor}: the chosen estimator "${f.chosen}" has no estimate.`);
      return { factor, kind: kindOf(factor), exposure: exposureOf.get(factor) ?? 0, estimates, chosen: chosen?.estimator ?? null, chosenLabel: chosen ? (f?.chosenLabel ?? chosen.label) : null, chosenVolatility: chosen?.volatility ?? null };
    });
  } else if (r.volatilityModels) {
    riskFactors = r.volatilityModels.map((v) => ({
      factor: v.factor,
      kind: kindOf(v.factor),
      exposure: exposureOf.get(v.factor) ?? 0,
      estimates: [{ estimator: v.model, label: v.model, volatility: v.currentVolatility }],
      chosen: v.model,
      chosenLabel: v.model,
      chosenVolatility: v.currentVolatility,
    }));
  } else {
    riskFactors = r.factors.used.map((factor) => ({ factor, kind: kindOf(factor), exposure: exposureOf.get(factor) ?? 0, estimates: [], chosen: null, chosenLabel: null, chosenVolatility: null }));
  }

  let correlation: CorrelationView | null = null;
  if (input.correlation) {
    const c = input.correlation;
    if (c.matrix.length !== c.factors.length || c.matrix.some((row) => row.length !== c.factors.length)) {
      throw new RangeError(`The correlation matrix must be ${c.factors.length} × ${c.factors.length}, one row and column per factor.`);
    }
    correlation = { factors: [...c.factors], matrix: c.matrix.map((row) => [...row]), basis: c.basis };
  }

  // backtest, with the explanations joined by date
  const explanations = input.filing.exceptionExplanations ?? {};
  const exceptionDates = new Set(r.backtest.exceptionList.map((e) => e.date));
  for (const date of Object.keys(explanations)) {
    if (!exceptionDates.has(date)) throw new RangeError(`There is an explanation for ${date}, which is not a backtest exception of this run.`);
  }
  const series = input.backtestSeries;
  if (series && !(series.dates.length === series.pnl.length && series.dates.length === series.var.length && series.dates.length === series.exception.length)) {
    throw new RangeError("The backtest series needs one P&L, VaR and exception flag per date.");
  }
  const pnl = input.pnlHistory
    ? [...input.pnlHistory].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0))
    : series
      ? series.dates.map((date, i) => ({ date, pnl: series.pnl[i] }))
      : null;
  const pnlDates = pnl?.map((p) => p.date) ?? [];
  const points: VarHistoryRow[] = r.varHistory.points.map((p) => {
    const k = pnl ? firstAfter(pnlDates, p.asOf) : -1;
    return { asOf: p.asOf, var1d: [...p.var1d], es1d: [...p.es1d], varHorizon: [...p.varHorizon], esHorizon: [...p.esHorizon], pnlNext: k >= 0 && pnl ? pnl[k].pnl : null };
  });
  const pnlVsVar: BacktestFigures["pnlVsVar"] = [];
  if (series) {
    series.dates.forEach((date, i) => pnlVsVar.push({ date, pnl: series.pnl[i], var: series.var[i], exception: series.exception[i] }));
  } else if (pnl) {
    for (const p of points) {
      const k = firstAfter(pnlDates, p.asOf);
      if (k < 0) continue;
      const v = p.var1d[ci];
      pnlVsVar.push({ date: pnl[k].date, pnl: pnl[k].pnl, var: v, exception: -pnl[k].pnl > v });
    }
  }
  const bt = r.backtest;
  const backtest: BacktestFigures = {
    method: bt.method,
    days: bt.days,
    confidence: bt.confidence,
    exceptions: bt.exceptions,
    expectedExceptions: bt.days * (1 - bt.confidence),
    zone: bt.zone,
    plusFactor: bt.plusFactor,
    plusFactorRule: bt.trafficLight.plusFactorRule,
    cumulativeProbability: bt.trafficLight.cumulativeProbability,
    kupiec: { lr: bt.kupiec.lr, pValue: bt.kupiec.pValue, observedRate: bt.kupiec.observedRate, expectedRate: bt.kupiec.expectedRate },
    christoffersen: bt.christoffersen ? { lrInd: bt.christoffersen.lrInd, pValueInd: bt.christoffersen.pValueInd, lrCc: bt.christoffersen.lrCc, pValueCc: bt.christoffersen.pValueCc } : null,
    exceptionRule: bt.exceptionRule,
    statement: bt.statement,
    exceptionList: bt.exceptionList.map((e) => ({ date: e.date, pnl: e.pnl, var: e.var, excess: e.excess, explanation: explanations[e.date] ?? "" })),
    pnlVsVar,
  };

  const cap = r.capital;
  const capital: CapitalFigures = {
    capital: cap.capital,
    formula: cap.formula,
    confidence: cap.profile.confidence,
    horizonDays: cap.profile.horizonDays,
    averagingDays: cap.averagingDays,
    varLast: cap.varLast,
    varAverage: cap.varAverage,
    multiplierBase: cap.profile.multiplierBase,
    plusFactor: cap.plusFactor,
    multiplier: cap.multiplier,
    varTerm: cap.varTerm,
    varBinding: cap.varBinding,
    includesStressed: cap.profile.includeStressed,
    stressedVarLast: cap.stressedVarLast,
    stressedVarAverage: cap.stressedVarAverage,
    stressedMultiplierBase: cap.profile.stressedMultiplierBase,
    stressedMultiplier: cap.stressedMultiplier,
    stressedVarTerm: cap.stressedVarTerm,
    stressedBinding: cap.stressedBinding,
    statement: cap.stressedVarStatement,
  };

  const s = r.stressed;
  const stressed: StressedFiguresView = {
    method: s.method,
    window: { ...s.window },
    searchRule: s.searchRule,
    windowsSearched: s.windowsSearched,
    byConfidence: s.byConfidence.map((c) => ({ confidence: c.confidence, oneDay: { var: c.oneDay.var, es: c.oneDay.es }, horizon: { var: c.horizon.var, es: c.horizon.es } })),
    statement: s.statement,
  };

  const limitations: FilingViewModel["limitations"] = [];
  const seen = new Set<string>();
  const addLimitation = (source: FilingViewModel["limitations"][number]["source"], text: string) => {
    if (seen.has(text)) return;
    seen.add(text);
    limitations.push({ source, text });
  };
  for (const t of r.limitations) addLimitation("engine", t);
  for (const t of bt.limitations) addLimitation("backtest", t);
  for (const t of input.method.limitations) addLimitation("method statement", t);

  const dq = input.dataQuality;
  if (input.signature && !/^[0-9a-f]{64}$/.test(input.signature.contentHash)) {
    throw new RangeError("A signature needs the SHA-256 of the content it signed (64 lower-case hex characters).");
  }

  return {
    firm: { name: input.firm.name, reportingCurrency: input.firm.reportingCurrency, regulator: input.firm.regulatorName, licenceLabel: input.firm.licenceLabel },
    period: { end: input.period.end, deadline: input.period.deadline ?? null, label: formatMonth(input.period.end) },
    filing: {
      id: input.filing.id ?? null,
      version: input.filing.version,
      previousVersion: input.filing.previousVersion ?? null,
      status: input.filing.status,
      preparedBy: input.filing.preparedBy,
      submittedBy: input.filing.submittedBy ?? null,
      coverNote: input.filing.coverNote ?? "",
      reason: input.filing.reason ?? "",
      changesSinceLast: [...(input.filing.changesSinceLast ?? [])],
      exceptionExplanations: Object.entries(explanations)
        .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
        .map(([date, text]) => ({ date, text })),
      filedAt: input.filing.filedAt ?? null,
      filingReference: input.filing.filingReference ?? null,
    },
    signOff: input.signature ? { ...input.signature } : null,
    supersededSignatures: (input.supersededSignatures ?? []).map((x) => ({ ...x })),
    figures: {
      asOf: r.asOf,
      currency: r.reportingCurrency,
      primaryMethod: r.primaryMethod,
      confidences: [...r.confidences],
      horizonDays: r.horizonDays,
      capitalConfidence,
      totals,
      byAssetClass: primary.byConfidence.map((c) => ({ confidence: c.confidence, rows: assetClassRows(c) })),
      stressed,
      capital,
      backtest,
      varHistory: { method: r.varHistory.method, statement: r.varHistory.statement, points },
      positions,
      riskFactors,
      riskFactorStatement: input.riskFactorStatement ?? "",
      excludedFactors: r.factors.excluded.map((f) => ({ ...f })),
      correlation,
      contributions,
      regulatoryCapital: input.regulatoryCapital ?? null,
    },
    method: {
      version: input.method.version,
      approvedAt: input.method.approvedAt ?? null,
      content: input.method.content,
      sentences: describeComputedMethod(r, input.method.content),
      rationale: input.method.rationale,
      models: (r.model?.factors ?? []).map((m) => ({
        factor: m.factor,
        assetClass: m.assetClass,
        source: MODEL_SOURCE_WORDS[m.source] ?? m.source,
        label: m.fallback ? `${m.label} (fallback from ${m.fallback.label})` : m.label,
        parameters: Object.entries(m.params)
          .filter(([, v]) => Number.isFinite(v))
          .map(([k, v]) => `${k} = ${Number(v.toPrecision(4))}`)
          .join(", "),
        startUp: m.startUp,
        volatility: Math.sqrt(m.variance),
      })),
      candidates: r.candidates
        ? {
            days: r.candidates.days,
            confidence: r.candidates.confidence,
            statement: r.candidates.statement,
            // the run's own row is described by the models table and sentences beside it
            rows: r.candidates.rows.map((c) => ({ label: c.id === "this-method" ? "This run's method (above)" : c.label, exceptions: c.exceptions, zone: c.zone, kupiecPValue: c.kupiecPValue, christoffersenPValue: c.christoffersenPValue, meanVar: c.meanVar, capital: c.capital, error: c.error })),
          }
        : null,
    },
    limitations,
    dataQuality: {
      counts: dq ? { ...dq.counts } : { error: 0, warning: 0, info: 0 },
      items: (dq?.items ?? []).map((i) => ({
        check: i.check,
        label: CHECK_LABELS[i.check] ?? i.check,
        severity: i.severity,
        instrument: i.instrument,
        // a confirmed item says who confirmed it, when and why, in the pack as on the data-quality page
        message: i.confirmation ? `${i.message} Confirmed by ${i.confirmation.by} on ${i.confirmation.at.slice(0, 16).replace("T", " ")} UTC: ${i.confirmation.reason}` : i.message,
        dates: [...(i.dates ?? [])],
      })),
    },
    engine: {
      version: r.engineVersion,
      runId: input.run.id,
      startedBy: input.run.startedBy,
      inputHashes: Object.entries(input.run.inputHashes)
        .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
        .map(([name, hash]) => ({ name, hash })),
      sample: { ...r.sample },
      choices: Object.entries(r.choices).map(([name, value]) => ({ name, value: choiceText(value) })),
      warnings: r.warnings.map((w) => ({ code: w.code, message: w.message })),
      notes: [...(input.runNotes ?? [])],
    },
    caution: DRAFT_CAUTION,
  };
}
