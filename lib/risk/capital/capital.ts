/**
 * Market-risk capital under a rule profile. Defaults from the Basel Committee (1996) market-risk amendment,
 * B.4, and its 2009 revision adding stressed VaR:
 * capital = max(VaR(t−1), m_c · mean VaR over the preceding 60 days) + max(sVaR(t−1), m_s · mean sVaR over 60 days),
 * with m_c = 3 + the backtest plus factor. Every parameter is the firm's to set.
 */
import { trafficLight } from "../backtest/traffic-light";
import { ENGINE_VERSION } from "../version";

/** The firm's capital rule profile. */
export interface CapitalProfile {
  /** base multiplier for VaR, 3 in the 1996 amendment */
  multiplierBase: number;
  /** base multiplier for stressed VaR, 3 in the 2009 revision */
  stressedMultiplierBase: number;
  /** add the backtest plus factor to the stressed multiplier as well (as in the 2009 revision) */
  plusFactorOnStressed: boolean;
  /** business days averaged, 60 */
  averagingDays: number;
  /** VaR confidence, 0.99 */
  confidence: number;
  /** VaR horizon in days, 10 */
  horizonDays: number;
  /** include the stressed VaR term (2009 revision) */
  includeStressed: boolean;
}

/** Defaults: Basel Committee (1996) market-risk amendment B.4 and (2009) "Revisions to the Basel II market risk framework". */
export const BASEL_CAPITAL_PROFILE: CapitalProfile = {
  multiplierBase: 3,
  stressedMultiplierBase: 3,
  plusFactorOnStressed: true,
  averagingDays: 60,
  confidence: 0.99,
  horizonDays: 10,
  includeStressed: true,
};

export interface CapitalInput {
  /** VaR (positive, horizon and confidence of the profile) for the last `averagingDays` days, oldest first; the last is VaR(t−1) */
  varHistory: ArrayLike<number>;
  /** stressed VaR for the same days; ignored when the profile leaves stressed VaR out */
  stressedVarHistory?: ArrayLike<number>;
  /** the backtest plus factor; alternatively give `exceptions` (250-day count) */
  plusFactor?: number;
  exceptions?: number;
  /** override m_c (the whole multiplier, base plus factor) */
  multiplier?: number;
  /** override m_s */
  stressedMultiplier?: number;
}

export interface CapitalResult {
  capital: number;
  varLast: number;
  varAverage: number;
  multiplier: number;
  varTerm: number;
  /** which side of the max won: "last" or "average" */
  varBinding: "last" | "average";
  stressedVarLast: number | null;
  stressedVarAverage: number | null;
  stressedMultiplier: number | null;
  stressedVarTerm: number;
  stressedBinding: "last" | "average" | null;
  plusFactor: number;
  averagingDays: number;
  formula: string;
  profile: CapitalProfile;
  engineVersion: string;
}

function meanOfLast(values: ArrayLike<number>, count: number): number {
  let sum = 0;
  for (let i = values.length - count; i < values.length; i++) sum += values[i];
  return sum / count;
}

/**
 * Capital under the profile, with every term shown.
 * @throws {RangeError} if fewer VaR figures than the averaging window are given, or a figure is not finite
 * @example capitalCharge({ varHistory: Array(60).fill(10), stressedVarHistory: Array(60).fill(20), plusFactor: 0 }).capital; // 90
 */
export function capitalCharge(input: CapitalInput, profile: CapitalProfile = BASEL_CAPITAL_PROFILE): CapitalResult {
  const days = profile.averagingDays;
  if (!(Number.isInteger(days) && days > 0)) throw new RangeError("capitalCharge requires a positive whole number of averaging days");
  const vars = input.varHistory;
  if (vars.length < days) throw new RangeError(`capitalCharge requires at least ${days} VaR figures (got ${vars.length})`);
  for (let i = 0; i < vars.length; i++) if (!Number.isFinite(vars[i])) throw new RangeError(`capitalCharge requires finite VaR figures (figure ${i + 1})`);
  let plusFactor = input.plusFactor ?? 0;
  if (input.plusFactor === undefined && input.exceptions !== undefined) plusFactor = trafficLight(250, input.exceptions, 1 - profile.confidence).plusFactor;
  if (!(plusFactor >= 0)) throw new RangeError("capitalCharge requires a plus factor >= 0");
  const multiplier = input.multiplier ?? profile.multiplierBase + plusFactor;
  const varLast = vars[vars.length - 1];
  const varAverage = meanOfLast(vars, days);
  const varTerm = Math.max(varLast, multiplier * varAverage);
  let stressedVarLast: number | null = null;
  let stressedVarAverage: number | null = null;
  let stressedMultiplier: number | null = null;
  let stressedVarTerm = 0;
  let stressedBinding: CapitalResult["stressedBinding"] = null;
  if (profile.includeStressed) {
    const svars = input.stressedVarHistory;
    if (!svars || svars.length < days) throw new RangeError(`capitalCharge requires at least ${days} stressed VaR figures (got ${svars?.length ?? 0})`);
    for (let i = 0; i < svars.length; i++) if (!Number.isFinite(svars[i])) throw new RangeError(`capitalCharge requires finite stressed VaR figures (figure ${i + 1})`);
    stressedMultiplier = input.stressedMultiplier ?? profile.stressedMultiplierBase + (profile.plusFactorOnStressed ? plusFactor : 0);
    stressedVarLast = svars[svars.length - 1];
    stressedVarAverage = meanOfLast(svars, days);
    stressedVarTerm = Math.max(stressedVarLast, stressedMultiplier * stressedVarAverage);
    stressedBinding = stressedVarLast >= stressedMultiplier * stressedVarAverage ? "last" : "average";
  }
  return {
    capital: varTerm + stressedVarTerm,
    varLast,
    varAverage,
    multiplier,
    varTerm,
    varBinding: varLast >= multiplier * varAverage ? "last" : "average",
    stressedVarLast,
    stressedVarAverage,
    stressedMultiplier,
    stressedVarTerm,
    stressedBinding,
    plusFactor,
    averagingDays: days,
    formula: profile.includeStressed
      ? `max(VaR(t−1), m_c × mean VaR of ${days} days) + max(sVaR(t−1), m_s × mean sVaR of ${days} days)`
      : `max(VaR(t−1), m_c × mean VaR of ${days} days)`,
    profile,
    engineVersion: ENGINE_VERSION,
  };
}
