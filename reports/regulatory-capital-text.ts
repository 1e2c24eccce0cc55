/**
 * The "Capital filed" section's values: the filed figure, the other beside it, the profile version, and the
 * standardised building blocks line by line in summary. Content stored before regimes existed files the
 * internal-models figure (its capital). Pure.
 */
import { fragment } from "./filing-templates";
import { formatAmount, formatNumber } from "./format";
import type { FilingViewModel } from "./view-model";
import type { RegulatoryCapitalView } from "./regulatory-capital";

/** The view's regulatory capital, or the internal-models figure for content stored without one. */
export function regulatoryCapitalOf(vm: FilingViewModel): RegulatoryCapitalView {
  return (
    vm.figures.regulatoryCapital ?? {
      regimes: "internal_models",
      filedRegime: "internal_models",
      filedLabel: "Internal models (value-at-risk based)",
      filed: vm.figures.capital.capital,
      filedRwa: null,
      missing: null,
      comparisonLabel: null,
      comparison: null,
      comparisonRwa: null,
      profileVersion: null,
      profileName: "",
      standardised: null,
    }
  );
}

/** Template values of templates/filing/regulatory-capital.md. */
export function regulatoryCapitalValues(vm: FilingViewModel): Record<string, string> {
  const ccy = vm.figures.currency;
  const rc = regulatoryCapitalOf(vm);
  const amount = (v: number) => `${formatAmount(v)} ${ccy}`;
  const s = rc.standardised;
  const pct = (rate: number) => `${formatNumber(rate * 100, 0)} %`;
  return {
    filedLabel: rc.filedLabel.charAt(0).toLowerCase() + rc.filedLabel.slice(1),
    filedAmount: rc.filed !== null ? amount(rc.filed) : fragment("regulatory-capital-missing", { missing: rc.missing ?? "the run did not compute it." }),
    rwaSentence: rc.filedRwa !== null ? `Risk-weighted-asset equivalent (capital × 12.5): ${amount(rc.filedRwa)}.` : "",
    comparisonSentence:
      rc.comparison !== null && rc.comparisonLabel
        ? fragment("regulatory-capital-comparison", { comparisonLabel: rc.comparisonLabel.charAt(0).toLowerCase() + rc.comparisonLabel.slice(1), comparisonAmount: amount(rc.comparison) })
        : "",
    profileSentence: rc.profileVersion !== null ? `Computed under the firm's capital rule profile version ${rc.profileVersion} (${rc.profileName}).` : "",
    blocksHeading: s ? "Standardised building blocks" : "",
    blocksIntro: s ? `The standardised charge of ${amount(s.total)} is the sum of the blocks under the rule set "${s.profileName}":` : "",
    blocks: s ? s.blocks.map((b) => `${b.label}: ${amount(b.charge)}`).join("\n") : "",
    laddersIntro: s && s.ladders.length ? "General interest-rate risk, one ladder per currency, summed without offsetting:" : "",
    ladders: s
      ? s.ladders
          .map((l) => `${l.currency} (${l.method} method): vertical ${amount(l.vertical)} + within zones ${amount(l.withinZones)} + between zones ${amount(l.betweenZones)} + residual ${amount(l.residualCharge)} = ${amount(l.charge)}`)
          .join("\n")
      : "",
    equityIntro: s && s.equityMarkets.length ? "Equities per national market (gross and net positions; specific and general charges):" : "",
    equity: s ? s.equityMarkets.map((m) => `${m.market}: gross ${amount(m.gross)}, net ${amount(m.net)}; specific ${amount(m.specific)}, general ${amount(m.general)}`).join("\n") : "",
    fxSentence: s
      ? `Foreign exchange: net long ${amount(s.fx.netLong)}, net short ${amount(s.fx.netShort)}, gold ${amount(s.fx.gold)}; overall net open position ${amount(s.fx.overallNetOpenPosition)} at ${pct(s.fx.rate)} gives ${amount(s.fx.charge)}.`
      : "",
    commoditiesIntro: s && s.commodities.length ? "Commodities:" : "",
    commodities: s ? s.commodities.map((c) => `${c.commodity}: net ${amount(c.net)}, gross ${amount(c.gross)}, charge ${amount(c.charge)}`).join("\n") : "",
    notesIntro: s && s.notes.length ? "What the blocks did not cover or assumed:" : "",
    notes: s ? s.notes.join("\n") : "",
    caution: vm.caution,
  };
}
