/** The month-end run itself: the stages in order (figures, stressed VaR, history, backtest, capital, candidates) and the result. */
import { ENGINE_VERSION } from "../../version";
import { runBacktest } from "../../backtest/backtest";
import { trafficLight } from "../../backtest/traffic-light";
import { capitalCharge } from "../../capital/capital";
import type { CandidateEvidence, ResolvedModel, StoredBacktestSeries } from "../../process/types";
import { candidateRows, failedRow, methodOfCandidate, rowFromSeries, standardCandidates, type CandidateContext } from "../candidates";
import { varCore, type VarCore } from "./figures";
import { varHistory } from "./history";
import { describeChoices, describeLimitations, modelLimitations, resolveModel, storedCorrelation } from "./statements";
import { stressedVar } from "./stressed";
import type { MonthEndInput, MonthEndResult, ProgressCallback } from "./types";

/** What the candidate evidence compares against: this run's backtest, capital averages, stressed VaR and model. */
interface OwnFigures {
  btFrom: number;
  btVar: Float64Array;
  capVars: number[];
  sVar: number;
  model: ResolvedModel;
}

/** Candidate-method evidence on the book (each candidate a run of its own over the same days), when the method asks for it. */
function candidateEvidence(input: MonthEndInput, core: VarCore, own: OwnFigures, onProgress?: ProgressCallback): CandidateEvidence | undefined {
  const { prepared, dates, pnl, method, profile } = core;
  const { btFrom, btVar, capVars, sVar, model } = own;
  const primary = method.primaryMethod;
let candidates: CandidateEvidence | undefined;
const ask = method.candidates;
if (ask && (ask.include === "standard" || (ask.extra?.length ?? 0) > 0)) {
  const list = [...(ask.include === "standard" ? standardCandidates(ask.archOrder ?? 5) : []), ...(ask.extra ?? [])];
  const ctx: CandidateContext = {
    dates, pnl, backtestFrom: btFrom, refit: method.backtestRefit.mode === "full-sample" && !prepared.perFactor ? { mode: "rolling", everyDays: 21 } : method.backtestRefit,
    confidence: profile.confidence, profile, stressedVar: profile.includeStressed ? sVar : null, term: method.scaling === "term",
  };
  const ownRow = rowFromSeries({ id: "this-method", label: `This run's method: ${model.statements[0] ?? primary}`, basis: "method" }, ctx, btVar, capVars);
  const given = list.filter((c) => c.basis === "method").map((c) => {
    try {
      const other = runMonthEnd({ ...input, method: methodOfCandidate(input.method, c) });
      const ci2 = other.confidences.indexOf(profile.confidence);
      const pts = other.varHistory.points;
      const cap2 = pts.slice(-profile.averagingDays).map((p) => (profile.horizonDays === 1 ? p.var1d[ci2] : profile.horizonDays === other.horizonDays ? p.varHorizon[ci2] : p.var1d[ci2] * Math.sqrt(profile.horizonDays)));
      const series = other.backtestSeries as StoredBacktestSeries;
      if (series.dates.length !== btVar.length || series.dates[0] !== dates[btFrom]) throw new RangeError(`its backtest covers ${series.dates.length} days from ${series.dates[0]}, not the run's ${btVar.length} from ${dates[btFrom]}`);
      return rowFromSeries(c, ctx, series.var, cap2);
    } catch (error) {
      return failedRow(c, (error as Error).message);
    }
  });
  candidates = candidateRows(ctx, list, [ownRow, ...given]);
  onProgress?.("candidates", 1);
}
  return candidates;
}

/**
 * The month-end run: every figure a filing needs, in one plain object.
 * @param input positions, aligned factor returns, reporting currency, method and capital rule profile
 * @param onProgress optional callback with a stage name and the fraction done
 * @throws {RangeError} on impossible input (misaligned returns, no usable position, bad options)
 */
export function runMonthEnd(input: MonthEndInput, onProgress?: ProgressCallback): MonthEndResult {
  const core = varCore(input, onProgress);
  const { prepared, dates, factorIds, volatility, method, warnings, L, H, profile, confidences, pnl, W, scalingFor, methodFigures } = core;
  const primary = method.primaryMethod;
  const { stressed, S } = stressedVar(core);
  const chosenBy = stressed.window.chosenBy;
  const stressedByConfidence = stressed.byConfidence;
  onProgress?.("stressed", 1);

  const { from, var1, var10, points } = varHistory(core, onProgress);
  const B = method.backtestDays;

  // backtest: the book's P&L on day s against the one-day VaR forecast for s, at the profile's confidence
  const ci = confidences.indexOf(profile.confidence);
  const btFrom = Math.max(from, L - B);
  const btDates = dates.slice(btFrom, L);
  const btPnl = pnl.subarray(btFrom, L);
  const btVar = var1[ci].subarray(btFrom - from, L - from);
  const bt = btDates.length > 0 ? runBacktest(btDates, btPnl, btVar, profile.confidence) : null;
  if (!bt) throw new RangeError("runMonthEnd: no past days are available for the backtest");
  warnings.push(...bt.warnings);
  onProgress?.("backtest", 1);

  // capital under the profile: VaR and sVaR at the profile's horizon, 60-day averages
  const horizonOf = (n: number, c: number, arr1: Float64Array[], arr10: Float64Array[]) => (profile.horizonDays === 1 ? arr1[c][n] : profile.horizonDays === H ? arr10[c][n] : arr1[c][n] * Math.sqrt(profile.horizonDays));
  const capVars: number[] = [];
  for (let s = Math.max(from, L - profile.averagingDays + 1); s <= L; s++) capVars.push(horizonOf(s - from, ci, var1, var10));
  if (capVars.length < profile.averagingDays) throw new RangeError(`runMonthEnd: capital needs ${profile.averagingDays} days of VaR history, the sample gives ${capVars.length}`);
  const sCi = stressedByConfidence[ci];
  const sVar = profile.horizonDays === 1 ? sCi.oneDay.var : profile.horizonDays === H ? sCi.horizon.var : sCi.oneDay.var * Math.sqrt(profile.horizonDays);
  const plusFactor = bt.days === 250 ? bt.plusFactor : trafficLight(bt.days, bt.exceptions, 1 - profile.confidence).plusFactor;
  const capital = capitalCharge({ varHistory: capVars, stressedVarHistory: new Array(capVars.length).fill(sVar), plusFactor }, profile);
  onProgress?.("capital", 1);

  const limitations = describeLimitations(method, scalingFor, L, W, H);
  const choices: MonthEndResult["choices"] = {
    ...describeChoices(method, scalingFor, L, W, H, confidences),
    primaryMethod: primary,
    stressWindow: chosenBy === "search" ? `searched: the ${S}-day window with the highest VaR` : "chosen by the analyst",
    historyDays: points.length,
    backtestDays: bt.days,
    varHistoryRule: "static book: today's exposures applied to each past day's inputs; one forecast per day using data up to the day before",
    capitalProfile: `m_c = ${profile.multiplierBase} + plus factor, m_s = ${profile.stressedMultiplierBase}${profile.plusFactorOnStressed ? " + plus factor" : ""}, ${profile.averagingDays}-day averages, ${profile.confidence * 100} %, ${profile.horizonDays}-day`,
  };


  // the backtest day by day, the resolved model and the correlation, stored with the run
  const backtestSeries: StoredBacktestSeries = { confidence: profile.confidence, method: primary, dates: [], pnl: [], var: [], exception: [] };
  for (let s = btFrom; s < L; s++) {
    backtestSeries.dates.push(dates[s]);
    backtestSeries.pnl.push(pnl[s]);
    backtestSeries.var.push(var1[ci][s - from]);
    backtestSeries.exception.push(-pnl[s] > var1[ci][s - from]);
  }
  const model = resolveModel(prepared, scalingFor, L, H);
  limitations.push(...modelLimitations(model, prepared));

  const candidates = candidateEvidence(input, core, { btFrom, btVar, capVars, sVar, model }, onProgress);

  return {
    engineVersion: ENGINE_VERSION,
    asOf: dates[L - 1],
    reportingCurrency: input.reportingCurrency,
    confidences,
    horizonDays: H,
    primaryMethod: primary,
    methods: methodFigures,
    stressed,
    varHistory: { method: primary, points, statement: "Static book: today's positions valued with each past day's inputs. Each point is the VaR for the next business day using data up to its date; the last point is today's figure." },
    backtest: { ...bt, method: primary, statement: `Hypothetical P&L of today's book on each of the last ${bt.days} days against that day's one-day ${profile.confidence * 100} % VaR forecast from the day before (${primary}).` },
    capital: { ...capital, stressedVarStatement: "Static book and a fixed stress window: the stressed VaR is the same on each of the averaging days." },
    covarianceCheck: prepared.psd,
    volatilityModels: volatility
      ? factorIds.map((f, i) => ({ factor: f, model: volatility.labels[i], params: volatility.paramsOut[i], currentVolatility: Math.sqrt(volatility.current[i]) }))
      : null,
    factors: { used: factorIds, excluded: prepared.excludedFactors },
    excludedPositions: prepared.excludedPositions,
    sample: { days: L, firstDate: dates[0], lastDate: dates[L - 1] },
    choices,
    warnings,
    limitations,
    model,
    correlation: storedCorrelation(prepared),
    backtestSeries,
    ...(candidates ? { candidates } : {}),
  };
}
