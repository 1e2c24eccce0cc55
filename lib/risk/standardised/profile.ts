/**
 * The default "standardised 1996" rule profile: the Basel Committee's January 1996 amendment to the capital accord
 * to incorporate market risks, Part A (the building blocks). Every figure is a setting a firm may change to its
 * local rules.
 */
import type { StandardisedPosition, StandardisedProfile } from "./types";

const M = 1 / 12;

/** Defaults of the 1996 building blocks: specific-risk weights, the maturity ladder (two coupon columns), the
 *  duration method's yield changes, disallowances, equity, FX, commodity and option rates, RWA × 12.5. */
export const STANDARDISED_1996_PROFILE: StandardisedProfile = {
  name: "standardised 1996",
  interestRate: {
    method: "maturity",
    specific: {
      government: 0,
      qualifying: [
        { upToYears: 0.5, rate: 0.0025 },
        { upToYears: 2, rate: 0.01 },
        { upToYears: null, rate: 0.016 },
      ],
      other: 0.08,
    },
    couponThresholdPercent: 3,
    bands: [
      { band: "≤ 1 m", zone: 1, weight: 0, highCouponUpToYears: M, lowCouponUpToYears: M, yieldChange: 1 },
      { band: "1–3 m", zone: 1, weight: 0.002, highCouponUpToYears: 3 * M, lowCouponUpToYears: 3 * M, yieldChange: 1 },
      { band: "3–6 m", zone: 1, weight: 0.004, highCouponUpToYears: 6 * M, lowCouponUpToYears: 6 * M, yieldChange: 1 },
      { band: "6–12 m", zone: 1, weight: 0.007, highCouponUpToYears: 1, lowCouponUpToYears: 1, yieldChange: 1 },
      { band: "1–2 y | 1–1.9 y", zone: 2, weight: 0.0125, highCouponUpToYears: 2, lowCouponUpToYears: 1.9, yieldChange: 0.9 },
      { band: "2–3 y | 1.9–2.8 y", zone: 2, weight: 0.0175, highCouponUpToYears: 3, lowCouponUpToYears: 2.8, yieldChange: 0.8 },
      { band: "3–4 y | 2.8–3.6 y", zone: 2, weight: 0.0225, highCouponUpToYears: 4, lowCouponUpToYears: 3.6, yieldChange: 0.75 },
      { band: "4–5 y | 3.6–4.3 y", zone: 3, weight: 0.0275, highCouponUpToYears: 5, lowCouponUpToYears: 4.3, yieldChange: 0.75 },
      { band: "5–7 y | 4.3–5.7 y", zone: 3, weight: 0.0325, highCouponUpToYears: 7, lowCouponUpToYears: 5.7, yieldChange: 0.7 },
      { band: "7–10 y | 5.7–7.3 y", zone: 3, weight: 0.0375, highCouponUpToYears: 10, lowCouponUpToYears: 7.3, yieldChange: 0.65 },
      { band: "10–15 y | 7.3–9.3 y", zone: 3, weight: 0.045, highCouponUpToYears: 15, lowCouponUpToYears: 9.3, yieldChange: 0.6 },
      { band: "15–20 y | 9.3–10.6 y", zone: 3, weight: 0.0525, highCouponUpToYears: 20, lowCouponUpToYears: 10.6, yieldChange: 0.6 },
      { band: "> 20 y | 10.6–12 y", zone: 3, weight: 0.06, highCouponUpToYears: null, lowCouponUpToYears: 12, yieldChange: 0.6 },
      { band: "12–20 y (coupon < 3 %)", zone: 3, weight: 0.08, lowCouponUpToYears: 20, yieldChange: 0.6 },
      { band: "> 20 y (coupon < 3 %)", zone: 3, weight: 0.125, lowCouponUpToYears: null, yieldChange: 0.6 },
    ],
    verticalMaturity: 0.1,
    verticalDuration: 0.05,
    withinZone: { zone1: 0.4, zone2: 0.3, zone3: 0.3 },
    betweenZones: { zone12: 0.4, zone23: 0.4, zone13: 1 },
    residual: 1,
  },
  equity: { specificRate: 0.08, liquidDiversifiedRate: 0.04, liquidAndDiversified: false, generalRate: 0.08 },
  fx: { rate: 0.08, applyDeMinimis: false, deMinimisGrossLimit: 1, deMinimisNetLimit: 0.02, eligibleCapital: null },
  commodities: {
    method: "simplified",
    netRate: 0.15,
    grossRate: 0.03,
    // maturity ladder of the 1996 amendment, from memory: 0–1 m, 1–3 m, 3–6 m, 6–12 m, 1–2 y, 2–3 y, > 3 y
    ladder: { upToYears: [M, 3 * M, 6 * M, 1, 2, 3, null], spreadRate: 0.015, carryRate: 0.006, outrightRate: 0.15 },
  },
  options: { fxRate: 0.08, commodityRate: 0.15 },
  showRwa: true,
  rwaMultiplier: 12.5,
};

/** The positions file's column for each position field (snake case, as the upload layout names them). */
export const POSITION_COLUMNS: Record<keyof StandardisedPosition, string> = {
  instrument: "instrument",
  assetClass: "asset_class",
  instrumentType: "instrument_type",
  marketValue: "market_value",
  currency: "currency",
  issuerCategory: "issuer_category",
  residualMaturityYears: "residual_maturity_years",
  maturityDate: "maturity_date",
  coupon: "coupon",
  nextResetYears: "next_reset_years",
  nextResetDate: "next_reset_date",
  modifiedDuration: "modified_duration",
  nationalMarket: "national_market",
  commodity: "commodity",
  notional: "notional",
  underlyingMaturityYears: "underlying_maturity_years",
  underlying: "underlying",
  optionKind: "option_kind",
  strike: "strike",
  quantity: "quantity",
  underlyingPrice: "underlying_price",
};
