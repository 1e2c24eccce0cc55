/**
 * The standardised market-risk charge of a book: positions → notional legs → the blocks (debt specific and general,
 * equity specific and general per market, foreign exchange with gold apart, commodities, bought options), each
 * with every intermediate figure; total and its risk-weighted-asset equivalent.
 */
import { ENGINE_VERSION } from "../version";
import { cashKind, derivativeUnderlying, residualYears, resetYears, type UnderlyingKind } from "./classify";
import { commodityRisk, type CommodityHolding } from "./commodities";
import { describeStandardisedMethod, STANDARDISED_LIMITATIONS } from "./describe";
import { equityRisk, equitySpecificRate, type EquityHolding } from "./equity";
import { fxRisk, type FxExposure } from "./fx";
import { bandIndex, interestRateGeneral, type LadderEntry } from "./interest-rate-general";
import { interestRateSpecific, specificRiskWeight, type DebtHolding } from "./interest-rate-specific";
import { boughtOptionCharge, hedgedOptionCharge, inTheMoneyAmount, isCarveOutHedge } from "./options";
import { STANDARDISED_1996_PROFILE } from "./profile";
import { StandardisedInputError, validateStandardisedPositions } from "./validate";
import type {
  LadderLeg,
  OptionResult,
  StandardisedOptions,
  StandardisedPosition,
  StandardisedProfile,
  StandardisedResult,
  StandardisedWarning,
} from "./types";

interface DebtTerms {
  category: NonNullable<StandardisedPosition["issuerCategory"]>;
  years: number;
  coupon: number;
  modifiedDuration?: number;
}

/** Specific and general rates of an underlying for the options approach. */
function underlyingRates(kind: UnderlyingKind, profile: StandardisedProfile, debt: DebtTerms | undefined): { specific: number; general: number } {
  if (kind === "equity") return { specific: equitySpecificRate(profile.equity), general: profile.equity.generalRate };
  if (kind === "fx" || kind === "gold") return { specific: 0, general: profile.options.fxRate };
  if (kind === "commodity") return { specific: 0, general: profile.options.commodityRate };
  const ir = profile.interestRate;
  const d = debt!;
  const specific = specificRiskWeight(ir.specific, d.category, d.years);
  if (ir.method === "maturity") return { specific, general: ir.bands[bandIndex(ir, "maturity", d.years, d.coupon)].weight };
  const md = d.modifiedDuration ?? 0;
  return { specific, general: (md * ir.bands[bandIndex(ir, "duration", md, d.coupon)].yieldChange) / 100 };
}

/**
 * The standardised charge of a book; throws StandardisedInputError (every issue listed) when a position lacks
 * what its block needs.
 * @example computeStandardised([{ instrument: "JPY", instrumentType: "currency", currency: "JPY", marketValue: 50 }], { reportingCurrency: "AED" }).blocks.fx // → 4
 */
export function computeStandardised(positions: readonly StandardisedPosition[], options: StandardisedOptions): StandardisedResult {
  const profile = options.profile ?? STANDARDISED_1996_PROFILE;
  const issues = validateStandardisedPositions(positions, options);
  if (issues.length) throw new StandardisedInputError(issues);
  const asOf = options.asOf;
  const reporting = options.reportingCurrency.toUpperCase();
  const method = profile.interestRate.method;
  const warnings: StandardisedWarning[] = [];
  const warnOnce = new Set<string>();
  const warn = (code: string, message: string) => {
    if (warnOnce.has(code)) return;
    warnOnce.add(code);
    warnings.push({ code, message });
  };

  // 1. Options first: a bought put on long cash (or a bought call on short cash) carves the covered cash out.
  const cashNet = new Map<string, { net: number; first: StandardisedPosition }>();
  for (const p of positions) {
    if (!cashKind(p.instrumentType)) continue;
    const id = p.instrument.trim();
    const c = cashNet.get(id);
    if (c) c.net += p.marketValue;
    else cashNet.set(id, { net: p.marketValue, first: p });
  }
  const covered = new Map<string, number>(); // instrument → covered amount (≥ 0)
  const optionResults: OptionResult[] = [];
  for (const p of positions) {
    if (p.instrumentType !== "option") continue;
    const kind = p.optionKind!;
    const quantity = p.quantity!;
    const price = p.underlyingPrice!;
    const underlying = p.underlying!.trim();
    const hedge = cashNet.get(underlying);
    const optionValueUnits = quantity * price;
    if (hedge && hedge.net !== 0 && isCarveOutHedge(hedge.net, kind)) {
      const used = covered.get(underlying) ?? 0;
      const value = Math.min(Math.abs(hedge.net) - used, optionValueUnits);
      if (value > 0) {
        covered.set(underlying, used + value);
        const h = hedge.first;
        const hk = cashKind(h.instrumentType)!;
        const rates = underlyingRates(hk, profile, hk === "debt" ? { category: h.issuerCategory!, years: residualYears(h, asOf)!, coupon: h.coupon ?? 0, modifiedDuration: h.modifiedDuration } : undefined);
        const coveredQuantity = value / price;
        const itm = inTheMoneyAmount(kind, p.strike!, price, coveredQuantity);
        optionResults.push({
          instrument: p.instrument,
          underlying,
          optionKind: kind,
          treatment: "hedged",
          underlyingValue: value,
          specificRate: rates.specific,
          generalRate: rates.general,
          inTheMoney: itm,
          optionValue: p.marketValue * (value / optionValueUnits),
          charge: hedgedOptionCharge(value, rates.specific, rates.general, itm),
        });
        if (value < optionValueUnits - 1e-9) {
          const restValue = optionValueUnits - value;
          const restRates = rates;
          const restOptionValue = p.marketValue * (restValue / optionValueUnits);
          optionResults.push({
            instrument: p.instrument,
            underlying,
            optionKind: kind,
            treatment: "bought",
            underlyingValue: restValue,
            specificRate: restRates.specific,
            generalRate: restRates.general,
            inTheMoney: inTheMoneyAmount(kind, p.strike!, price, restValue / price),
            optionValue: restOptionValue,
            charge: boughtOptionCharge(restValue, restRates.specific, restRates.general, restOptionValue),
          });
        }
        continue;
      }
    }
    const hk = hedge ? cashKind(hedge.first.instrumentType)! : derivativeUnderlying(p)!;
    const debt: DebtTerms | undefined =
      hk !== "debt"
        ? undefined
        : hedge
          ? { category: hedge.first.issuerCategory!, years: residualYears(hedge.first, asOf)!, coupon: hedge.first.coupon ?? 0, modifiedDuration: hedge.first.modifiedDuration }
          : { category: p.issuerCategory!, years: p.underlyingMaturityYears!, coupon: p.coupon!, modifiedDuration: p.modifiedDuration };
    const rates = underlyingRates(hk, profile, debt);
    optionResults.push({
      instrument: p.instrument,
      underlying,
      optionKind: kind,
      treatment: "bought",
      underlyingValue: optionValueUnits,
      specificRate: rates.specific,
      generalRate: rates.general,
      inTheMoney: inTheMoneyAmount(kind, p.strike!, price, quantity),
      optionValue: p.marketValue,
      charge: boughtOptionCharge(optionValueUnits, rates.specific, rates.general, p.marketValue),
    });
  }
  /** A cash row's amount left for the ordinary blocks after the carve-out. */
  const remaining = (p: StandardisedPosition): number => {
    const id = p.instrument.trim();
    const c = covered.get(id);
    if (!c) return p.marketValue;
    const net = cashNet.get(id)!.net;
    return p.marketValue * (1 - c / Math.abs(net));
  };

  // 2. Positions → blocks' inputs.
  const debt: DebtHolding[] = [];
  const ladder: LadderEntry[] = [];
  const legs: LadderLeg[] = [];
  const equities: EquityHolding[] = [];
  const commodities: CommodityHolding[] = [];
  const fx: FxExposure[] = [];
  const ir = profile.interestRate;
  const addLeg = (p: StandardisedPosition, leg: string, amount: number, years: number, coupon: number, modifiedDuration: number | undefined) => {
    ladder.push({ currency: p.currency, amount, years, coupon, modifiedDuration });
    const slot = method === "maturity" ? years : (modifiedDuration ?? 0);
    legs.push({ instrument: p.instrument, currency: p.currency, leg, amount, years: slot, coupon, band: ir.bands[bandIndex(ir, method, slot, coupon)].band });
  };

  for (const p of positions) {
    const type = p.instrumentType;
    const cash = cashKind(type);
    const amount = cash ? remaining(p) : p.marketValue;
    // foreign-exchange exposure of the position's own value (FX derivatives count by notional below; gold apart)
    if (type === "gold") fx.push({ currency: p.currency, amount, explicit: true, gold: true });
    else if (type === "currency") {
      if (p.currency === reporting) warn("currency-in-reporting", `Currency positions in the reporting currency (${reporting}) carry no foreign-exchange risk and are left out.`);
      fx.push({ currency: p.currency, amount, explicit: true });
    } else if (!((type === "future" || type === "forward") && derivativeUnderlying(p) === "fx")) {
      fx.push({ currency: p.currency, amount: p.marketValue, explicit: false });
    }

    switch (type) {
      case "bond":
      case "bill": {
        const years = residualYears(p, asOf)!;
        const reset = resetYears(p, asOf);
        debt.push({ instrument: p.instrument, currency: p.currency, issuerCategory: p.issuerCategory!, residualMaturityYears: years, amount });
        addLeg(p, reset !== undefined ? `${type}, floating: to next reset` : type, amount, reset ?? years, p.coupon ?? 0, p.modifiedDuration);
        break;
      }
      case "equity":
      case "fund":
        equities.push({ instrument: p.instrument, market: p.nationalMarket!.trim(), amount });
        break;
      case "commodity":
        commodities.push({ commodity: p.commodity!.trim(), amount, years: residualYears(p, asOf) });
        break;
      case "future":
      case "forward": {
        const u = derivativeUnderlying(p)!;
        const n = p.notional!;
        const delivery = residualYears(p, asOf);
        if (u === "debt") {
          debt.push({ instrument: p.underlying?.trim() || p.instrument, currency: p.currency, issuerCategory: p.issuerCategory!, residualMaturityYears: p.underlyingMaturityYears!, amount: n });
          addLeg(p, "deliverable bond", n, p.underlyingMaturityYears!, p.coupon!, p.modifiedDuration);
          addLeg(p, "zero-coupon leg to delivery", -n, delivery!, 0, delivery);
          if (method === "duration") warn("zero-duration", "Duration method: a zero-coupon leg's modified duration is taken as its time to maturity (its Macaulay duration), a slight overstatement.");
        } else if (u === "equity") {
          equities.push({ instrument: p.underlying?.trim() || p.instrument, market: p.nationalMarket!.trim(), amount: n });
          warn("derivative-rate-legs", "Equity, commodity and currency futures and forwards are taken at their notional in the underlying; their interest-rate legs are not put on the ladders.");
        } else if (u === "commodity") {
          commodities.push({ commodity: p.commodity!.trim(), amount: n, years: delivery });
          warn("derivative-rate-legs", "Equity, commodity and currency futures and forwards are taken at their notional in the underlying; their interest-rate legs are not put on the ladders.");
        } else {
          fx.push({ currency: p.currency, amount: n, explicit: true, gold: u === "gold" });
          warn("derivative-rate-legs", "Equity, commodity and currency futures and forwards are taken at their notional in the underlying; their interest-rate legs are not put on the ladders.");
        }
        break;
      }
      case "swap": {
        const n = p.notional!;
        const years = residualYears(p, asOf)!;
        const reset = resetYears(p, asOf)!;
        addLeg(p, "swap fixed leg", n, years, p.coupon!, p.modifiedDuration);
        addLeg(p, "swap floating leg", -n, reset, p.coupon!, reset);
        if (method === "duration") warn("zero-duration", "Duration method: a zero-coupon leg's modified duration is taken as its time to maturity (its Macaulay duration), a slight overstatement.");
        break;
      }
      default:
        break;
    }
  }

  // 3. The blocks.
  const specific = interestRateSpecific(debt, ir.specific);
  const byCurrency = interestRateGeneral(ladder, ir, method);
  const byMarket = equityRisk(equities, profile.equity);
  const fxResult = fxRisk(fx, reporting, profile.fx);
  const byCommodity = commodityRisk(commodities, profile.commodities);
  const sum = <T>(xs: readonly T[], f: (x: T) => number) => xs.reduce((s, x) => s + f(x), 0);
  const blocks = {
    interestRateSpecific: sum(specific, (l) => l.charge),
    interestRateGeneral: sum(byCurrency, (c) => c.charge),
    equitySpecific: sum(byMarket, (m) => m.specific),
    equityGeneral: sum(byMarket, (m) => m.general),
    fx: fxResult.charge,
    commodities: sum(byCommodity, (c) => c.charge),
    options: sum(optionResults, (o) => o.charge),
  };
  const total = blocks.interestRateSpecific + blocks.interestRateGeneral + blocks.equitySpecific + blocks.equityGeneral + blocks.fx + blocks.commodities + blocks.options;
  return {
    total,
    blocks,
    interestRate: { specific, legs, byCurrency },
    equity: { byMarket },
    fx: fxResult,
    commodities: { byCommodity },
    options: optionResults,
    rwa: total * profile.rwaMultiplier,
    rwaMultiplier: profile.rwaMultiplier,
    profileName: profile.name,
    asOf: asOf ?? null,
    reportingCurrency: reporting,
    warnings,
    statement: describeStandardisedMethod(profile, {
      debtIssues: specific.length,
      currencies: byCurrency.length,
      equityMarkets: byMarket.length,
      rateDerivatives: positions.some((p) => p.instrumentType === "swap" || ((p.instrumentType === "future" || p.instrumentType === "forward") && derivativeUnderlying(p) === "debt")),
      otherDerivatives: positions.some((p) => (p.instrumentType === "future" || p.instrumentType === "forward") && derivativeUnderlying(p) !== "debt"),
      options: optionResults.length > 0,
      commodities: byCommodity.length > 0,
      deMinimis: { met: fxResult.deMinimis.met, applied: fxResult.deMinimis.applied },
    }),
    limitations: [...STANDARDISED_LIMITATIONS],
    engineVersion: ENGINE_VERSION,
  };
}
