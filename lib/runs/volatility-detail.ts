/**
 * One factor's volatility in detail, from a run's stored inputs: the conditional volatility over time under each
 * estimator, the squared returns behind them, and the GARCH(1,1) term structure against its long-run level. Pure.
 */
import { garchTermStructure } from "@/lib/risk";
import { alignReturns, usableSeries } from "./align";
import { choicesFor, fitChoice, labelOf } from "./factor-volatility";
import type { RunInputs } from "./types";
import { readMethodContent } from "@/lib/validation/method";

export interface VolatilityDetail {
  factor: string;
  assetClass: string;
  currency: string;
  dates: string[];
  /** daily log returns (decimals) */
  returns: number[];
  squaredReturns: number[];
  /** per estimator: conditional daily volatility on each date (null before the estimator has a value) */
  series: { estimator: string; label: string; chosen: boolean; volatility: (number | null)[]; currentVolatility: number | null; error: string | null }[];
  termStructure: {
    label: string;
    /** forecast daily volatility for day 1..days ahead */
    volatility: number[];
    longRunVolatility: number | null;
    statement: string;
  } | null;
  factors: string[];
}

export const TERM_DAYS = 250;

export function volatilityDetail(inputs: RunInputs, factor: string): VolatilityDetail | null {
  const meta = inputs.prices.factors[factor];
  const factors = Object.keys(inputs.prices.factors).sort();
  if (!meta) return null;
  const alignment = alignReturns(inputs.prices);
  const { dates, returns } = usableSeries(alignment, factor);
  const { choices, chosen } = choicesFor(readMethodContent(inputs.method.content), meta.assetClass);
  let termStructure: VolatilityDetail["termStructure"] = null;
  const series = choices.map((c) => {
    const { fit, error } = returns.length > 1 ? fitChoice(returns, c) : { fit: null, error: "no returns" };
    if (c.kind === "garch") {
      if (fit && fit.kind === "garch") {
        const path = garchTermStructure(fit, TERM_DAYS);
        termStructure = {
          label: labelOf(c, fit),
          volatility: Array.from(path, (v) => Math.sqrt(v)),
          longRunVolatility: fit.longRunVariance !== null && fit.longRunVariance > 0 ? Math.sqrt(fit.longRunVariance) : null,
          statement: `E[σ²ₙ₊ₜ] = V_L + (α+β)^(t−1)·(σ²ₙ₊₁ − V_L) with α+β = ${(fit.params.alpha + fit.params.beta).toFixed(4)}: the forecast reverts from today's level towards the long-run level.`,
        };
      } else if (fit) {
        termStructure = { label: `${labelOf(c, fit)} (fell back to EWMA)`, volatility: new Array(TERM_DAYS).fill(Math.sqrt(fit.currentVariance)), longRunVolatility: null, statement: "The GARCH(1,1) fit fell back to EWMA, whose forecast is flat: today's level for every future day." };
      }
    }
    return {
      estimator: c.kind,
      label: labelOf(c, fit),
      chosen: c === chosen,
      volatility: fit ? Array.from(fit.variance, (v) => (Number.isFinite(v) && v >= 0 ? Math.sqrt(v) : null)) : dates.map(() => null),
      currentVolatility: fit ? Math.sqrt(fit.currentVariance) : null,
      error,
    };
  });
  return {
    factor,
    assetClass: meta.assetClass,
    currency: meta.currency,
    dates,
    returns: Array.from(returns),
    squaredReturns: Array.from(returns, (r) => r * r),
    series,
    termStructure,
    factors,
  };
}
