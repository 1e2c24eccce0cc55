/**
 * Start-up variance rules. The start-up rule moves the fitted numbers, so it is a named, stated option.
 * Most rules give a "backcast" B, a weighted mean of early squared residuals, used as the pre-sample
 * squared residual and variance: σ²₁ = ω + (α+β)·B for GARCH, σ²₁ = B for EWMA, e²₀, e²₋₁, … = B for ARCH.
 */

/**
 * - "sample": B = mean of all T squared residuals at the current mean (the DEM/GBP benchmark convention)
 * - "backcast": B = exponentially weighted mean (weights 0.94^i) of the first 75 squared residuals
 * - { firstReturns: k }: B = mean of the first k squared residuals
 * - "unconditional": σ²₁ = V_L = ω/(1−α−β) (GARCH only)
 * - a number: σ²₁ fixed by the caller (in the units of the returns squared)
 */
export type InitRule = "sample" | "backcast" | "unconditional" | { firstReturns: number } | number;

/** A one-line statement of a start-up rule, for results and reports. */
export function describeInit(rule: InitRule): string {
  if (typeof rule === "number") return `fixed: the first day's variance is ${rule}`;
  if (rule === "sample") return "sample: pre-sample squared residual and variance = mean of all squared residuals (at the fitted mean)";
  if (rule === "backcast") return "backcast: pre-sample squared residual and variance = 0.94-weighted mean of the first 75 squared residuals";
  if (rule === "unconditional") return "unconditional: the first day's variance is the model's long-run variance";
  return `first-${rule.firstReturns}: pre-sample squared residual and variance = mean of the first ${rule.firstReturns} squared residuals`;
}

const sampleWeights = new Map<number, Float64Array>();

/** Weights over the first k observations whose weighted mean of squared residuals is the backcast; null for rules without one. */
export function backcastWeights(rule: InitRule, n: number): Float64Array | null {
  if (typeof rule === "number" || rule === "unconditional") return null;
  if (rule === "sample") {
    // the same n comes back many times in a backtest's refits: keep the last few (callers only read them)
    let w = sampleWeights.get(n);
    if (!w) {
      w = new Float64Array(n).fill(1 / n);
      if (sampleWeights.size >= 64) sampleWeights.delete(sampleWeights.keys().next().value as number);
      sampleWeights.set(n, w);
    }
    return w;
  }
  if (rule === "backcast") {
    const k = Math.min(75, n);
    const w = new Float64Array(k);
    let sum = 0;
    for (let i = 0; i < k; i++) { w[i] = Math.pow(0.94, i); sum += w[i]; }
    for (let i = 0; i < k; i++) w[i] /= sum;
    return w;
  }
  const k = rule.firstReturns;
  if (!(Number.isInteger(k) && k >= 1 && k <= n)) throw new RangeError(`firstReturns must be an integer from 1 to ${n}`);
  return new Float64Array(k).fill(1 / k);
}

/** The backcast B = Σ wᵢ·(xᵢ − mu)² for the given weights. */
export function backcastValue(returns: ArrayLike<number>, weights: Float64Array, mu = 0): number {
  let b = 0;
  for (let i = 0; i < weights.length; i++) { const e = returns[i] - mu; b += weights[i] * e * e; }
  return b;
}

/** Check a start-up rule is well formed. @throws {RangeError} */
export function checkInit(rule: InitRule, name: string): void {
  if (typeof rule === "number") {
    if (!(Number.isFinite(rule) && rule > 0)) throw new RangeError(`${name} requires a positive initial variance`);
    return;
  }
  if (rule === "sample" || rule === "backcast" || rule === "unconditional") return;
  if (typeof rule === "object" && rule !== null && Number.isInteger(rule.firstReturns) && rule.firstReturns >= 1) return;
  throw new RangeError(`${name}: unknown start-up rule ${JSON.stringify(rule)}`);
}
