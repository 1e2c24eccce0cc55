/**
 * The method statement mapped onto the engine: which VaR methods, covariance, windows, confidences, horizon,
 * scaling, distribution and stress window a run uses, which volatility estimator applies to a factor, and the
 * firm's capital rule profile as the engine's CapitalProfile. Pure.
 */
import type { MonthEndMethod } from "@/lib/risk";
import type { CapitalProfile } from "@/lib/risk/capital/capital";
import type { EstimatorChoice, MethodContent } from "@/lib/validation/method";
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

/** The engine's method for a method statement and capital profile. Parametric and historical always; filtered when chosen. */
export function engineMethodOf(content: MethodContent, capital: RunCapitalProfile): MonthEndMethod {
  const methods: MonthEndMethod["methods"] = ["parametric", "historical"];
  if (content.varMethod === "filtered") methods.push("filtered");
  return {
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

/** Plain statements of what the mapping decided, shown with the run. */
export function mappingStatements(content: MethodContent): string[] {
  const out = [
    `Primary VaR method: ${content.varMethod} (the VaR history, backtest and capital use it); parametric and historical figures are always computed${content.varMethod === "filtered" ? ", filtered historical as chosen" : ""}.`,
    `Portfolio covariance: ${content.covariance === "equal" ? `equal weights over ${content.covarianceWindow} days` : content.covariance === "ewma" ? `EWMA with λ = ${content.covarianceLambda}` : "GARCH(1,1) per factor with constant correlation"}, as the method statement chooses.`,
  ];
  if (content.distribution === "t") out.push(`Student-t parametric VaR with ν = ${DEFAULT_T_NU}: the method statement chooses the t distribution without a number of degrees of freedom; ${DEFAULT_T_NU} is Ballast's default.`);
  return out;
}
