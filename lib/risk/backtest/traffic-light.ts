/**
 * Backtesting zones by the binomial rule of the Basel Committee (1996) supervisory backtesting framework,
 * Table 2: with T days and exception probability p, the cumulative probability P(X ≤ x) of x exceptions
 * under X ~ Binomial(T, p); yellow from 95 %, red from 99.99 %. The plus factors are Table 2's for 250 days.
 */

export type TrafficLightZone = "green" | "yellow" | "red";

/** Table 2's plus factors for 250 days at 99 %, by exceptions 0..10 (10 or more: 1.00). */
export const BASEL_PLUS_FACTORS_250: readonly number[] = [0, 0, 0, 0, 0, 0.4, 0.5, 0.65, 0.75, 0.85, 1.0];

export interface ZoneRule {
  /** cumulative probability from which the zone is yellow; 0.95 in the 1996 framework */
  yellowFrom: number;
  /** cumulative probability from which the zone is red; 0.9999 in the 1996 framework */
  redFrom: number;
}

/** The 1996 framework's zone boundaries: yellow from a cumulative probability of 95 %, red from 99.99 %. */
export const BASEL_ZONE_RULE: ZoneRule = { yellowFrom: 0.95, redFrom: 0.9999 };

export interface TrafficLightResult {
  days: number;
  exceptions: number;
  expectedRate: number;
  /** P(X ≤ exceptions) under Binomial(days, expectedRate) */
  cumulativeProbability: number;
  zone: TrafficLightZone;
  plusFactor: number;
  /** how the plus factor was found, in words */
  plusFactorRule: string;
}

/** The binomial probabilities P(X = k), k = 0..n, computed in logs for stability. */
export function binomialProbabilities(n: number, p: number): Float64Array {
  if (!(Number.isInteger(n) && n >= 0)) throw new RangeError("binomialProbabilities requires a whole number n >= 0");
  if (!(p > 0 && p < 1)) throw new RangeError("binomialProbabilities requires 0 < p < 1");
  const out = new Float64Array(n + 1);
  let logCoef = 0; // ln C(n, k)
  for (let k = 0; k <= n; k++) {
    if (k > 0) logCoef += Math.log(n - k + 1) - Math.log(k);
    out[k] = Math.exp(logCoef + k * Math.log(p) + (n - k) * Math.log1p(-p));
  }
  return out;
}

/** Cumulative binomial probability P(X ≤ x) for X ~ Binomial(n, p). */
export function binomialCdf(x: number, n: number, p: number): number {
  const probabilities = binomialProbabilities(n, p);
  let sum = 0;
  for (let k = 0; k <= Math.min(x, n); k++) sum += probabilities[k];
  return Math.min(1, sum);
}

/**
 * Zone and plus factor for x exceptions in T days. For T = 250 and p = 1 % this is Table 2 exactly; for
 * other windows the zone follows the same binomial rule and the plus factor is the one Table 2 gives to the
 * smallest 250-day count whose cumulative probability reaches the observed one (a stated extension).
 * @example trafficLight(250, 5).zone; // "yellow"
 */
export function trafficLight(days: number, exceptions: number, expectedRate = 0.01, rule: ZoneRule = BASEL_ZONE_RULE): TrafficLightResult {
  if (!(Number.isInteger(days) && days > 0)) throw new RangeError("trafficLight requires a positive whole number of days");
  if (!(Number.isInteger(exceptions) && exceptions >= 0 && exceptions <= days)) {
    throw new RangeError("trafficLight requires 0 <= exceptions <= days");
  }
  const cumulativeProbability = binomialCdf(exceptions, days, expectedRate);
  // compare with a small tolerance so 99.99 % computed as 0.99989999… still lands in its zone
  const zone: TrafficLightZone =
    cumulativeProbability >= rule.redFrom - 1e-12 ? "red" : cumulativeProbability >= rule.yellowFrom - 1e-12 ? "yellow" : "green";
  let plusFactor: number;
  let plusFactorRule: string;
  if (days === 250 && Math.abs(expectedRate - 0.01) < 1e-12) {
    plusFactor = BASEL_PLUS_FACTORS_250[Math.min(exceptions, 10)];
    plusFactorRule = "Basel Committee (1996) backtesting framework, Table 2 (250 days, 99 %)";
  } else {
    const table = binomialProbabilities(250, 0.01);
    let cumulative = 0;
    let equivalent = 10;
    for (let k = 0; k <= 10; k++) {
      cumulative += table[k];
      if (cumulative >= cumulativeProbability - 1e-12) {
        equivalent = k;
        break;
      }
    }
    if (zone === "green") equivalent = Math.min(equivalent, 4);
    if (zone === "red") equivalent = 10;
    if (zone === "yellow") equivalent = Math.min(Math.max(equivalent, 5), 9);
    plusFactor = BASEL_PLUS_FACTORS_250[equivalent];
    plusFactorRule = `binomial rule for ${days} days at ${(1 - expectedRate) * 100}%: cumulative probability matched to ${equivalent} exceptions in Table 2 (250 days)`;
  }
  return { days, exceptions, expectedRate, cumulativeProbability, zone, plusFactor, plusFactorRule };
}
