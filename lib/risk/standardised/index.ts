/** The standardised market-risk building blocks (1996): types, the default profile, validation and the entry point. */
import type { PositionIssue, StandardisedOptions, StandardisedPosition, StandardisedResult } from "./types";

export * from "./types";
export { STANDARDISED_1996_PROFILE, POSITION_COLUMNS } from "./profile";

/**
 * Check a position set against what the blocks need (row index 0-based, field, column, what is wrong); empty = usable.
 * @example validateStandardisedPositions([{ instrument: "B1", instrumentType: "bond", marketValue: 100, currency: "EUR" }], { reportingCurrency: "EUR" })
 *   // → [{ row: 0, field: "issuerCategory", column: "issuer_category", message: "…" }, …]
 */
export function validateStandardisedPositions(positions: readonly StandardisedPosition[], options: StandardisedOptions): PositionIssue[] {
  void positions;
  void options;
  throw new Error("standardised engine: not yet implemented");
}

/**
 * The standardised market-risk charge of a book: every block with every intermediate figure, total and RWA.
 * @example computeStandardised(positions, { reportingCurrency: "EUR", asOf: "2026-11-30" }).total
 */
export function computeStandardised(positions: readonly StandardisedPosition[], options: StandardisedOptions): StandardisedResult {
  void positions;
  void options;
  throw new Error("standardised engine: not yet implemented");
}
