/**
 * What a completed run stored about its portfolio, read back without recomputing: the correlation behind its
 * parametric figures and each factor's one-day volatility and exposure (the state the month-over-month explain
 * compares). Pure. Runs stored before the engine returned these give null, and callers recompute from the inputs.
 */
import type { PortfolioState } from "@/lib/risk";
import type { RunResults } from "./types";

/** The correlation the run used (rows in the order of `factors`), or null when the run did not store it. */
export function storedCorrelationOf(results: RunResults): { factors: string[]; matrix: number[][]; basis: string } | null {
  const c = results.monthEnd.correlation;
  return c ? { factors: [...c.factors], matrix: c.matrix.map((row) => [...row]), basis: c.basis } : null;
}

/**
 * The run's portfolio state for the explain: exposures per factor from the parametric figures, one-day volatilities
 * from the resolved model, the stored correlation. Null when the run stored no correlation or model.
 */
export function storedPortfolioStateOf(results: RunResults): PortfolioState | null {
  const c = results.monthEnd.correlation;
  const model = results.monthEnd.model;
  const parametric = results.monthEnd.methods.find((m) => m.method === "parametric");
  if (!c || !model || !parametric || parametric.byConfidence.length === 0) return null;
  const exposure = new Map(parametric.byConfidence[0].byFactor.map((f) => [f.factor, f.exposure]));
  const variance = new Map(model.factors.map((f) => [f.factor, f.variance]));
  const n = c.factors.length;
  const exposures = new Float64Array(n);
  const volatilities = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = variance.get(c.factors[i]);
    if (v === undefined || !(v >= 0)) return null;
    exposures[i] = exposure.get(c.factors[i]) ?? 0;
    volatilities[i] = Math.sqrt(v);
  }
  const values = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) values[i * n + j] = c.matrix[i][j];
  return { factors: [...c.factors], exposures, volatilities, correlation: { size: n, values } };
}

/** The names runs stored before the horizon figures were named for any horizon (`tenDay`, `var10d`, …), and today's. */
const EARLIER_HORIZON_KEYS: Readonly<Record<string, string>> = {
  tenDay: "horizon",
  var10d: "varHorizon",
  es10d: "esHorizon",
  componentVar10d: "componentVarHorizon",
  componentEs10d: "componentEsHorizon",
  standAloneVar10d: "standAloneVarHorizon",
  standAloneEs10d: "standAloneEsHorizon",
  diversificationBenefit10d: "diversificationBenefitHorizon",
};

function renameKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(renameKeys);
  if (value === null || typeof value !== "object") return value;
  return Object.fromEntries(Object.entries(value).map(([k, v]) => [EARLIER_HORIZON_KEYS[k] ?? k, renameKeys(v)]));
}

/**
 * A run's stored results under today's names: results stored before the horizon figures were renamed come back with
 * `horizon`, `varHorizon`, `componentVarHorizon`, … in place of `tenDay`, `var10d`, `componentVar10d`, … (same
 * values; a completed run's stored row never changes). Results already under today's names are returned as they are.
 */
export function resultsUnderCurrentNames(results: RunResults): RunResults {
  const first = results.monthEnd?.methods?.[0]?.byConfidence?.[0] as object | undefined;
  if (!first || !("tenDay" in first)) return results;
  return renameKeys(results) as RunResults;
}
