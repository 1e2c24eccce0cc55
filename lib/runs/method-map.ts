/**
 * The method statement mapped onto the engine: which VaR methods, covariance, windows, confidences, horizon,
 * scaling, distribution and stress window a run uses, which volatility estimator applies to a factor, and the
 * firm's capital rule profile as the engine's CapitalProfile. Pure.
 */
import type { MonthEndMethod, MonthEndResult } from "@/lib/risk";
import type { CapitalProfile } from "@/lib/risk/capital/capital";
import type { BacktestRefit, CorrelationSpec, VolatilityChoice, VolatilitySpec } from "@/lib/risk/process/types";
import type { BacktestRefitChoice, CorrelationChoice, EstimatorChoice, MethodContent } from "@/lib/validation/method";
import type { RunCapitalProfile } from "./types";

/**
 * ν of the Student-t parametric VaR when the method statement chooses "t": the statement has no field for it.
 * Five degrees of freedom is a common choice for daily returns (common practice, no source); stated in the run.
 */
export const DEFAULT_T_NU = 5;

/** The capital profile row as stored (capital_rule_profiles). */
export interface CapitalProfileRow {
  id: string;
  name: string;
  confidence: number;
  horizonDays: number;
  averagingDays: number;
  baseMultiplier: number;
  stressedMultiplier: number;
  backtestDays: number;
  plusFactors: Record<string, number>;
}

/** The firm's capital rule profile as the engine reads it (stressed VaR included, plus factor on both multipliers). */
export function capitalProfileOf(row: CapitalProfileRow): RunCapitalProfile {
  const profile: CapitalProfile = {
    multiplierBase: row.baseMultiplier,
    stressedMultiplierBase: row.stressedMultiplier,
    plusFactorOnStressed: true,
    averagingDays: row.averagingDays,
    confidence: row.confidence,
    horizonDays: row.horizonDays,
    includeStressed: true,
  };
  return { id: row.id, name: row.name, profile, plusFactors: { ...row.plusFactors }, backtestDays: row.backtestDays };
}

/** The engine's volatility process for one estimator choice, with every setting the analyst chose. */
export function volatilitySpecOf(choice: EstimatorChoice): VolatilitySpec {
  switch (choice.kind) {
    case "ma":
      return { kind: "ma", window: choice.window, divisor: choice.divisor, mean: choice.mean };
    case "ewma":
      // a fitted λ starts the optimiser from the stated value
      return choice.lambdaMode === "fit" ? { kind: "ewma", lambda: choice.lambda, fit: true } : { kind: "ewma", lambda: choice.lambda };
    case "arch":
      return { kind: "arch", order: choice.order };
    case "garch":
      return { kind: "garch", distribution: choice.distribution, mean: choice.mean, targeting: choice.targeting, fallback: choice.fallback };
  }
}

/** Each factor's process by its asset class (exchange-rate factors are the "fx" class), the firm-wide default for the rest. */
export function volatilityChoiceOf(content: MethodContent): VolatilityChoice {
  const byAssetClass: Record<string, VolatilitySpec> = {};
  for (const [cls, e] of Object.entries(content.byAssetClass)) if (e) byAssetClass[cls] = volatilitySpecOf(e);
  return { default: volatilitySpecOf(content.defaultEstimator), byAssetClass };
}

/** The engine's correlation estimator for the method statement's choice. */
export function correlationSpecOf(choice: CorrelationChoice): CorrelationSpec {
  return choice.kind === "equal" ? { kind: "equal", window: choice.window } : choice.kind === "ewma" ? { kind: "ewma", lambda: choice.lambda } : { kind: "ccc" };
}

/** The engine's backtest refit rule for the method statement's choice. */
export function backtestRefitOf(choice: BacktestRefitChoice): BacktestRefit {
  return choice.mode === "every" ? { mode: "rolling", everyDays: choice.days } : { mode: "full-sample" };
}

/** The engine's method for a method statement and capital profile. Parametric and historical always; filtered when chosen. */
export function engineMethodOf(content: MethodContent, capital: RunCapitalProfile, options: { candidates?: boolean } = {}): MonthEndMethod {
  const methods: MonthEndMethod["methods"] = ["parametric", "historical"];
  if (content.varMethod === "filtered") methods.push("filtered");
  const perFactor: Partial<MonthEndMethod> =
    content.portfolioVolatility === "asset-class" ? { volatility: volatilityChoiceOf(content), correlation: correlationSpecOf(content.correlation) } : {};
  return {
    ...perFactor,
    // with one covariance model the engine's own rule is today's behaviour (GARCH-CCC fitted once on the whole
    // sample; EWMA and equal weights fit nothing), and the schema allows nothing else
    ...(content.portfolioVolatility === "asset-class" ? { backtestRefit: backtestRefitOf(content.backtestRefit) } : {}),
    ...(options.candidates ? { candidates: { include: "standard" as const } } : {}),
    methods,
    primaryMethod: content.varMethod,
    covariance: content.covariance,
    lambda: content.covarianceLambda,
    covarianceWindow: content.covarianceWindow,
    historicalWindow: content.historicalWindow,
    confidences: [...content.confidences],
    horizonDays: content.horizonDays,
    scaling: content.scaling,
    distribution: content.distribution,
    ...(content.distribution === "t" ? { nu: DEFAULT_T_NU } : {}),
    stressWindow: content.stressWindow.mode === "chosen" ? { start: content.stressWindow.start, end: content.stressWindow.end } : "search",
    // one forecast for each backtest day and today, so the backtest chart can show every day's VaR (the stored
    // VaR history keeps the last max(60, averaging days) of them; the figures do not depend on this length)
    historyDays: Math.max(60, capital.profile.averagingDays, capital.backtestDays + 1),
    backtestDays: capital.backtestDays,
  };
}

/** Days of VaR history a run keeps in its results: 60, or the capital profile's averaging days when longer. */
export function storedHistoryDays(capital: RunCapitalProfile): number {
  return Math.max(60, capital.profile.averagingDays);
}

/** The estimator the method statement chooses for an asset class (exchange-rate series are "fx"), or the default. */
export function estimatorFor(content: MethodContent, assetClass: string): { choice: EstimatorChoice; from: "asset-class" | "default" } {
  const own = (content.byAssetClass as Record<string, EstimatorChoice | undefined>)[assetClass];
  return own ? { choice: own, from: "asset-class" } : { choice: content.defaultEstimator, from: "default" };
}

/** The plus factor of the firm's table for a count of exceptions: the value at the largest count not above it, else 0. */
export function firmPlusFactor(plusFactors: Record<string, number>, exceptions: number): number {
  let best = -1;
  let value = 0;
  for (const [key, v] of Object.entries(plusFactors)) {
    const k = Number(key);
    if (Number.isFinite(k) && k <= exceptions && k > best) {
      best = k;
      value = v;
    }
  }
  return value;
}

/**
 * Plain statements of what the run computed, from the engine's result and the method it was given: the VaR methods,
 * the t distribution's ν, then the engine's own sentences about the resolved model (volatility per factor,
 * correlation, horizon, backtest). Runs stored before the engine returned its model get the covariance in words.
 */
export function runStatements(monthEnd: MonthEndResult, method: MonthEndMethod): string[] {
  const computed = monthEnd.methods.map((m) => m.method);
  const out = [
    `Primary VaR method: ${monthEnd.primaryMethod} (the VaR history, backtest and capital use it); computed: ${computed.join(", ")}.`,
  ];
  if (method.distribution === "t") out.push(`Student-t parametric VaR with ν = ${method.nu ?? DEFAULT_T_NU}: the method statement chooses the t distribution without a number of degrees of freedom; ${DEFAULT_T_NU} is Ballast's default.`);
  if (monthEnd.model) out.push(...monthEnd.model.statements);
  else {
    const cov = method.covariance ?? "ewma";
    out.push(`Portfolio covariance: ${cov === "equal" ? `equal weights over ${method.covarianceWindow ?? 250} days` : cov === "ewma" ? `EWMA with λ = ${method.lambda ?? 0.94}` : "GARCH(1,1) per factor with constant correlation"}.`);
  }
  return out;
}
