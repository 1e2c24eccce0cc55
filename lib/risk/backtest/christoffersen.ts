/**
 * Christoffersen (1998) independence and conditional-coverage tests on a 0/1 exception sequence:
 * LR_ind = −2 ln[(1−π)^(n00+n10) π^(n01+n11)] + 2 ln[(1−π01)^n00 π01^n01 (1−π11)^n10 π11^n11], χ²(1);
 * LR_cc = LR_POF + LR_ind, χ²(2). 0·ln 0 = 0 throughout.
 */
import { chiSquaredPValue } from "./chi-squared";
import { kupiecTest, xLogY } from "./kupiec";

export interface ChristoffersenResult {
  n00: number;
  n01: number;
  n10: number;
  n11: number;
  pi01: number;
  pi11: number;
  pi: number;
  lrInd: number;
  pValueInd: number;
  /** Kupiec's LR_POF on the same sequence (all T days) */
  lrPof: number;
  lrCc: number;
  pValueCc: number;
}

/**
 * Christoffersen's tests of independence and conditional coverage.
 * @param hits exceptions as booleans (or 0/1), oldest first, at least two days
 * @param expectedRate p in (0, 1)
 * @throws {RangeError} on fewer than two days or an impossible rate
 * @example christoffersenTest([false, true, false, false], 0.01).lrInd;
 */
export function christoffersenTest(hits: ArrayLike<boolean | number>, expectedRate: number): ChristoffersenResult {
  if (hits.length < 2) throw new RangeError("christoffersenTest requires at least 2 days");
  if (!(expectedRate > 0 && expectedRate < 1)) throw new RangeError("christoffersenTest requires 0 < expectedRate < 1");
  let n00 = 0, n01 = 0, n10 = 0, n11 = 0, x = 0;
  for (let t = 0; t < hits.length; t++) {
    if (hits[t]) x++;
    if (t === 0) continue;
    const prev = hits[t - 1] ? 1 : 0;
    const cur = hits[t] ? 1 : 0;
    if (prev === 0 && cur === 0) n00++;
    else if (prev === 0) n01++;
    else if (cur === 0) n10++;
    else n11++;
  }
  const pi01 = n00 + n01 > 0 ? n01 / (n00 + n01) : 0;
  const pi11 = n10 + n11 > 0 ? n11 / (n10 + n11) : 0;
  const pi = (n01 + n11) / (n00 + n01 + n10 + n11);
  const logNull = xLogY(n00 + n10, 1 - pi) + xLogY(n01 + n11, pi);
  const logAlt = xLogY(n00, 1 - pi01) + xLogY(n01, pi01) + xLogY(n10, 1 - pi11) + xLogY(n11, pi11);
  const lrInd = Math.max(0, -2 * logNull + 2 * logAlt);
  const lrPof = kupiecTest(hits.length, x, expectedRate).lr;
  const lrCc = lrPof + lrInd;
  return {
    n00, n01, n10, n11, pi01, pi11, pi,
    lrInd, pValueInd: chiSquaredPValue(lrInd, 1),
    lrPof, lrCc, pValueCc: chiSquaredPValue(lrCc, 2),
  };
}
