/** The month-end run's VaR and ES figures per method and confidence, with the Euler decomposition (the `var` command too). */
import type { EngineWarning } from "../../types";
import { ENGINE_VERSION } from "../../version";
import { BASEL_CAPITAL_PROFILE } from "../../capital/capital";
import type { ParametricOptions } from "../../var/parametric";
import { describeScaling, garchHorizonVariance, overlappingSums, type HorizonScaling } from "../../var/scaling";
import { allocateToPositions } from "../decomposition";
import { correlationToCovariance, type SymmetricMatrix } from "../matrix";
import type { ResolvedModel, StoredCorrelation } from "../../process/types";
import { dot, evaluateParametric, evaluateScenarios, scaleEvaluation, scenarioPnl, type Evaluation, type Scenarios } from "./kernels";
import { prepareRun } from "./prepare";
import { describeChoices, describeLimitations, modelLimitations, resolveModel, storedCorrelation } from "./statements";
import type { ConfidenceFigures, GroupFigure, MethodFigures, MonthEndInput, MonthEndResult, PositionContribution, ProgressCallback, VarMethod, VolatilityModel } from "./types";

/** The first stage of a run: the prepared inputs, the P&L, scenario builders and the VaR and ES figures per method. */
export function varCore(input: MonthEndInput, onProgress?: ProgressCallback) {
  const prepared = prepareRun(input, onProgress);
  const { dates, factorIds, returns, exposures, loadings, positions, covariance, correlation, volatility, method } = prepared;
  const warnings = [...prepared.warnings];
  const L = dates.length;
  const k = factorIds.length;
  const H = method.horizonDays;
  const profile = input.capitalProfile ?? BASEL_CAPITAL_PROFILE;
  const confidences = [...method.confidences];
  if (!confidences.includes(profile.confidence)) confidences.push(profile.confidence);
  const paramOptions: ParametricOptions = { distribution: method.distribution, nu: method.nu };

  // the static book's P&L on every working day
  const pnl = new Float64Array(L);
  for (let i = 0; i < k; i++) {
    const e = exposures[i];
    const r = returns[i];
    for (let t = 0; t < L; t++) pnl[t] += e * r[t];
  }
  const assetClassOf = positions.map((p) => p.assetClass ?? "unclassified");
  const currencyOf = positions.map((p) => p.currency ?? input.reportingCurrency);
  const classes = [...new Set(assetClassOf)];
  const classExposures = new Map<string, Float64Array>();
  for (const c of classes) classExposures.set(c, new Float64Array(k));
  loadings.forEach((l, j) => {
    const v = classExposures.get(assetClassOf[j]) as Float64Array;
    for (let m = 0; m < l.factorIndices.length; m++) v[l.factorIndices[m]] += l.amounts[m];
  });

  // horizon covariance from the term structures, when chosen
  let covariance10: SymmetricMatrix | null = null;
  if (prepared.perFactor) {
    if (prepared.perFactor.term) covariance10 = correlationToCovariance(correlation as SymmetricMatrix, prepared.perFactor.horizonVariance.map(Math.sqrt));
  } else if (method.scaling === "term" && volatility && correlation) {
    const vols10 = new Float64Array(k);
    for (let i = 0; i < k; i++) vols10[i] = Math.sqrt(garchHorizonVariance(volatility.current[i], volatility.params[i], H));
    covariance10 = correlationToCovariance(correlation, vols10);
  }

  const W = Math.min(method.historicalWindow, L);
  if (W < method.historicalWindow && method.methods.some((m) => m !== "parametric")) {
    warnings.push({ code: "short-window", message: `The historical window is ${W} days, shorter than the ${method.historicalWindow} asked for.` });
  }
  const scalingFor = (m: VarMethod): HorizonScaling => {
    if (method.scaling === "term") return m === "parametric" ? "term" : "sqrt";
    if (method.scaling === "overlap") return m === "parametric" ? "sqrt" : "overlap";
    return "sqrt";
  };
  if (prepared.perFactor && method.methods.includes("filtered") && L - W < prepared.perFactor.firstDefined) {
    throw new RangeError(`runMonthEnd: filtered historical simulation over ${W} days needs each factor's variance on every day of the window; the longest moving-average window (${prepared.perFactor.firstDefined} days) leaves only ${L - prepared.perFactor.firstDefined}`);
  }
  const filteredScenarios = (at: number, start: number, end: number): Scenarios => {
    const vm = volatility as VolatilityModel;
    const x = returns.map((r, i) => {
      const out = new Float64Array(end - start);
      const now = at >= L ? vm.current[i] : vm.variance[i][at];
      for (let s = start; s < end; s++) out[s - start] = r[s] * Math.sqrt(now / vm.variance[i][s]);
      return out;
    });
    return { x, count: end - start };
  };
  const windowScenarios = (start: number, end: number): Scenarios => ({ x: returns.map((r) => r.subarray(start, end)), count: end - start });
  const overlapScenarios = (sc: Scenarios): Scenarios => {
    const x = sc.x.map((r) => overlappingSums(r, H));
    return { x, count: sc.count - H + 1 };
  };

  // evaluation of one method for any exposure vector
  const evaluators = (m: VarMethod): { one: (e: ArrayLike<number>, c: number) => Evaluation; ten: (e: ArrayLike<number>, c: number) => Evaluation; sigma: number; scenarios: number | null } => {
    const scaling = scalingFor(m);
    if (m === "parametric") {
      const one = (e: ArrayLike<number>, c: number) => evaluateParametric(covariance, e, c, paramOptions);
      const ten = covariance10
        ? (e: ArrayLike<number>, c: number) => evaluateParametric(covariance10 as SymmetricMatrix, e, c, paramOptions)
        : (e: ArrayLike<number>, c: number) => scaleEvaluation(one(e, c), Math.sqrt(H));
      return { one, ten, sigma: evaluateParametric(covariance, exposures, 0.99, paramOptions).sigma, scenarios: null };
    }
    const sc = m === "historical" ? windowScenarios(L - W, L) : filteredScenarios(L, L - W, L);
    const one = (e: ArrayLike<number>, c: number) => evaluateScenarios(sc, e, c);
    let ten: (e: ArrayLike<number>, c: number) => Evaluation;
    if (scaling === "overlap") {
      if (sc.count < H + 1) throw new RangeError(`runMonthEnd: the historical window is too short for overlapping ${H}-day returns`);
      const sc10 = overlapScenarios(sc);
      ten = (e, c) => evaluateScenarios(sc10, e, c);
    } else ten = (e, c) => scaleEvaluation(one(e, c), Math.sqrt(H));
    const p = scenarioPnl(sc, exposures);
    return { one, ten, sigma: Math.sqrt(dot(p, p) / p.length), scenarios: sc.count };
  };

  const methodFigures: MethodFigures[] = [];
  method.methods.forEach((m, mi) => {
    const ev = evaluators(m);
    const byConfidence: ConfidenceFigures[] = confidences.map((c) => {
      const one = ev.one(exposures, c);
      const ten = ev.ten(exposures, c);
      const posVar = allocateToPositions(loadings, one.varMarginal);
      const posEs = allocateToPositions(loadings, one.esMarginal);
      const posVar10 = allocateToPositions(loadings, ten.varMarginal);
      const posEs10 = allocateToPositions(loadings, ten.esMarginal);
      const contributions: PositionContribution[] = positions.map((p, j) => ({
        instrument: p.instrument,
        assetClass: assetClassOf[j],
        currency: currencyOf[j],
        marketValue: p.marketValue,
        exposure: p.deltaExposure ?? p.marketValue,
        componentVar: posVar[j],
        componentEs: posEs[j],
        componentVarHorizon: posVar10[j],
        componentEsHorizon: posEs10[j],
        marginalVar: p.marketValue !== 0 ? posVar[j] / p.marketValue : 0,
      }));
      const byAssetClass: ConfidenceFigures["byAssetClass"] = {};
      let standAloneSum = 0;
      let standAloneSum10 = 0;
      for (const cls of classes) {
        const e = classExposures.get(cls) as Float64Array;
        const s1 = ev.one(e, c);
        const s10 = ev.ten(e, c);
        standAloneSum += s1.var;
        standAloneSum10 += s10.var;
        byAssetClass[cls] = { componentVar: 0, componentEs: 0, componentVarHorizon: 0, componentEsHorizon: 0, standAloneVar: s1.var, standAloneEs: s1.es, standAloneVarHorizon: s10.var, standAloneEsHorizon: s10.es };
      }
      const byCurrency: Record<string, GroupFigure> = {};
      for (let j = 0; j < positions.length; j++) {
        const a = byAssetClass[assetClassOf[j]];
        a.componentVar += posVar[j]; a.componentEs += posEs[j]; a.componentVarHorizon += posVar10[j]; a.componentEsHorizon += posEs10[j];
        const g = (byCurrency[currencyOf[j]] ??= { componentVar: 0, componentEs: 0, componentVarHorizon: 0, componentEsHorizon: 0 });
        g.componentVar += posVar[j]; g.componentEs += posEs[j]; g.componentVarHorizon += posVar10[j]; g.componentEsHorizon += posEs10[j];
      }
      return {
        confidence: c,
        oneDay: { var: one.var, es: one.es },
        horizon: { var: ten.var, es: ten.es },
        contributions,
        byFactor: factorIds.map((f, i) => ({ factor: f, exposure: exposures[i], marginalVar: one.varMarginal[i], componentVar: exposures[i] * one.varMarginal[i] })),
        byAssetClass,
        byCurrency,
        diversificationBenefit: standAloneSum - one.var,
        diversificationBenefitHorizon: standAloneSum10 - ten.var,
      };
    });
    methodFigures.push({ method: m, portfolioVolatility: ev.sigma, scaling: scalingFor(m), scalingStatement: describeScaling(scalingFor(m), H, !!prepared.perFactor), scenarios: ev.scenarios, byConfidence });
    onProgress?.("var", (mi + 1) / method.methods.length);
  });
  return { prepared, dates, factorIds, returns, exposures, loadings, positions, covariance, covariance10, correlation, volatility, method, warnings, L, k, H, profile, confidences, paramOptions, pnl, W, scalingFor, windowScenarios, overlapScenarios, methodFigures };
}

/** The VaR and ES figures of a book without the stressed VaR, history, backtest and capital (the `var` command). */
export interface PortfolioVarResult {
  engineVersion: string;
  asOf: string;
  confidences: number[];
  horizonDays: number;
  methods: MethodFigures[];
  covarianceCheck: MonthEndResult["covarianceCheck"];
  factors: MonthEndResult["factors"];
  excludedPositions: MonthEndResult["excludedPositions"];
  sample: MonthEndResult["sample"];
  choices: MonthEndResult["choices"];
  warnings: EngineWarning[];
  limitations: string[];
  /** the resolved model configuration (per factor process and one-day variance, correlation, horizon rule) */
  model: ResolvedModel;
  /** the correlation matrix behind the parametric figures */
  correlation: StoredCorrelation;
}

/**
 * VaR and ES at one day and the horizon, per confidence and method, with the Euler decomposition; the same
 * computation as runMonthEnd's first stage.
 * @throws {RangeError} on impossible input
 */
export function portfolioVar(input: MonthEndInput): PortfolioVarResult {
  const core = varCore(input);
  const { method, L, H, W, dates } = core;
  const model = resolveModel(core.prepared, core.scalingFor, L, H);
  return {
    engineVersion: ENGINE_VERSION,
    asOf: dates[L - 1],
    confidences: core.confidences,
    horizonDays: H,
    methods: core.methodFigures,
    covarianceCheck: core.prepared.psd,
    factors: { used: core.factorIds, excluded: core.prepared.excludedFactors },
    excludedPositions: core.prepared.excludedPositions,
    sample: { days: L, firstDate: dates[0], lastDate: dates[L - 1] },
    choices: describeChoices(method, core.scalingFor, L, W, H, core.confidences),
    warnings: core.warnings,
    limitations: [...describeLimitations(method, core.scalingFor, L, W, H), ...modelLimitations(model, core.prepared)],
    model,
    correlation: storedCorrelation(core.prepared),
  };
}

/** What varCore hands the later stages (stressed VaR, history, backtest, capital). */
export type VarCore = ReturnType<typeof varCore>;
