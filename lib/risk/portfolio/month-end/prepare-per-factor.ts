/** Preparing a run with per-factor volatility processes (D·R·D): today's fits, the correlation, the covariance. */
import type { EngineWarning } from "../../types";
import { checkPsd } from "../psd";
import { correlationToCovariance } from "../matrix";
import type { CorrelationSpec, ProcessFit, ResolvedCorrelation } from "../../process/types";
import { correlationOf, describeCorrelation, factorHorizonVariance, firstDefinedDay, fitFactor, type FactorSpec } from "../per-factor";
import { countOf, listSome } from "../../../text/count";
import { nearestCorrelationRepair, psdWarnings, stripMatrix } from "./matrix-checks";
import type { PreparedRun, ProgressCallback, RunSample, VolatilityModel } from "./types";

/** What preparePerFactor needs: the working sample and what prepareRun found about it. */
export interface PerFactorInput extends RunSample {
  method: PreparedRun["method"];
  excludedFactors: PreparedRun["excludedFactors"];
  excludedPositions: PreparedRun["excludedPositions"];
  warnings: EngineWarning[];
  specs: FactorSpec[];
  onProgress?: ProgressCallback;
}

/** Prepare a run with per-factor processes: today's fits, R by the chosen estimator (repaired if need be), D·R·D. */
export function preparePerFactor(x: PerFactorInput): PreparedRun {
  const { method, returns, specs, warnings } = x;
  const k = returns.length;
  const L = x.dates.length;
  const H = method.horizonDays;
  const fits: ProcessFit[] = [];
  for (let i = 0; i < k; i++) {
    fits.push(fitFactor(returns[i], specs[i]));
    if (i % 25 === 0) x.onProgress?.("volatility", i / k);
  }
  // warnings of the fits, grouped by code
  const byCode = new Map<string, string[]>();
  const fellBack: string[] = [];
  fits.forEach((f, i) => {
    if (f.fallback) fellBack.push(`${x.factorIds[i]} (${f.fallback.reason})`);
    for (const w of f.fit.warnings) {
      if (w.code === "fallback-used" || (f.fallback && (w.code === "near-integrated" || w.code === "not-converged"))) continue;
      const list = byCode.get(w.code) ?? [];
      list.push(x.factorIds[i]);
      byCode.set(w.code, list);
    }
  });
  if (fellBack.length) warnings.push({ code: "volatility-fallback", message: `The chosen process failed or was near-integrated for ${countOf(fellBack.length, "factor")}; its stated EWMA fallback is used instead: ${listSome(fellBack, 10)}.` });
  for (const [code, list] of byCode) warnings.push({ code: `volatility-${code}`, message: `Volatility fit warning "${code}" for ${countOf(list.length, "factor")}: ${listSome(list, 10)}.` });
  x.onProgress?.("volatility", 1);

  const firstDefined = firstDefinedDay(specs);
  const term = method.scaling === "term";
  const variance = fits.map((f) => f.variance);
  const current = Float64Array.from(fits, (f) => f.nextVariance);
  const horizonVariance = Float64Array.from(fits, (f, i) => factorHorizonVariance(f, f.nextVariance, returns[i], L, H, term));
  const corrSpec = method.correlation as CorrelationSpec;
  if (corrSpec.kind === "ccc" && L - firstDefined < 2) throw new RangeError(`runMonthEnd: the constant correlation needs at least 2 days after the longest moving-average window (${firstDefined} days)`);
  const raw = correlationOf(corrSpec, returns, variance, L, firstDefined);
  const check = checkPsd(raw);
  const repair = check.status === "indefinite" ? nearestCorrelationRepair(raw) : null;
  const correlation = repair ? repair.matrix : raw;
  const covariance = correlationToCovariance(correlation, current.map(Math.sqrt));
  const psd: PreparedRun["psd"] = { matrix: "correlation", check, repair: repair && stripMatrix(repair) };
  psdWarnings(psd, warnings);
  x.onProgress?.("covariance", 1);
  const desc = describeCorrelation(corrSpec, L);
  const correlationInfo: ResolvedCorrelation = {
    spec: corrSpec, label: desc.label, statement: desc.statement, check: check.status,
    repair: repair && { method: repair.method, frobeniusDistance: repair.frobeniusChange, iterations: 0, negativeEigenvaluesBefore: repair.negativeEigenvalues, minEigenvalueBefore: repair.minEigenvalueBefore },
  };
  const volatility: VolatilityModel = {
    variance,
    current,
    params: fits.map((f) => ({ omega: f.params.omega ?? 0, alpha: f.params.alpha ?? 0, beta: f.params.beta ?? 0 })),
    labels: fits.map((f) => f.label),
    paramsOut: fits.map((f) => ({ ...f.params })),
  };
  return {
    dates: x.dates, factorIds: x.factorIds, returns, exposures: x.exposures, loadings: x.loadings, positions: x.positions, covariance, correlation, volatility,
    perFactor: { specs, fits, correlationSpec: corrSpec, correlationInfo, firstDefined, term, horizonVariance },
    psd, method, excludedFactors: x.excludedFactors, excludedPositions: x.excludedPositions, warnings,
  };
}
