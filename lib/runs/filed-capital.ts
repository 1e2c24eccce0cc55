/**
 * Which capital figure a run files and which it shows beside it, with the risk-weighted-asset equivalent where the
 * profile asks. Pure and light (no engine code), so the screens can use it.
 */
import { REGIME_LABELS, computesRegime, type CapitalRegime, type RegimeChoice } from "@/lib/validation/capital-profile";
import type { RunResults } from "./types";
import type { RunStandardised } from "./standardised";

/** The risk-weighted-asset equivalent of a capital figure: × 12.5 (the reciprocal of the 8 % minimum ratio). */
export const RWA_MULTIPLIER = 12.5;

/** One capital figure of a run, for the filing and the screens. */
export interface CapitalFigure {
  regime: CapitalRegime;
  label: string;
  capital: number;
  /** capital × 12.5, where the profile asks */
  rwa: number | null;
}

/** Which figure a run files and which it shows beside it. Runs stored before regimes file the internal-models figure. */
export function filedCapitalOf(results: Pick<RunResults, "monthEnd" | "capitalProfile"> & { standardised?: RunStandardised | null }): {
  filedRegime: CapitalRegime;
  filed: CapitalFigure | null;
  comparison: CapitalFigure | null;
  /** set when the filed regime's figure is missing (the reason) */
  missing: string | null;
} {
  const cp = results.capitalProfile;
  const regimes: RegimeChoice = cp.regimes ?? "internal_models";
  const filedRegime: CapitalRegime = cp.filedRegime ?? "internal_models";
  const showRwa = cp.showRwa ?? false;
  const figure = (regime: CapitalRegime): CapitalFigure | null => {
    if (!computesRegime(regimes, regime)) return null;
    const capital = regime === "internal_models" ? results.monthEnd.capital.capital : (results.standardised?.result?.total ?? null);
    if (capital === null || capital === undefined) return null;
    return { regime, label: REGIME_LABELS[regime], capital, rwa: showRwa ? capital * RWA_MULTIPLIER : null };
  };
  const other: CapitalRegime = filedRegime === "internal_models" ? "standardised" : "internal_models";
  const filed = figure(filedRegime);
  const missing = filed ? null : filedRegime === "standardised" ? (results.standardised?.error ?? "The run did not compute the standardised figure.") : "The run did not compute the internal-models figure.";
  return { filedRegime, filed, comparison: figure(other), missing };
}
