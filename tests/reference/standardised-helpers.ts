/** Helpers for the standardised worked examples: a printed figure's precision and positions built per band. */
import { expect } from "vitest";
import type { StandardisedPosition } from "@/lib/risk/standardised";

/**
 * Check an unrounded value against a figure printed with `decimals` decimals (the sources round half-up):
 * the tolerance is half a unit of the last printed digit, never looser.
 */
export function expectPrinted(value: number, printed: number, decimals: number, label: string): void {
  const tolerance = 0.5 * 10 ** -decimals;
  expect(Math.abs(value - printed), `${label}: ${value} against printed ${printed} (±${tolerance})`).toBeLessThanOrEqual(tolerance + 1e-12);
}

/** A value inside each band of the coupon ≥ 3 % column (years): 13 bands, ≤1m … >20y. */
export const HIGH_COUPON_BAND_YEARS = [0.5 / 12, 2 / 12, 4.5 / 12, 9 / 12, 1.5, 2.5, 3.5, 4.5, 6, 8.5, 12.5, 17.5, 25];

/** A government bond (no specific risk) of a given value, maturity, coupon and, optionally, modified duration. */
export function govBond(instrument: string, marketValue: number, years: number, coupon = 5, modifiedDuration?: number, currency = "EUR"): StandardisedPosition {
  return { instrument, instrumentType: "bond", marketValue, currency, issuerCategory: "government", residualMaturityYears: years, coupon, modifiedDuration };
}
