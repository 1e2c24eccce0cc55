/**
 * Variance forecasts. GARCH reverts towards its long-run variance V_L; the moving average and EWMA
 * forecast a flat line (today's estimate for every future day), stated as such. These are the kernels; the process
 * registry builds on them, and lib/risk/forecast.ts adds the forecast of any fit through the registry.
 */
import type { VolatilityFit } from "./types";

/** GARCH(1,1) parameters and the variance forecast for the next day σ²ₙ₊₁. */
export interface Garch11State {
  omega: number;
  alpha: number;
  beta: number;
  currentVariance: number;
}

function garchState(fitOrParams: VolatilityFit | Garch11State): Garch11State {
  if ("params" in fitOrParams) {
    const { omega, alpha, beta } = fitOrParams.params;
    if (omega === undefined || alpha === undefined || beta === undefined) throw new RangeError("garchTermStructure requires a GARCH(1,1) fit");
    return { omega, alpha, beta, currentVariance: fitOrParams.currentVariance };
  }
  return fitOrParams;
}

function checkHorizon(horizonDays: number, name: string): void {
  if (!(Number.isInteger(horizonDays) && horizonDays >= 1)) throw new RangeError(`${name} requires an integer horizon of at least 1 day`);
}

/**
 * GARCH(1,1) term structure E[σ²ₙ₊ₜ] = V_L + (α+β)ᵗ⁻¹·(σ²ₙ₊₁ − V_L) for t = 1..horizonDays
 * (computed as Eₜ = ω + (α+β)·Eₜ₋₁, which is the same and also holds when α+β ≥ 1).
 */
export function garchTermStructure(fitOrParams: VolatilityFit | Garch11State, horizonDays: number): Float64Array {
  checkHorizon(horizonDays, "garchTermStructure");
  const { omega, alpha, beta, currentVariance } = garchState(fitOrParams);
  const p = alpha + beta;
  const out = new Float64Array(horizonDays);
  let e = currentVariance;
  for (let t = 0; t < horizonDays; t++) { out[t] = e; e = omega + p * e; }
  return out;
}

/** The flat forecast of the moving average and EWMA: today's variance for every day to the horizon. */
export function flatForecast(currentVariance: number, horizonDays: number): Float64Array {
  checkHorizon(horizonDays, "flatForecast");
  return new Float64Array(horizonDays).fill(currentVariance);
}

/**
 * ARCH(m) forecast: Eₜ = ω + Σᵢ αᵢ·E[u²ₙ₊ₜ₋ᵢ], with known squared residuals where t−i ≤ 0.
 * @param recentSquaredResiduals u²ₙ, u²ₙ₋₁, … newest first (at least m of them)
 */
export function archForecast(omega: number, alphas: readonly number[], recentSquaredResiduals: readonly number[], horizonDays: number): Float64Array {
  checkHorizon(horizonDays, "archForecast");
  const m = alphas.length;
  if (recentSquaredResiduals.length < m) throw new RangeError(`archForecast requires at least ${m} recent squared residuals`);
  // path[k] holds E[u²] for day n+1+k (k ≥ 0); day n+1−j for j ≥ 1 is recentSquaredResiduals[j−1]
  const out = new Float64Array(horizonDays);
  for (let t = 0; t < horizonDays; t++) {
    let h = omega;
    for (let i = 1; i <= m; i++) { const k = t - i; h += alphas[i - 1] * (k >= 0 ? out[k] : recentSquaredResiduals[-k - 1]); }
    out[t] = h;
  }
  return out;
}

/** Average variance over the horizon: the mean of the daily forecasts (the horizon variance is this times the days). */
export function averageVariance(forecast: ArrayLike<number>): number {
  if (forecast.length === 0) throw new RangeError("averageVariance requires at least one forecast");
  let s = 0;
  for (let i = 0; i < forecast.length; i++) s += forecast[i];
  return s / forecast.length;
}

/** Annualised volatility term structure: for each t, √(daysPerYear · mean of E[σ²] over days 1..t); 252 or 250 days a year. */
export function annualisedVolatilityTermStructure(forecast: ArrayLike<number>, daysPerYear: 252 | 250 = 252): Float64Array {
  if (daysPerYear !== 252 && daysPerYear !== 250) throw new RangeError("annualisedVolatilityTermStructure requires 252 or 250 days a year");
  const out = new Float64Array(forecast.length);
  let s = 0;
  for (let t = 0; t < forecast.length; t++) { s += forecast[t]; out[t] = Math.sqrt((daysPerYear * s) / (t + 1)); }
  return out;
}

/**
 * Long-run variance of GARCH(1,1), V_L = ω/(1−α−β) = ω/γ, where γ = 1−α−β is the weight of V_L.
 * @throws {RangeError} if α+β ≥ 1 (no long-run variance) or ω < 0
 */
export function garchLongRunVariance(params: { omega: number; alpha: number; beta: number }): number {
  const gamma = 1 - params.alpha - params.beta;
  if (!(gamma > 0)) throw new RangeError("garchLongRunVariance requires alpha + beta < 1");
  if (!(params.omega >= 0)) throw new RangeError("garchLongRunVariance requires omega >= 0");
  return params.omega / gamma;
}
