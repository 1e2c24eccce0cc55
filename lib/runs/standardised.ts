/**
 * The standardised building blocks in a run: the regime fields a run stores with its capital rule profile, the
 * stored positions' attributes, the standardised figure computed from the run's stored inputs, and which figure is
 * filed (with the other as comparison and the risk-weighted-asset equivalent where the profile asks). Pure.
 */
import { computeStandardised, STANDARDISED_1996_PROFILE, validateStandardisedPositions, type StandardisedProfile, type StandardisedResult } from "@/lib/risk/standardised";
import { attributesFromStored, standardisedPositionOf, type PositionAttributes } from "@/lib/uploads/position-attributes";
import { CAPITAL_REGIMES, REGIME_CHOICES, computesRegime, type CapitalRegime, type RegimeChoice } from "@/lib/validation/capital-profile";
import type { RunCapitalProfile, RunInputs, StoredPosition } from "./types";

export { filedCapitalOf, RWA_MULTIPLIER, type CapitalFigure } from "./filed-capital";

/** The stored profile row's regime fields, as a run stores them with its capital profile. */
export function regimeFieldsOf(row: { version: number; regimes: string; filedRegime: string; showRwa: boolean; standardised: unknown }): Pick<RunCapitalProfile, "version" | "regimes" | "filedRegime" | "showRwa" | "standardised"> {
  const regimes: RegimeChoice = (REGIME_CHOICES as readonly string[]).includes(row.regimes) ? (row.regimes as RegimeChoice) : "internal_models";
  const filedRegime: CapitalRegime = (CAPITAL_REGIMES as readonly string[]).includes(row.filedRegime) ? (row.filedRegime as CapitalRegime) : "internal_models";
  const standardised = computesRegime(regimes, "standardised")
    ? { ...((row.standardised as StandardisedProfile | null) ?? STANDARDISED_1996_PROFILE), showRwa: row.showRwa }
    : null;
  return { version: row.version, regimes, filedRegime, showRwa: row.showRwa, standardised };
}

/** A stored positions row's attributes as a run stores them (left out when the row has none, so older hashes hold). */
export function storedAttributesOf(row: Parameters<typeof attributesFromStored>[0]): { attributes?: PositionAttributes } {
  const attributes = attributesFromStored(row);
  return attributes ? { attributes } : {};
}

/** What a run stores of the standardised figure. */
export interface RunStandardised {
  /** the full result, every line; null when it could not be computed */
  result: StandardisedResult | null;
  /** why it could not be computed: each position lacking an attribute, by its file row and column */
  problems: { row: number; instrument: string; column: string; message: string }[];
  error: string | null;
}

/** The standardised figure of a run's stored inputs, when its profile computes it; null otherwise. */
export function standardisedOfRun(inputs: Pick<RunInputs, "positions" | "capitalProfile" | "periodEnd" | "reportingCurrency">): RunStandardised | null {
  const cp = inputs.capitalProfile;
  if (!cp.regimes || !computesRegime(cp.regimes, "standardised")) return null;
  const profile = cp.standardised ?? { ...STANDARDISED_1996_PROFILE, showRwa: cp.showRwa ?? false };
  const positions = inputs.positions.map((p: StoredPosition) =>
    standardisedPositionOf({ instrument: p.instrument, assetClass: p.assetClass, currency: p.currency, quantity: p.quantity, marketValue: p.marketValue, attributes: p.attributes }, inputs.reportingCurrency),
  );
  const options = { reportingCurrency: inputs.reportingCurrency, asOf: inputs.periodEnd, profile };
  const issues = validateStandardisedPositions(positions, options);
  if (issues.length > 0) {
    const problems = issues.map((i) => ({ row: inputs.positions[i.row]?.row ?? i.row + 2, instrument: inputs.positions[i.row]?.instrument ?? "", column: i.column, message: i.message }));
    const first = problems.slice(0, 3).map((p) => `row ${p.row} (${p.instrument}), column ${p.column}: ${p.message}`).join("; ");
    return { result: null, problems, error: `The standardised figure could not be computed: ${problems.length} position attribute(s) are missing or wrong — ${first}${problems.length > 3 ? "; …" : ""}.` };
  }
  return { result: computeStandardised(positions, options), problems: [], error: null };
}

