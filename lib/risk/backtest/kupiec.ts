/**
 * Kupiec (1995) proportion-of-failures test:
 * LR_POF = −2 ln[(1−p)^(T−x) p^x] + 2 ln[(1−x/T)^(T−x) (x/T)^x], χ²(1), with 0·ln 0 = 0.
 */
import { chiSquaredPValue } from "./chi-squared";

export interface KupiecResult {
  /** days observed, T */
  days: number;
  /** exceptions observed, x */
  exceptions: number;
  /** the expected exception probability p = 1 − confidence */
  expectedRate: number;
  observedRate: number;
  lr: number;
  pValue: number;
}

/** x·ln(y) with the convention 0·ln 0 = 0. */
export function xLogY(x: number, y: number): number {
  return x === 0 ? 0 : x * Math.log(y);
}

/**
 * Kupiec's proportion-of-failures likelihood-ratio test of unconditional coverage.
 * @param days number of observations T (> 0)
 * @param exceptions number of exceptions x, 0 ≤ x ≤ T
 * @param expectedRate p in (0, 1), e.g. 0.01 for a 99 % VaR
 * @throws {RangeError} on impossible counts or rates
 * @example kupiecTest(250, 0, 0.01).lr; // ≈ 5.025
 */
export function kupiecTest(days: number, exceptions: number, expectedRate: number): KupiecResult {
  if (!(Number.isInteger(days) && days > 0)) throw new RangeError("kupiecTest requires a positive whole number of days");
  if (!(Number.isInteger(exceptions) && exceptions >= 0 && exceptions <= days)) {
    throw new RangeError("kupiecTest requires 0 <= exceptions <= days");
  }
  if (!(expectedRate > 0 && expectedRate < 1)) throw new RangeError("kupiecTest requires 0 < expectedRate < 1");
  const T = days;
  const x = exceptions;
  const observed = x / T;
  const logNull = xLogY(T - x, 1 - expectedRate) + xLogY(x, expectedRate);
  const logAlt = xLogY(T - x, 1 - observed) + xLogY(x, observed);
  const lr = Math.max(0, -2 * logNull + 2 * logAlt);
  return { days: T, exceptions: x, expectedRate, observedRate: observed, lr, pValue: chiSquaredPValue(lr, 1) };
}
