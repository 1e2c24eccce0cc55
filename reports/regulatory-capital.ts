/**
 * The filed capital figure in the packs: which regime the run's capital rule profile files, that figure, the other
 * as comparison, the risk-weighted-asset equivalent where the profile asks, and the standardised building blocks in
 * summary lines. Built from a run's stored results; pure.
 */
import { filedCapitalOf, type RunStandardised } from "@/lib/runs/standardised";
import type { RunResults } from "@/lib/runs/types";
import { REGIME_LABELS, type CapitalRegime, type RegimeChoice } from "@/lib/validation/capital-profile";

/** The blocks in the order the total adds them, as the packs name them. */
export const PACK_BLOCK_LABELS = [
  ["interestRateSpecific", "Interest rate, specific risk"],
  ["interestRateGeneral", "Interest rate, general market risk"],
  ["equitySpecific", "Equities, specific risk"],
  ["equityGeneral", "Equities, general market risk"],
  ["fx", "Foreign exchange and gold"],
  ["commodities", "Commodities"],
  ["options", "Options"],
] as const;

/** What the packs show of the run's capital regimes. */
export interface RegulatoryCapitalView {
  regimes: RegimeChoice;
  filedRegime: CapitalRegime;
  filedLabel: string;
  /** null when the filed regime's figure could not be computed (then `missing` says why) */
  filed: number | null;
  filedRwa: number | null;
  missing: string | null;
  comparisonLabel: string | null;
  comparison: number | null;
  comparisonRwa: number | null;
  profileVersion: number | null;
  profileName: string;
  standardised: {
    total: number;
    rwa: number | null;
    profileName: string;
    blocks: { label: string; charge: number }[];
    ladders: { currency: string; method: string; vertical: number; withinZones: number; betweenZones: number; residualCharge: number; charge: number }[];
    equityMarkets: { market: string; gross: number; net: number; specific: number; general: number }[];
    fx: { netLong: number; netShort: number; gold: number; overallNetOpenPosition: number; rate: number; charge: number };
    commodities: { commodity: string; net: number; gross: number; charge: number }[];
    notes: string[];
  } | null;
}

/** The packs' view of a run's capital regimes (runs stored before regimes file the internal-models figure). */
export function regulatoryCapitalOfResults(results: Pick<RunResults, "monthEnd" | "capitalProfile"> & { standardised?: RunStandardised | null }): RegulatoryCapitalView {
  const { filed, comparison, missing, filedRegime } = filedCapitalOf(results);
  const cp = results.capitalProfile;
  const r = results.standardised?.result ?? null;
  return {
    regimes: cp.regimes ?? "internal_models",
    filedRegime,
    filedLabel: REGIME_LABELS[filedRegime],
    filed: filed?.capital ?? null,
    filedRwa: filed?.rwa ?? null,
    missing,
    comparisonLabel: comparison?.label ?? null,
    comparison: comparison?.capital ?? null,
    comparisonRwa: comparison?.rwa ?? null,
    profileVersion: cp.version ?? null,
    profileName: cp.name,
    standardised: r
      ? {
          total: r.total,
          rwa: cp.showRwa ? r.rwa : null,
          profileName: r.profileName,
          blocks: PACK_BLOCK_LABELS.map(([key, label]) => ({ label, charge: r.blocks[key] })),
          ladders: r.interestRate.byCurrency.map((l) => ({
            currency: l.currency,
            method: l.method,
            vertical: l.vertical,
            withinZones: l.withinZones,
            betweenZones: l.between.zone12 + l.between.zone23 + l.between.zone13,
            residualCharge: l.residualCharge,
            charge: l.charge,
          })),
          equityMarkets: r.equity.byMarket.map((m) => ({ market: m.market, gross: m.gross, net: m.net, specific: m.specific, general: m.general })),
          fx: { netLong: r.fx.netLong, netShort: r.fx.netShort, gold: r.fx.gold, overallNetOpenPosition: r.fx.overallNetOpenPosition, rate: r.fx.rate, charge: r.fx.charge },
          commodities: r.commodities.byCommodity.map((c) => ({ commodity: c.commodity, net: c.net, gross: c.gross, charge: c.charge })),
          notes: r.warnings.map((w) => w.message),
        }
      : null,
  };
}
