/**
 * Minimise from several starting points: rank the starts by their value, run BFGS fully from the best,
 * then from the next ones, cutting a run short once it is clearly worse than the best found or has
 * reached the same optimum. Knows nothing of any model.
 */
import { minimizeBfgs, type BfgsOptions, type BfgsResult, type Objective } from "./minimize-bfgs";

/** Options of minimizeMultiStart. */
export interface MultiStartOptions extends Omit<BfgsOptions, "abandon" | "initialInverseHessian"> {
  /** a starting inverse Hessian for a run from x (null for the identity) */
  initialInverseHessian?: (x: Float64Array) => Float64Array | null;
  /** how many starts to run BFGS from (default 2) */
  runs?: number;
  /** a later run is cut short when, after a few iterations, its value exceeds the best by more than this (default 1e-3) */
  abandonMargin?: number;
  /** a later run that comes within this relative distance of the best value has confirmed it and stops (default 1e-9) */
  confirmTolerance?: number;
}

/** The best run, and a summary of all of them. */
export interface MultiStartResult extends BfgsResult {
  /** starting points evaluated */
  startsEvaluated: number;
  /** BFGS runs made */
  runs: number;
  /** total objective evaluations over all starts and runs */
  totalEvaluations: number;
  /** the value each run ended at, in the order run */
  runValues: number[];
}

/**
 * Minimise f from the best of several starting points.
 * @throws {RangeError} if no start gives a finite value
 */
export function minimizeMultiStart(f: Objective, starts: readonly ArrayLike<number>[], options: MultiStartOptions = {}): MultiStartResult {
  const runs = Math.max(1, options.runs ?? 2);
  const margin = options.abandonMargin ?? 1e-3;
  const confirm = options.confirmTolerance ?? 1e-9;
  const grad = new Float64Array(starts[0]?.length ?? 0);
  let evaluations = 0;
  const ranked = starts
    .map((x) => { evaluations++; const v = f(Float64Array.from(x), grad); return { x, v: Number.isFinite(v) ? v : Infinity }; })
    .filter((s) => s.v < Infinity)
    .sort((a, b) => a.v - b.v);
  if (ranked.length === 0) throw new RangeError("minimizeMultiStart requires at least one start with a finite value");
  let best: BfgsResult | null = null;
  const runValues: number[] = [];
  let made = 0;
  for (const start of ranked.slice(0, runs)) {
    const incumbent = best;
    const result = minimizeBfgs(f, start.x, {
      ...options,
      initialInverseHessian: options.initialInverseHessian?.(Float64Array.from(start.x)) ?? null,
      abandon: incumbent
        ? (iteration, value) => (iteration >= 5 && value > incumbent.value + margin) || (iteration >= 2 && Math.abs(value - incumbent.value) <= confirm * Math.max(1, Math.abs(incumbent.value)))
        : undefined,
    });
    made++;
    evaluations += result.evaluations;
    runValues.push(result.value);
    if (!best || result.value < best.value - confirm * Math.max(1, Math.abs(best.value)) || (!best.converged && result.converged && result.value <= best.value)) {
      best = result.stop === "abandoned" ? minimizeBfgs(f, result.x, { ...options, initialInverseHessian: null }) : result;
      if (result.stop === "abandoned") evaluations += best.evaluations;
    }
  }
  return { ...best!, startsEvaluated: ranked.length, runs: made, totalEvaluations: evaluations, runValues };
}
