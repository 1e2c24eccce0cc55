/**
 * Equity position risk per national market: specific risk on the gross position (sum of |net per issue|) at 8 %,
 * or 4 % where the firm's profile says the portfolio is liquid and well diversified; general risk 8 % of |net|.
 */
import type { EquityMarketResult, StandardisedProfile } from "./types";

/** One equity holding: the issue, its national market and signed market value (or notional for a derivative). */
export interface EquityHolding {
  instrument: string;
  market: string;
  amount: number;
}

/** The specific-risk rate the profile applies to equities. @example equitySpecificRate({ ...rules, liquidAndDiversified: true }) // → 0.04 */
export function equitySpecificRate(rules: StandardisedProfile["equity"]): number {
  return rules.liquidAndDiversified ? rules.liquidDiversifiedRate : rules.specificRate;
}

/**
 * Specific and general equity risk per national market, each issue netted first.
 * @example equityRisk([{ instrument: "A", market: "XE", amount: 350000 }, { instrument: "B", market: "XE", amount: -500000 }], rules)[0].specific // → 68000
 */
export function equityRisk(holdings: readonly EquityHolding[], rules: StandardisedProfile["equity"]): EquityMarketResult[] {
  const markets = new Map<string, Map<string, number>>();
  for (const h of holdings) {
    let issues = markets.get(h.market);
    if (!issues) markets.set(h.market, (issues = new Map()));
    issues.set(h.instrument, (issues.get(h.instrument) ?? 0) + h.amount);
  }
  const specificRate = equitySpecificRate(rules);
  return [...markets.keys()].sort().map((market) => {
    const issues = [...markets.get(market)!.entries()].map(([instrument, net]) => ({ instrument, net }));
    let gross = 0;
    let net = 0;
    for (const i of issues) {
      gross += Math.abs(i.net);
      net += i.net;
    }
    return {
      market,
      gross,
      net,
      specificRate,
      specific: gross * specificRate,
      generalRate: rules.generalRate,
      general: Math.abs(net) * rules.generalRate,
      issues,
    };
  });
}
