/** The month-end run's statements: the resolved model, the stored correlation, limitations and choices in words. */
import { HISTORICAL_QUANTILE_CONVENTION } from "../../var/historical";
import { describeScaling, garchHorizonVariance } from "../../var/scaling";
import { covarianceToCorrelation, matrixToRows } from "../matrix";
import type { CorrelationSpec, ResolvedCorrelation, ResolvedFactorModel, ResolvedModel, StoredCorrelation } from "../../process/types";
import { describeCorrelation, describeRefit, resolvedFactor } from "../per-factor";
import { specLabel, specStartUp } from "../../process/registry";
import { describeInit, type InitRule } from "../../estimators/initial-variance";
import { countOf, listSome } from "../../../text/count";
import type { MonthEndResult, PreparedRun, Scaler } from "./types";

const SQRT_STATEMENT = "square-root-of-time scaling assumes independent, identically distributed returns and understates risk when returns are positively autocorrelated";

/** The correlation behind the parametric figures, as stored with a run. */
export function storedCorrelation(prepared: PreparedRun): StoredCorrelation {
  const m = prepared.correlation ?? covarianceToCorrelation(prepared.covariance).correlation;
  const method = prepared.method;
  const L = prepared.dates.length;
  const basis = prepared.perFactor
    ? describeCorrelation(prepared.perFactor.correlationSpec, L).label
    : method.covariance === "garch-ccc"
      ? "Constant correlation of the GARCH(1,1)-standardised returns"
      : method.covariance === "ewma"
        ? `EWMA covariance (λ = ${method.lambda}, zero mean) scaled to correlations`
        : `Equal-weight covariance over ${Math.min(method.covarianceWindow, L)} days (zero mean) scaled to correlations`;
  return { factors: [...prepared.factorIds], matrix: matrixToRows(m), basis };
}

/** The factor records of the legacy single-covariance paths. */
function legacyFactors(prepared: PreparedRun, H: number, term: boolean): ResolvedFactorModel[] {
  const method = prepared.method;
  const L = prepared.dates.length;
  const k = prepared.factorIds.length;
  const cov = prepared.covariance;
  const vm = prepared.volatility;
  return prepared.factorIds.map((factor, i) => {
    let spec: ResolvedFactorModel["spec"];
    let label: string;
    let params: Record<string, number>;
    let variance = cov.values[i * k + i];
    let process: ResolvedFactorModel["process"];
    let fallback: ResolvedFactorModel["fallback"] = null;
    let horizon = H * variance;
    if (method.covariance === "garch-ccc" && vm) {
      spec = { kind: "garch", distribution: "normal", mean: "zero", targeting: false, fallback: "ewma", fallbackLambda: 0.94, init: "sample" };
      variance = vm.current[i];
      params = { ...vm.paramsOut[i] };
      process = vm.labels[i].startsWith("garch") ? "garch" : "ewma";
      label = process === "garch" ? specLabel(spec, params) : `EWMA, λ = ${params.lambda ?? method.lambda}, zero mean (${vm.labels[i].includes("failed") ? "GARCH(1,1) could not be fitted" : "fallback from GARCH(1,1)"})`;
      if (process === "ewma") fallback = { from: "garch", reason: vm.labels[i].includes("failed") ? "not-converged" : "near-integrated", label: specLabel(spec) };
      horizon = term ? garchHorizonVariance(variance, vm.params[i], H) : H * variance;
    } else if (method.covariance === "equal") {
      const w = Math.min(method.covarianceWindow, L);
      spec = { kind: "ma", window: w, divisor: "m", mean: "zero" };
      process = "ma";
      label = specLabel(spec);
      params = { window: w };
    } else {
      spec = { kind: "ewma", lambda: method.lambda, fit: false, init: { firstReturns: Math.min(method.startupDays, L) } };
      process = "ewma";
      label = specLabel(spec);
      params = { lambda: method.lambda };
    }
    return {
      factor, assetClass: null, source: "legacy", spec, process, label, params, parameterNames: Object.keys(params),
      startUp: spec.kind === "ma" ? specStartUp(spec) : describeInit((spec as { init: InitRule }).init),
      fallback, variance, horizonVariance: horizon, longRunVariance: null, logLikelihood: null, warnings: [], limitations: [],
    };
  });
}

/** Group factors by label for a sentence: "GARCH(1,1), … for 3 factors (equity: A, B, C)". */
function volatilitySentence(factors: readonly ResolvedFactorModel[]): string {
  const groups = new Map<string, ResolvedFactorModel[]>();
  for (const f of factors) {
    const key = `${specLabel(f.spec)}|${f.startUp}`;
    const list = groups.get(key) ?? [];
    list.push(f);
    groups.set(key, list);
  }
  const parts = [...groups.values()].map((list) => {
    const classes = [...new Set(list.map((f) => f.assetClass ?? "unclassified"))];
    const names = list.slice(0, 6).map((f) => f.factor).join(", ") + (list.length > 6 ? ", …" : "");
    return `${specLabel(list[0].spec)} (start-up: ${list[0].startUp}) for ${countOf(list.length, "factor")} (${classes.join(", ")}: ${names})`;
  });
  const fell = factors.filter((f) => f.fallback);
  const fallback = fell.length ? ` The stated EWMA fallback was used for ${countOf(fell.length, "factor")}: ${listSome(fell.map((f) => `${f.factor} (${f.fallback!.reason})`), 6)}.` : "";
  return `Volatility: ${parts.join("; ")}.${fallback}`;
}

/** The resolved model configuration of a prepared run: the one source for sentences about the method. */
export function resolveModel(prepared: PreparedRun, scalingFor: Scaler, L: number, H: number): ResolvedModel {
  const method = prepared.method;
  const pf = prepared.perFactor;
  const term = method.scaling === "term";
  const factors = pf ? pf.specs.map((fs, i) => resolvedFactor(fs, pf.fits[i], pf.horizonVariance[i])) : legacyFactors(prepared, H, term);
  let correlation: ResolvedCorrelation;
  if (pf) correlation = pf.correlationInfo;
  else {
    const repair = prepared.psd.repair;
    const label = storedCorrelation(prepared).basis;
    correlation = {
      spec: method.covariance === "garch-ccc" ? { kind: "ccc" } : null,
      label,
      statement:
        method.covariance === "garch-ccc"
          ? "Correlation: constant correlation of the GARCH(1,1)-standardised returns over the whole sample."
          : `Covariance: one ${method.covariance === "ewma" ? `EWMA covariance of the factor returns (λ = ${method.lambda}, zero mean, started from the equal-weight covariance of the first ${Math.min(method.startupDays, L)} days)` : `equal-weight covariance of the factor returns over the last ${Math.min(method.covarianceWindow, L)} days (zero mean)`}; each factor's volatility and the correlations come from the same matrix.`,
      check: prepared.psd.check.status,
      repair: repair ? { method: repair.method, frobeniusDistance: repair.frobeniusChange, iterations: 0, negativeEigenvaluesBefore: repair.negativeEigenvalues, minEigenvalueBefore: repair.minEigenvalueBefore } : null,
    };
  }
  const scalings = method.methods.map((m) => scalingFor(m));
  const horizonStatement =
    H === 1
      ? "One-day figures only: no horizon scaling."
      : term
        ? `${H}-day parametric figures: each factor's own variance forecast summed over the ${H} days (GARCH(1,1) and ARCH forecasts revert towards their long-run level; EWMA and moving-average forecasts are flat), combined with the correlation; historical figures use square-root-of-time.`
        : method.scaling === "overlap"
          ? `${H}-day figures: overlapping ${H}-day P&L sums for historical simulation; square-root-of-time (√${H} × one-day) for parametric VaR.`
          : `${H}-day figures: square-root-of-time, √${H} × the one-day figure.`;
  let backtest: ResolvedModel["backtest"];
  if (pf) {
    const d = describeRefit(method.backtestRefit);
    const corrNote =
      pf.correlationSpec.kind === "ccc"
        ? method.backtestRefit.mode === "rolling" ? " The constant correlation is re-estimated at each refit from that fit's standardised residuals." : " The constant correlation is the whole-sample estimate."
        : " The correlation on each day uses the returns up to the day before.";
    backtest = { refit: method.backtestRefit, statement: d.statement + corrNote, limitation: d.limitation };
  } else if (method.covariance === "garch-ccc") {
    backtest = { refit: { mode: "full-sample" }, ...describeRefit({ mode: "full-sample" }) };
  } else {
    backtest = { refit: method.backtestRefit, statement: `Backtest and VaR history: out of sample. The ${method.covariance === "ewma" ? `EWMA recursion (λ = ${method.lambda}, fixed)` : "equal-weight window"} uses only data up to the day before; nothing is estimated from the tested days.`, limitation: null };
  }
  const corrSentence = correlation.statement + (correlation.repair ? ` It was not positive semi-definite and was replaced by the nearest correlation matrix (Higham 2002), a Frobenius distance of ${correlation.repair.frobeniusDistance.toExponential(3)}.` : "");
  const statements = [pf || method.covariance === "garch-ccc" ? volatilitySentence(factors) : corrSentence, ...(pf || method.covariance === "garch-ccc" ? [corrSentence] : []), horizonStatement, backtest.statement];
  return {
    covariance: pf ? "per-factor" : method.covariance,
    factors,
    correlation,
    horizon: { days: H, rule: term ? "term" : "sqrt", scaling: scalings, statement: horizonStatement },
    backtest,
    statements,
  };
}

/** Limitations that follow from the resolved model (per-factor processes, correlation, refit rule). */
export function modelLimitations(model: ResolvedModel, prepared: PreparedRun): string[] {
  if (!prepared.perFactor) return [];
  const out: string[] = [];
  const seen = new Set<string>();
  for (const f of model.factors) {
    for (const l of f.limitations) {
      const key = `${f.process}: ${l}`;
      if (seen.has(key)) continue;
      seen.add(key);
      out.push(`${specLabel(f.spec)}: ${l}`);
    }
  }
  const c = prepared.perFactor.correlationSpec;
  if (c.kind === "ccc") out.push("Constant correlation: the correlation between factors is one number for the sample; correlations that rise in a crisis are not modelled.");
  else if (c.kind === "ewma") out.push(`EWMA correlation: λ = ${c.lambda} is chosen, not estimated; it reacts to recent co-movements and forgets older ones.`);
  else out.push(`Equal-weight correlation over ${c.window} days: a joint large move counts fully for ${c.window} days and then drops out abruptly.`);
  if (model.backtest.limitation) out.push(model.backtest.limitation);
  return out;
}

/** The limitations that follow from the method's choices (linear exposures, static book, the distribution, window, scaling, covariance). */
export function describeLimitations(method: PreparedRun["method"], scalingFor: Scaler, L: number, W: number, H: number): string[] {
  const limitations = [
    "Every position is treated linearly through its exposure (its delta-equivalent where given): option convexity (gamma) and volatility (vega) risk are not captured.",
    "Factor returns are applied to exposures as P&L = exposure × return; for log returns this is a first-order approximation.",
    "Static book: the VaR history, backtest and stressed VaR apply today's positions to past days (hypothetical P&L); trading during the period is not reflected.",
    "Exchange-rate risk is taken on each foreign position's market value; cross effects between price and exchange-rate moves are second order and left out.",
  ];
  if (method.methods.includes("parametric")) limitations.push(method.distribution === "normal" ? "Parametric VaR assumes normally distributed P&L and understates extreme losses when returns have fat tails." : `Parametric VaR assumes Student-t P&L with ν = ${method.nu}; skew is not captured.`);
  if (method.methods.some((m) => m !== "parametric")) limitations.push(`Historical simulation sees only the ${W} days of its window; at 99 % only about ${(W * 0.01).toFixed(1)} observations lie beyond the VaR.`);
  if (method.methods.some((m) => scalingFor(m) === "sqrt") && H > 1) limitations.push(`${H}-day figures use square-root-of-time where stated: ${SQRT_STATEMENT}.`);
  if (method.volatility) return limitations; // the per-factor processes' own limitations follow from the resolved model
  if (method.covariance === "garch-ccc") limitations.push("GARCH-CCC: the correlation is constant; correlations that rise in a crisis are not modelled. GARCH parameters are fitted once on the whole sample and reused for the past days' forecasts, so the backtest is in-sample for those parameters.");
  if (method.covariance === "ewma") limitations.push(`EWMA: λ = ${method.lambda} is chosen, not estimated; the forecast is flat over the horizon (no mean reversion).`);
  if (method.covariance === "equal") limitations.push(`Equal weights over ${Math.min(method.covarianceWindow, L)} days: a large return moves VaR for exactly that long and then drops out abruptly.`);

  return limitations;
}

/** The method's choices as the result states them, one sentence or value per choice. */
export function describeChoices(method: PreparedRun["method"], scalingFor: Scaler, L: number, W: number, H: number, confidences: number[]): MonthEndResult["choices"] {
  if (method.volatility) {
    const c = method.correlation as CorrelationSpec;
    return {
      methods: method.methods,
      covariance: `D·R·D: each factor's volatility from its own process (as the method assigns by factor, asset class or default), correlation ${describeCorrelation(c, L).label}`,
      filteringVolatility: method.methods.includes("filtered") ? "each factor's own process" : "not used",
      historicalWindowDays: method.methods.some((m) => m !== "parametric") ? W : "not used",
      quantileConvention: method.methods.some((m) => m !== "parametric") ? HISTORICAL_QUANTILE_CONVENTION : "not used",
      confidences,
      horizonDays: H,
      scaling: method.methods.map((m) => `${m}: ${describeScaling(scalingFor(m), H, true)}`),
      distribution: method.distribution === "t" ? `Student-t, ν = ${method.nu}, scaled to unit variance` : "normal",
      backtestRefit: method.backtestRefit.mode === "rolling" ? `every ${method.backtestRefit.everyDays} business days, out of sample` : "fitted once on the whole sample (in-sample)",
      exposureRule: "exposure to the price factor = delta-equivalent exposure where given, otherwise market value; foreign positions add their market value as exposure to the exchange-rate factor",
    };
  }
  return {
    methods: method.methods,
    covariance: method.covariance === "garch-ccc" ? "GARCH(1,1) per factor (zero mean, normal, sample start-up; EWMA fallback), constant correlation of standardised residuals" : method.covariance === "ewma" ? `EWMA, λ = ${method.lambda}, zero mean, started from the equal-weight covariance of the first ${Math.min(method.startupDays, L)} days` : `equal weights over the last ${Math.min(method.covarianceWindow, L)} days, zero mean`,
    filteringVolatility: method.methods.includes("filtered") ? (method.covariance === "garch-ccc" ? "GARCH(1,1) per factor" : `EWMA λ = ${method.lambda} per factor`) : "not used",
    historicalWindowDays: method.methods.some((m) => m !== "parametric") ? W : "not used",
    quantileConvention: method.methods.some((m) => m !== "parametric") ? HISTORICAL_QUANTILE_CONVENTION : "not used",
    confidences,
    horizonDays: H,
    scaling: method.methods.map((m) => `${m}: ${describeScaling(scalingFor(m), H)}`),
    distribution: method.distribution === "t" ? `Student-t, ν = ${method.nu}, scaled to unit variance` : "normal",
    exposureRule: "exposure to the price factor = delta-equivalent exposure where given, otherwise market value; foreign positions add their market value as exposure to the exchange-rate factor",
  };
}
