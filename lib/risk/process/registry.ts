/**
 * The registry of volatility processes: one implementation of VolatilityProcess per estimator family. The command
 * line, compareEstimators, the factor report and the portfolio all fit through here; no other file switches on
 * the estimator kind.
 */
import type { ProcessFit, VolatilityKind, VolatilityProcess, VolatilitySpec } from "./types";

/** The process of a kind. @throws {RangeError} on an unknown kind */
export function volatilityProcess<K extends VolatilityKind>(kind: K): VolatilityProcess<Extract<VolatilitySpec, { kind: K }>> {
  void kind;
  throw new Error("volatilityProcess: not implemented yet (issue 13 contract)");
}

/** The spec with every default filled in. */
export function resolveSpec(spec: VolatilitySpec): VolatilitySpec {
  void spec;
  throw new Error("resolveSpec: not implemented yet (issue 13 contract)");
}

/** Plain-English label of a spec, with fitted parameters where given. */
export function specLabel(spec: VolatilitySpec, params?: Record<string, number>): string {
  void spec; void params;
  throw new Error("specLabel: not implemented yet (issue 13 contract)");
}

/** Fit a spec on returns (oldest first). @throws {Error} with the engine's reason when the fit is impossible */
export function fitProcess(returns: ArrayLike<number>, spec: VolatilitySpec, options: { warmStart?: Record<string, number>; lean?: boolean } = {}): ProcessFit {
  void returns; void spec; void options;
  throw new Error("fitProcess: not implemented yet (issue 13 contract)");
}

/** Fewest returns the spec needs (the window for a moving average, 100 + 10·m for ARCH(m), 100 for GARCH, 50 for fitted EWMA). */
export function minimumReturns(spec: VolatilitySpec): number {
  void spec;
  throw new Error("minimumReturns: not implemented yet (issue 13 contract)");
}
