/** Special functions the likelihoods need. */

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

/** ln Γ(x) for x > 0 (Lanczos approximation, g = 7; about 15 significant digits). @throws {RangeError} if x ≤ 0 */
export function logGamma(x: number): number {
  if (!(x > 0)) throw new RangeError("logGamma requires x > 0");
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
  const z = x - 1;
  let a = LANCZOS[0];
  const t = z + 7.5;
  for (let i = 1; i < 9; i++) a += LANCZOS[i] / (z + i);
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(a);
}

/** The digamma function ψ(x) = d ln Γ(x)/dx for x > 0 (recurrence to x ≥ 6, then the asymptotic series). @throws {RangeError} if x ≤ 0 */
export function digamma(x: number): number {
  if (!(x > 0)) throw new RangeError("digamma requires x > 0");
  let r = 0;
  while (x < 6) { r -= 1 / x; x += 1; }
  const f = 1 / (x * x);
  return r + Math.log(x) - 0.5 / x - f * (1 / 12 - f * (1 / 120 - f * (1 / 252 - f * (1 / 240 - f / 132))));
}
