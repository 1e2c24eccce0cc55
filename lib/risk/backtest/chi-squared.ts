/** χ² upper-tail probabilities for coverage tests, from the regularised incomplete gamma function. */
import { regularizedGammaQ } from "../var/distributions";

/**
 * The p-value P(χ²(df) ≥ statistic) = Q(df/2, statistic/2).
 * @throws {RangeError} if df is not a positive number or the statistic is negative or not a number
 * @example chiSquaredPValue(3.841459, 1); // ≈ 0.05
 */
export function chiSquaredPValue(statistic: number, df: number): number {
  if (!(df > 0)) throw new RangeError("chiSquaredPValue requires df > 0");
  if (Number.isNaN(statistic)) throw new RangeError("chiSquaredPValue requires a number");
  if (statistic <= 0) return 1; // a statistic of −0 from rounding counts as zero
  return regularizedGammaQ(df / 2, statistic / 2);
}
