/**
 * Debt specific risk: the net position in each issue, long or short alike, times its issuer category's weight
 * (qualifying issuers by residual maturity, upper edge inclusive), summed.
 */
import { EDGE_EPSILON } from "./interest-rate-general";
import type { DebtSpecificLine, IssuerCategory, StandardisedProfile } from "./types";

/**
 * The specific-risk weight of a debt issue.
 * @example specificRiskWeight(STANDARDISED_1996_PROFILE.interestRate.specific, "qualifying", 0.5) // → 0.0025
 */
export function specificRiskWeight(rules: StandardisedProfile["interestRate"]["specific"], category: IssuerCategory, years: number): number {
  if (category === "government") return rules.government;
  if (category === "other") return rules.other;
  for (const tier of rules.qualifying) {
    if (tier.upToYears === null || years <= tier.upToYears + EDGE_EPSILON) return tier.rate;
  }
  return rules.qualifying[rules.qualifying.length - 1]?.rate ?? 0;
}

/** One debt holding for specific risk: the issue, its category, residual maturity and signed market value. */
export interface DebtHolding {
  instrument: string;
  currency: string;
  issuerCategory: IssuerCategory;
  residualMaturityYears: number;
  amount: number;
}

/**
 * Specific risk per issue: holdings of the same instrument are netted first, then |net| × weight.
 * @example interestRateSpecific([{ instrument: "Q1", currency: "EUR", issuerCategory: "qualifying", residualMaturityYears: 0.75, amount: -7500 }], rules)[0].charge // → 75
 */
export function interestRateSpecific(holdings: readonly DebtHolding[], rules: StandardisedProfile["interestRate"]["specific"]): DebtSpecificLine[] {
  const byIssue = new Map<string, DebtSpecificLine>();
  for (const h of holdings) {
    const key = `${h.instrument}\u0000${h.currency}`;
    const line = byIssue.get(key);
    if (line) line.net += h.amount;
    else {
      byIssue.set(key, {
        instrument: h.instrument,
        currency: h.currency,
        issuerCategory: h.issuerCategory,
        residualMaturityYears: h.residualMaturityYears,
        net: h.amount,
        rate: specificRiskWeight(rules, h.issuerCategory, h.residualMaturityYears),
        charge: 0,
      });
    }
  }
  const lines = [...byIssue.values()];
  for (const l of lines) l.charge = Math.abs(l.net) * l.rate;
  return lines;
}
