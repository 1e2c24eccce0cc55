/**
 * The method statement of a standardised computation: plain sentences built from the rule profile actually used
 * (every rate as set) and from what the book contained, so a screen or pack says only what was computed.
 */
import type { StandardisedProfile } from "./types";

/** What the book held, as far as the sentences depend on it. */
export interface StatementFacts {
  /** debt issues with specific risk lines */
  debtIssues: number;
  /** interest-rate ladders (currencies) */
  currencies: number;
  equityMarkets: number;
  /** the book had bond futures or forwards, or swaps */
  rateDerivatives: boolean;
  /** the book had equity, commodity or currency futures or forwards */
  otherDerivatives: boolean;
  options: boolean;
  commodities: boolean;
  /** the de minimis test's outcome (met is null when it could not be made) */
  deMinimis: { met: boolean | null; applied: boolean };
}

/**
 * A rate as printed: 0.0025 → "0.25 %", 0.08 → "8 %".
 * @example pct(0.016) // → "1.6 %"
 */
export function pct(rate: number): string {
  return `${Number((rate * 100).toFixed(4))} %`;
}

function years(y: number): string {
  if (y < 1 && Math.abs(y * 12 - Math.round(y * 12)) < 1e-9) return `${Math.round(y * 12)} months`;
  return `${Number(y.toFixed(4))} years`;
}

/**
 * The sentences that describe the standardised computation under `profile`.
 * @example describeStandardisedMethod(STANDARDISED_1996_PROFILE, { debtIssues: 0, currencies: 1, equityMarkets: 0, rateDerivatives: false, otherDerivatives: false, options: false, commodities: false, deMinimis: { met: null, applied: false } })[0]
 *   // → 'Standardised building blocks under the rule profile "standardised 1996": …'
 */
export function describeStandardisedMethod(profile: StandardisedProfile, facts: StatementFacts): string[] {
  const ir = profile.interestRate;
  const s: string[] = [];
  s.push(
    `Standardised building blocks under the rule profile "${profile.name}": the market-risk capital is the sum of debt specific and general market risk, equity specific and general risk, foreign exchange, commodities and options` +
      (profile.showRwa ? `; its risk-weighted-asset equivalent is the total × ${profile.rwaMultiplier}.` : "."),
  );
  const tiers = ir.specific.qualifying
    .map((t, i) => (t.upToYears === null ? `${pct(t.rate)} ${i === 0 ? "at any maturity" : "beyond"}` : `${pct(t.rate)} up to ${years(t.upToYears)}`))
    .join(", ");
  if (facts.debtIssues > 0) {
    s.push(
      `Debt specific risk: each issue's net position, long or short, times its issuer category's weight: government ${pct(ir.specific.government)}; qualifying by residual maturity ${tiers}; other ${pct(ir.specific.other)} (issuer categories, not a ratings table).`,
    );
  }
  const order = `between zones 1 and 2 at ${pct(ir.betweenZones.zone12)}, then 2 and 3 at ${pct(ir.betweenZones.zone23)}, then 1 and 3 at ${pct(ir.betweenZones.zone13)}`;
  const zones = `within zones ${pct(ir.withinZone.zone1)} (zone 1), ${pct(ir.withinZone.zone2)} (zone 2) and ${pct(ir.withinZone.zone3)} (zone 3)`;
  const perCurrency = `one ladder per currency (${facts.currencies} in this book${facts.currencies > 1 ? ", the charges summed without offset between currencies" : ""})`;
  if (facts.currencies === 0) {
    // no interest-rate positions: no ladder to describe
  } else if (ir.method === "maturity") {
    s.push(
      `Debt general market risk by the maturity method: ${perCurrency}; positions slotted by residual maturity (floating rate: time to next reset) into ${ir.bands.length} bands, coupon ${ir.couponThresholdPercent} % or more and below ${ir.couponThresholdPercent} % in their own columns, upper edges inclusive, weighted by each band's risk weight; vertical disallowance ${pct(ir.verticalMaturity)} of each band's matched amount, ${zones}, ${order}, and the residual net position at ${pct(ir.residual)}.`,
    );
  } else {
    s.push(
      `Debt general market risk by the duration method: ${perCurrency}; each position weighted by market value × modified duration × the band's assumed change in yield, slotted by modified duration into ${ir.bands.length} bands (upper edges inclusive); vertical disallowance ${pct(ir.verticalDuration)} of each band's matched amount, ${zones}, ${order}, and the residual net position at ${pct(ir.residual)}.`,
    );
  }
  if (facts.rateDerivatives) {
    s.push(
      "Interest-rate derivatives as notional legs: a bond future or forward as a long position in the deliverable bond and a short zero-coupon position to delivery; a swap as its fixed leg at maturity and its floating leg at the next reset." +
        (ir.method === "duration" ? " A zero-coupon leg's modified duration is taken as its time to maturity." : ""),
    );
  }
  if (facts.otherDerivatives) s.push("Equity, commodity and currency futures and forwards are taken at their notional in the underlying; their interest-rate legs are not put on the ladders.");
  const eq = profile.equity;
  if (facts.equityMarkets > 0) s.push(
    `Equity per national market: specific risk ${pct(eq.liquidAndDiversified ? eq.liquidDiversifiedRate : eq.specificRate)} of the gross position (the sum of each issue's net position regardless of sign${eq.liquidAndDiversified ? "; the profile states the portfolio is liquid and well diversified" : ""}), general market risk ${pct(eq.generalRate)} of the net position.`,
  );
  const fx = profile.fx;
  const limits = `gross position up to ${pct(fx.deMinimisGrossLimit)} and overall net open position up to ${pct(fx.deMinimisNetLimit)} of eligible capital`;
  const deMinimis =
    facts.deMinimis.met === null
      ? "The de minimis test was not made: the profile gives no eligible capital."
      : `The de minimis test (${limits}) is ${facts.deMinimis.met ? "met" : "not met"}; ` +
        (facts.deMinimis.applied ? "the profile applies the exemption, so no foreign-exchange charge is added." : facts.deMinimis.met ? "the profile does not apply the exemption, so the charge stands." : "the charge stands.");
  s.push(
    `Foreign exchange by the shorthand method: the net position in each currency other than the reporting currency, from every position's currency and the explicit currency positions; the overall net open position is the larger of the net longs and the net shorts plus the net gold position, which never nets against currencies; charge ${pct(fx.rate)}. ${deMinimis}`,
  );
  if (facts.commodities) {
    const c = profile.commodities;
    s.push(
      c.method === "simplified"
        ? `Commodities by the simplified approach, per commodity at spot: ${pct(c.netRate)} of the net position plus ${pct(c.grossRate)} of the gross position; maturities play no part.`
        : `Commodities by the maturity ladder, per commodity: matched long and short positions in each band at ${pct(c.ladder.spreadRate)} on both sides, amounts carried to a later band to offset there at ${pct(c.ladder.carryRate)} per band moved, the remaining net position at ${pct(c.ladder.outrightRate)}.`,
    );
  }
  if (facts.options) {
    s.push(
      `Bought options by the simplified approach: long cash with a bought put, or short cash with a bought call, is carved out of the other blocks and charged at the underlying's value × (its specific + general rate) less the amount in the money, not below zero; a bought option without such a hedge at the lesser of that charge and the option's market value. Currency and gold underlyings at ${pct(profile.options.fxRate)}, commodities at ${pct(profile.options.commodityRate)}. A carved-out foreign-currency holding keeps its currency in the foreign-exchange block.`,
    );
  }
  return s;
}

/** What the standardised engine does not do, in plain words, for method statements and packs. */
export const STANDARDISED_LIMITATIONS: readonly string[] = [
  "Debt specific risk uses the three issuer categories of the 1996 rules (government, qualifying, other), not a ratings table.",
  "Equity futures and forwards carry the full equity specific-risk rate; no reduced rate for diversified index contracts is applied.",
  "The interest-rate legs of equity, commodity and currency futures and forwards are not put on the ladders.",
  "Options: only bought options are covered (the simplified approach); written options are refused, and no delta-plus or scenario approach is offered.",
  "Funds are treated as equities in the national market given for them.",
  "In the duration method a zero-coupon leg's modified duration is taken as its time to maturity.",
];
