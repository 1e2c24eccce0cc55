/**
 * A VaR backtest: P&L against the VaR forecast for the same day (made the day before), the exceptions with
 * their dates and sizes, the traffic-light zone and plus factor, and Kupiec's and Christoffersen's tests.
 */
import type { EngineWarning } from "../types";
import { christoffersenTest, type ChristoffersenResult } from "./christoffersen";
import { kupiecTest, type KupiecResult } from "./kupiec";
import { trafficLight, type TrafficLightResult } from "./traffic-light";
import { ENGINE_VERSION } from "../version";

export interface BacktestException {
  date: string;
  pnl: number;
  var: number;
  /** how far the loss went beyond the VaR: −pnl − var (> 0) */
  excess: number;
}

export interface BacktestResult {
  days: number;
  confidence: number;
  exceptions: number;
  exceptionList: BacktestException[];
  zone: TrafficLightResult["zone"];
  plusFactor: number;
  trafficLight: TrafficLightResult;
  kupiec: KupiecResult;
  christoffersen: ChristoffersenResult | null;
  /** the rule used: a loss strictly greater than the VaR is an exception */
  exceptionRule: string;
  warnings: EngineWarning[];
  limitations: string[];
  engineVersion: string;
}

/**
 * Backtest daily P&L against the one-day VaR forecast for the same day (VaR a positive loss).
 * @param dates one date per day, oldest first
 * @param pnl P&L per day (a loss negative)
 * @param varForecast the VaR for that day, computed with information up to the previous day
 * @param confidence the VaR's confidence level, 0.99 by default
 * @throws {RangeError} on unequal lengths, no days, or a non-finite value
 */
export function runBacktest(
  dates: readonly string[],
  pnl: ArrayLike<number>,
  varForecast: ArrayLike<number>,
  confidence = 0.99,
): BacktestResult {
  const T = pnl.length;
  if (T === 0) throw new RangeError("runBacktest requires at least 1 day");
  if (dates.length !== T || varForecast.length !== T) throw new RangeError("runBacktest requires dates, pnl and var of equal length");
  if (!(confidence > 0 && confidence < 1)) throw new RangeError("runBacktest requires 0 < confidence < 1");
  const hits: boolean[] = new Array(T);
  const exceptionList: BacktestException[] = [];
  const warnings: EngineWarning[] = [];
  let negativeVar = 0;
  for (let t = 0; t < T; t++) {
    if (!Number.isFinite(pnl[t]) || !Number.isFinite(varForecast[t])) {
      throw new RangeError(`runBacktest requires finite values (day ${t + 1}, ${dates[t]})`);
    }
    if (varForecast[t] < 0) negativeVar++;
    hits[t] = -pnl[t] > varForecast[t];
    if (hits[t]) exceptionList.push({ date: dates[t], pnl: pnl[t], var: varForecast[t], excess: -pnl[t] - varForecast[t] });
  }
  if (negativeVar > 0) warnings.push({ code: "negative-var", message: `${negativeVar} day(s) have a negative VaR; VaR is expected as a positive loss.` });
  if (T !== 250) {
    warnings.push({ code: "backtest-window", message: `The backtest covers ${T} days, not the 250 of the supervisory table; zones follow the binomial rule.` });
  }
  const p = Math.round((1 - confidence) * 1e12) / 1e12; // 1 − 0.99 is 0.010000000000000009 in floating point
  const light = trafficLight(T, exceptionList.length, p);
  return {
    days: T,
    confidence,
    exceptions: exceptionList.length,
    exceptionList,
    zone: light.zone,
    plusFactor: light.plusFactor,
    trafficLight: light,
    kupiec: kupiecTest(T, exceptionList.length, p),
    christoffersen: T >= 2 ? christoffersenTest(hits, p) : null,
    exceptionRule: "an exception is a day whose loss (−P&L) is strictly greater than that day's VaR",
    warnings,
    limitations: [
      `With ${T} days at ${(confidence * 100).toFixed(1)} % only about ${(T * p).toFixed(1)} exceptions are expected, so the coverage tests have little power: a wrong model often passes (common practice, no source).`,
      "The χ² distributions of the likelihood-ratio statistics are large-sample approximations.",
      "Christoffersen's independence test looks only at consecutive days (first-order dependence).",
    ],
    engineVersion: ENGINE_VERSION,
  };
}
