/**
 * A run's figures from its stored inputs: align the closes, leave out factors short of the method's minimum
 * history (listed), fit every factor's volatility under every estimator, run the engine, apply the firm's plus
 * factors. Pure apart from yielding between steps so that a server can report progress; the same inputs give the
 * same results, bit for bit.
 */
import { standardisedOfRun } from "./standardised";
import { capitalCharge, ENGINE_VERSION, prepareRun, runMonthEnd, type MonthEndInput, type MonthEndResult, type Position } from "@/lib/risk";
import type { ResolvedModel } from "@/lib/risk/process/types";
import { alignReturns, usableSeries, type Alignment } from "./align";
import { factorVolatility, OTHER_SETTINGS_STATEMENT } from "./factor-volatility";
import { engineMethodOf, firmPlusFactor, runStatements, storedHistoryDays } from "./method-map";
import { readMethodContent } from "@/lib/validation/method";
import type { FactorVolatility, PositionsSummary, RunInputs, RunResults, StoredPosition } from "./types";
import { defaultFxFactorId } from "@/lib/risk/portfolio/exposures";

export type RunProgress = (stage: string, fraction: number) => void | Promise<void>;

/** What the inputs allow before anything is computed: factors short of the minimum history, positions without any. */
export interface HistoryAssessment {
  minHistory: number;
  /** factors (price and exchange-rate) the book needs, with their usable returns */
  factors: { factor: string; returns: number }[];
  short: { factor: string; reason: string }[];
  /** positions whose own price factor is short or absent */
  positionsAffected: string[];
  /** positions whose price factor has enough history */
  positionsUsable: number;
}

/** Factor id of a position's price, and the positions' instrument label (book and instrument). */
export const priceFactorOf = (p: StoredPosition): string => p.instrument;
export const positionLabelOf = (p: StoredPosition): string => `${p.book} · ${p.instrument}`;
/** The exchange-rate factor of a currency against the reporting currency (the engine's one definition). */
export const fxFactorOf = defaultFxFactorId;

/** The factors a book needs: each position's price factor and, for a foreign position, its exchange-rate factor. */
export function neededFactors(positions: readonly StoredPosition[], reportingCurrency: string): Map<string, { assetClass: string; currency: string }> {
  const out = new Map<string, { assetClass: string; currency: string }>();
  for (const p of positions) {
    if (!out.has(priceFactorOf(p))) out.set(priceFactorOf(p), { assetClass: p.assetClass, currency: p.currency });
  }
  for (const p of positions) {
    if (p.currency !== reportingCurrency) {
      const fx = fxFactorOf(p.currency, reportingCurrency);
      if (!out.has(fx)) out.set(fx, { assetClass: "fx", currency: p.currency });
    }
  }
  return out;
}

export function assessHistory(inputs: RunInputs, alignment: Alignment = alignReturns(inputs.prices)): HistoryAssessment {
  const minHistory = inputs.method.content.minHistory;
  const needed = neededFactors(inputs.positions, inputs.reportingCurrency);
  const factors: HistoryAssessment["factors"] = [];
  const short: HistoryAssessment["short"] = [];
  for (const [factor, meta] of needed) {
    const inPrices = factor in inputs.prices.factors;
    const returns = inPrices ? alignment.usableReturns[factor] ?? 0 : 0;
    factors.push({ factor, returns });
    if (!inPrices) {
      // a missing exchange-rate series is the engine's to report (the position stays in, without its currency risk)
      if (meta.assetClass !== "fx") short.push({ factor, reason: "no price history up to the period end" });
    } else if (returns < minHistory) {
      short.push({ factor, reason: `${returns} returns up to the period end without a break; the method statement's minimum history is ${minHistory}` });
    }
  }
  const shortSet = new Set(short.map((s) => s.factor));
  const positionsAffected = inputs.positions.filter((p) => shortSet.has(priceFactorOf(p))).map(positionLabelOf);
  return { minHistory, factors, short, positionsAffected, positionsUsable: inputs.positions.length - positionsAffected.length };
}

export function positionsSummary(inputs: RunInputs, upload: { uploadId: string; fileName: string }): PositionsSummary {
  const byClass = new Map<string, { count: number; marketValue: number }>();
  const byCurrency = new Map<string, { count: number; marketValue: number }>();
  let gross = 0;
  let net = 0;
  for (const p of inputs.positions) {
    gross += Math.abs(p.marketValue);
    net += p.marketValue;
    const c = byClass.get(p.assetClass) ?? { count: 0, marketValue: 0 };
    c.count++;
    c.marketValue += p.marketValue;
    byClass.set(p.assetClass, c);
    const k = byCurrency.get(p.currency) ?? { count: 0, marketValue: 0 };
    k.count++;
    k.marketValue += p.marketValue;
    byCurrency.set(p.currency, k);
  }
  return {
    uploadId: upload.uploadId,
    fileName: upload.fileName,
    asOf: inputs.positions[0]?.asOf ?? null,
    rows: inputs.positions.length,
    grossMarketValue: gross,
    netMarketValue: net,
    byAssetClass: [...byClass].map(([assetClass, v]) => ({ assetClass, ...v })).sort((a, b) => a.assetClass.localeCompare(b.assetClass)),
    byCurrency: [...byCurrency].map(([currency, v]) => ({ currency, ...v })).sort((a, b) => a.currency.localeCompare(b.currency)),
  };
}

/** The engine's input for stored inputs: positions by book and instrument, returns of the factors with enough history. */
export function engineInputOf(inputs: RunInputs, alignment: Alignment = alignReturns(inputs.prices), assessment: HistoryAssessment = assessHistory(inputs, alignment)): MonthEndInput {
  const short = new Set(assessment.short.map((s) => s.factor));
  const factors: Record<string, ArrayLike<number>> = {};
  for (const [id, r] of Object.entries(alignment.returns.factors)) if (!short.has(id)) factors[id] = r;
  const positions: Position[] = inputs.positions.map((p) => ({
    instrument: positionLabelOf(p),
    factor: priceFactorOf(p),
    marketValue: p.marketValue,
    assetClass: p.assetClass,
    currency: p.currency,
    ...(p.deltaExposure !== null ? { deltaExposure: p.deltaExposure } : {}),
  }));
  return {
    positions,
    returns: { dates: alignment.returns.dates, factors },
    reportingCurrency: inputs.reportingCurrency,
    fxFactorId: fxFactorOf,
    method: engineMethodOf(readMethodContent(inputs.method.content), inputs.capitalProfile, { candidates: true }),
    capitalProfile: inputs.capitalProfile.profile,
  };
}

export interface ComputeContext {
  /** set on a reproduction: the run whose stored inputs these are */
  fromStoredInputsOf: string | null;
}

/**
 * The backtest day by day: the static book's P&L on each backtest day (exposures × that day's factor returns, as the
 * engine computes it) against the one-day VaR forecast made with data up to the day before (the VaR history point
 * dated the day before). The exceptions marked here are the engine's rule: a loss strictly greater than the VaR.
 */
export function backtestSeriesOf(input: MonthEndInput, monthEnd: MonthEndResult): RunResults["backtestSeries"] {
  const prepared = prepareRun(input);
  const { dates, returns, exposures } = prepared;
  const L = dates.length;
  const pnl = new Float64Array(L);
  for (let i = 0; i < exposures.length; i++) for (let t = 0; t < L; t++) pnl[t] += exposures[i] * returns[i][t];
  const ci = monthEnd.confidences.indexOf(monthEnd.backtest.confidence);
  const forecastFor = new Map<string, number>();
  for (const p of monthEnd.varHistory.points) forecastFor.set(p.asOf, p.var1d[ci]);
  const out: RunResults["backtestSeries"] = { confidence: monthEnd.backtest.confidence, method: monthEnd.backtest.method, dates: [], pnl: [], var: [], exception: [] };
  for (let s = L - monthEnd.backtest.days; s < L; s++) {
    const v = forecastFor.get(dates[s - 1]);
    if (v === undefined) continue;
    out.dates.push(dates[s]);
    out.pnl.push(pnl[s]);
    out.var.push(v);
    out.exception.push(-pnl[s] > v);
  }
  return out;
}

/**
 * The chosen estimate of each factor as the engine fitted it for the portfolio figures (label, parameters, one-day
 * volatility), so that the factor report and the figures cannot disagree.
 */
export function alignChosenWithEngine(factors: FactorVolatility[], model: ResolvedModel): void {
  if (model.covariance !== "per-factor") return;
  const byFactor = new Map(model.factors.map((f) => [f.factor, f]));
  for (const f of factors) {
    const r = byFactor.get(f.factor);
    if (!r) continue;
    const vol = Math.sqrt(r.variance);
    f.chosenVolatility = Number.isFinite(vol) ? vol : null;
    f.chosenAnnualisedVolatility = f.chosenVolatility === null ? null : f.chosenVolatility * Math.sqrt(252);
    f.chosenParams = Object.fromEntries(Object.entries(r.params).filter(([, v]) => Number.isFinite(v)));
    f.chosenLabel = r.fallback ? `${r.label} (fallback from ${r.fallback.label})` : r.label;
  }
}

/** Which estimator drives what, in words, from what the engine used. */
export function factorVolatilityStatement(monthEnd: MonthEndResult): string {
  if (monthEnd.model?.covariance === "per-factor") {
    return "Each factor's chosen estimator (by its asset class, exchange-rate factors by the FX class, the firm-wide default otherwise) is the volatility in the portfolio figures: value-at-risk, expected shortfall, the backtest and capital.";
  }
  const cov = monthEnd.model?.covariance ?? "ewma";
  return `The portfolio figures use one ${cov === "equal" ? "equal-weight" : cov === "ewma" ? "EWMA" : "GARCH(1,1) constant-correlation"} covariance for every factor, as the method statement chooses; the estimator chosen for each factor's asset class gives the factor volatility reported here and does not enter the portfolio figures.`;
}

const yieldNow = () => new Promise<void>((resolve) => setImmediate(resolve));

/** Every figure of a run from its inputs. */
export async function computeRun(inputs: RunInputs, context: ComputeContext = { fromStoredInputsOf: null }, onProgress?: RunProgress): Promise<RunResults> {
  const alignment = alignReturns(inputs.prices);
  const assessment = assessHistory(inputs, alignment);
  // content stored before the per-asset-class choices is read as what it computed (never rewritten)
  const content = readMethodContent(inputs.method.content);
  const shortReason = new Map(assessment.short.map((s) => [s.factor, s.reason]));
  await onProgress?.("inputs", 1);

  // every factor's volatility under every estimator, yielding between factors
  const needed = neededFactors(inputs.positions, inputs.reportingCurrency);
  const ids = [...needed.keys()].filter((id) => id in inputs.prices.factors).sort();
  const factors: FactorVolatility[] = [];
  for (let i = 0; i < ids.length; i++) {
    const id = ids[i];
    const meta = inputs.prices.factors[id];
    factors.push(factorVolatility(id, { assetClass: meta.assetClass, currency: meta.currency }, usableSeries(alignment, id), content, shortReason.get(id) ?? null));
    await onProgress?.("factor-volatility", (i + 1) / ids.length);
    await yieldNow();
  }

  // the engine (synchronous); its stages are reported once it returns
  const input = engineInputOf(inputs, alignment, assessment);
  const stages: [string, number][] = [];
  const monthEnd = runMonthEnd(input, (stage, fraction) => {
    stages.push([stage, fraction]);
  });
  for (const [stage, fraction] of stages.filter(([, f]) => f === 1)) await onProgress?.(stage, fraction);
  // the engine returns the series it backtested; runs of an engine without it rebuild it from the prepared run
  const backtestSeries = monthEnd.backtestSeries ? { ...monthEnd.backtestSeries } : backtestSeriesOf(input, monthEnd);
  if (monthEnd.model) alignChosenWithEngine(factors, monthEnd.model);
  const keep = storedHistoryDays(inputs.capitalProfile);
  monthEnd.varHistory = { ...monthEnd.varHistory, points: monthEnd.varHistory.points.slice(-keep) };
  monthEnd.choices = { ...monthEnd.choices, historyDays: monthEnd.varHistory.points.length };

  // the firm's plus factors, where they differ from the engine's table
  const notes = [...runStatements(monthEnd, input.method!), OTHER_SETTINGS_STATEMENT];
  const bt = monthEnd.backtest;
  const firmPlus = firmPlusFactor(inputs.capitalProfile.plusFactors, bt.exceptions);
  if (firmPlus !== monthEnd.capital.plusFactor) {
    const profile = inputs.capitalProfile.profile;
    const ci = monthEnd.confidences.indexOf(profile.confidence);
    const horizonOf = (p: (typeof monthEnd.varHistory.points)[number]) =>
      profile.horizonDays === 1 ? p.var1d[ci] : profile.horizonDays === monthEnd.horizonDays ? p.varHorizon[ci] : p.var1d[ci] * Math.sqrt(profile.horizonDays);
    const history = monthEnd.varHistory.points.slice(-profile.averagingDays).map(horizonOf);
    const sVar = monthEnd.capital.stressedVarLast ?? 0;
    const capital = capitalCharge({ varHistory: history, stressedVarHistory: history.map(() => sVar), plusFactor: firmPlus }, profile);
    notes.push(`Capital uses the firm's plus factor table: ${bt.exceptions} exception(s) give a plus factor of ${firmPlus} (the engine's default table gives ${monthEnd.capital.plusFactor}).`);
    monthEnd.capital = { ...capital, stressedVarStatement: monthEnd.capital.stressedVarStatement };
  }
  await onProgress?.("capital", 1);

  const excluded = [...assessment.short];
  for (const e of monthEnd.factors.excluded) if (!excluded.some((x) => x.factor === e.factor)) excluded.push(e);
  const closes = Object.values(inputs.prices.factors).reduce((s, f) => s + f.closes.filter((c) => c !== null).length, 0);
  const dates = inputs.prices.dates;

  return {
    monthEnd,
    engineMethod: input.method!,
    backtestSeries,
    factorVolatility: {
      factors,
      statement: factorVolatilityStatement(monthEnd),
    },
    dataQuality: inputs.context.dataQuality,
    positions: positionsSummary(inputs, inputs.context.upload),
    method: { id: inputs.method.id, version: inputs.method.version, approvedAt: inputs.method.approvedAt, content },
    capitalProfile: inputs.capitalProfile,
    inputs: {
      periodId: inputs.context.periodId,
      periodEnd: inputs.periodEnd,
      reportingCurrency: inputs.reportingCurrency,
      positions: { uploadId: inputs.context.upload.uploadId, fileName: inputs.context.upload.fileName, rows: inputs.positions.length },
      prices: { factors: Object.keys(inputs.prices.factors).length, firstDate: dates[0] ?? null, lastDate: dates[dates.length - 1] ?? null, closes, rule: alignment.rule + (alignment.droppedDates.length ? ` ${alignment.droppedDates.length} date(s) left out: ${alignment.droppedDates.slice(0, 5).map((d) => `${d.date} (${d.missing.join(", ")})`).join("; ")}${alignment.droppedDates.length > 5 ? "; …" : ""}.` : "") },
      excludedFactors: excluded,
      fromStoredInputsOf: context.fromStoredInputsOf,
    },
    notes,
    reproduction: null,
    standardised: standardisedOfRun(inputs),
  };
}

export { ENGINE_VERSION };
