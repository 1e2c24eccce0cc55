/**
 * Debt general market risk: one ladder per currency, by the maturity method (coupon ≥ / < threshold columns,
 * risk weights) or the duration method (modified duration × assumed yield change). Then, in the published order:
 * vertical disallowance per band, horizontal disallowance within each zone, offsets between zones 1–2, 2–3, 1–3,
 * and the residual net position. Currencies are summed without offset.
 */
import type {
  BetweenZoneResult,
  InterestRateCurrencyResult,
  InterestRateMethod,
  LadderBandResult,
  LadderBandSpec,
  StandardisedProfile,
  ZoneResult,
} from "./types";

/** Tolerance for "upper edge inclusive" against floating-point noise in years (about 0.03 seconds). */
export const EDGE_EPSILON = 1e-9;

/** One notional amount on a ladder: signed market value, the years that slot it, its coupon and duration. */
export interface LadderEntry {
  currency: string;
  amount: number;
  /** residual maturity or time to next reset, years (maturity method) */
  years: number;
  /** coupon in percent */
  coupon: number;
  /** modified duration, years (duration method) */
  modifiedDuration?: number;
}

/**
 * The 0-based ladder row for a maturity and coupon (maturity method) or a modified duration (duration method,
 * the < 3 % column); upper edges are inclusive.
 * @example bandIndex(STANDARDISED_1996_PROFILE.interestRate, "maturity", 0.5, 5) // → 2 (the 3–6 m band)
 */
export function bandIndex(rules: StandardisedProfile["interestRate"], method: InterestRateMethod, years: number, coupon: number): number {
  const high = method === "maturity" && coupon >= rules.couponThresholdPercent;
  const bands = rules.bands;
  for (let i = 0; i < bands.length; i++) {
    const edge = high ? bands[i].highCouponUpToYears : bands[i].lowCouponUpToYears;
    if (edge === undefined) continue;
    if (edge === null || years <= edge + EDGE_EPSILON) return i;
  }
  // a column without an open-ended last row: the last row that column has
  for (let i = bands.length - 1; i >= 0; i--) {
    if ((high ? bands[i].highCouponUpToYears : bands[i].lowCouponUpToYears) !== undefined) return i;
  }
  return bands.length - 1;
}

/**
 * Offset two zones' nets where they have opposite signs, at `rate` on the amount offset.
 * @example offsetZones(1.3, -5.25, 0.4) // → { matched: 1.3, rate: 0.4, charge: 0.52, remainingA: 0, remainingB: -3.95 }
 */
export function offsetZones(a: number, b: number, rate: number): BetweenZoneResult {
  const matched = a * b < 0 ? Math.min(Math.abs(a), Math.abs(b)) : 0;
  return {
    matched,
    rate,
    charge: matched * rate,
    remainingA: a - Math.sign(a) * matched,
    remainingB: b - Math.sign(b) * matched,
  };
}

/**
 * The ladder algebra on per-band weighted longs and shorts (shorts ≤ 0): vertical, within zones, between zones in
 * the order 1–2, 2–3, 1–3, residual. Bands are the profile's rows; long/short are the unweighted amounts.
 * @example ladderCharge(rules, "maturity", "EUR", [{ long: 0, short: 0, weightedLong: 100, weightedShort: -90 }, …]).vertical // 9 on that band
 */
export function ladderCharge(
  rules: StandardisedProfile["interestRate"],
  method: InterestRateMethod,
  currency: string,
  perBand: readonly { long: number; short: number; weightedLong: number; weightedShort: number }[],
): InterestRateCurrencyResult {
  const verticalRate = method === "maturity" ? rules.verticalMaturity : rules.verticalDuration;
  const bands: LadderBandResult[] = rules.bands.map((spec: LadderBandSpec, i) => {
    const b = perBand[i] ?? { long: 0, short: 0, weightedLong: 0, weightedShort: 0 };
    const matched = Math.min(b.weightedLong, -b.weightedShort);
    return {
      band: spec.band,
      index: i + 1,
      zone: spec.zone,
      weight: method === "maturity" ? spec.weight : spec.yieldChange,
      long: b.long,
      short: b.short,
      weightedLong: b.weightedLong,
      weightedShort: b.weightedShort,
      matched,
      net: b.weightedLong + b.weightedShort,
      verticalCharge: matched * verticalRate,
    };
  });
  const zoneRates = { 1: rules.withinZone.zone1, 2: rules.withinZone.zone2, 3: rules.withinZone.zone3 } as const;
  const zones: ZoneResult[] = ([1, 2, 3] as const).map((zone) => {
    let netLong = 0;
    let netShort = 0;
    for (const b of bands) {
      if (b.zone !== zone) continue;
      if (b.net > 0) netLong += b.net;
      else netShort += b.net;
    }
    const matched = Math.min(netLong, -netShort);
    return { zone, netLong, netShort, matched, rate: zoneRates[zone], charge: matched * zoneRates[zone], net: netLong + netShort };
  });
  const zone12 = offsetZones(zones[0].net, zones[1].net, rules.betweenZones.zone12);
  const zone23 = offsetZones(zone12.remainingB, zones[2].net, rules.betweenZones.zone23);
  const zone13 = offsetZones(zone12.remainingA, zone23.remainingB, rules.betweenZones.zone13);
  const residual = Math.abs(zone13.remainingA + zone23.remainingA + zone13.remainingB);
  let vertical = 0;
  let verticalMatched = 0;
  for (const b of bands) {
    vertical += b.verticalCharge;
    verticalMatched += b.matched;
  }
  const withinZones = zones[0].charge + zones[1].charge + zones[2].charge;
  const residualCharge = residual * rules.residual;
  return {
    currency,
    method,
    bands,
    vertical,
    verticalRate,
    verticalMatched,
    zones,
    withinZones,
    between: { zone12: zone12.charge, zone23: zone23.charge, zone13: zone13.charge },
    betweenDetail: { zone12, zone23, zone13 },
    residual,
    residualCharge,
    charge: vertical + withinZones + zone12.charge + zone23.charge + zone13.charge + residualCharge,
  };
}

/**
 * General market risk of every currency's ladder (one ladder each, charges summed without offset).
 * @example interestRateGeneral([{ currency: "EUR", amount: 100, years: 0.2, coupon: 5 }], profile.interestRate, "maturity")[0].bands[1].weightedLong // → 0.2
 */
export function interestRateGeneral(
  entries: readonly LadderEntry[],
  rules: StandardisedProfile["interestRate"],
  method: InterestRateMethod,
): InterestRateCurrencyResult[] {
  const byCurrency = new Map<string, { long: number; short: number; weightedLong: number; weightedShort: number }[]>();
  for (const e of entries) {
    let perBand = byCurrency.get(e.currency);
    if (!perBand) {
      perBand = rules.bands.map(() => ({ long: 0, short: 0, weightedLong: 0, weightedShort: 0 }));
      byCurrency.set(e.currency, perBand);
    }
    const slotYears = method === "maturity" ? e.years : (e.modifiedDuration ?? 0);
    const i = bandIndex(rules, method, slotYears, e.coupon);
    const spec = rules.bands[i];
    const weighted = method === "maturity" ? e.amount * spec.weight : (e.amount * (e.modifiedDuration ?? 0) * spec.yieldChange) / 100;
    const b = perBand[i];
    if (e.amount >= 0) {
      b.long += e.amount;
      b.weightedLong += weighted;
    } else {
      b.short += e.amount;
      b.weightedShort += weighted;
    }
  }
  return [...byCurrency.keys()].sort().map((ccy) => ladderCharge(rules, method, ccy, byCurrency.get(ccy)!));
}
