import { describe, expect, it } from "vitest";
import {
  commodityLadder,
  computeStandardised,
  fxRisk,
  parseIsoDate,
  specificRiskWeight,
  STANDARDISED_1996_PROFILE,
  yearsBetween,
  type StandardisedPosition,
  type StandardisedProfile,
} from "@/lib/risk/standardised";

// Rules: Basel Committee (1996) market-risk amendment, Part A (the building blocks).
const P = STANDARDISED_1996_PROFILE;
const specific = P.interestRate.specific;

describe("debt specific-risk weights at exactly 6 and 24 months", () => {
  it("qualifying: 0.25 % up to and including 6 months, 1.00 % up to and including 24 months, 1.60 % beyond", () => {
    expect(specificRiskWeight(specific, "qualifying", 0.5)).toBe(0.0025);
    expect(specificRiskWeight(specific, "qualifying", 0.5 + 1e-6)).toBe(0.01);
    expect(specificRiskWeight(specific, "qualifying", 2)).toBe(0.01);
    expect(specificRiskWeight(specific, "qualifying", 2 + 1e-6)).toBe(0.016);
  });
  it("from dates: 2026-11-30 → 2027-05-31 is 6 months, → 2028-11-30 is 24 months, a day later is over", () => {
    const q = (instrument: string, maturityDate: string): StandardisedPosition => ({ instrument, instrumentType: "bond", currency: "EUR", marketValue: 1000, issuerCategory: "qualifying", maturityDate, coupon: 4 });
    const r = computeStandardised([q("6m", "2027-05-31"), q("24m", "2028-11-30"), q("24m+1d", "2028-12-01")], { reportingCurrency: "EUR", asOf: "2026-11-30" });
    expect(r.interestRate.specific.map((l) => l.rate)).toEqual([0.0025, 0.01, 0.016]);
    expect(r.interestRate.specific.map((l) => l.charge)).toEqual([2.5, 10, 16]);
  });
  it("government 0 %, other 8 %, whatever the maturity", () => {
    expect(specificRiskWeight(specific, "government", 30)).toBe(0);
    expect(specificRiskWeight(specific, "other", 0.1)).toBe(0.08);
  });
  it("long and short in one issue net before the weight", () => {
    const b = (mv: number): StandardisedPosition => ({ instrument: "X", instrumentType: "bond", currency: "EUR", marketValue: mv, issuerCategory: "other", residualMaturityYears: 3, coupon: 5 });
    const r = computeStandardised([b(1000), b(-400)], { reportingCurrency: "EUR" });
    expect(r.interestRate.specific).toHaveLength(1);
    expect(r.blocks.interestRateSpecific).toBeCloseTo(48, 9);
  });
});

describe("year fractions from dates", () => {
  it("whole months are exact twelfths; month-end to month-end counts whole months", () => {
    expect(yearsBetween("2026-11-30", "2027-11-30")).toBe(1);
    expect(yearsBetween("2026-11-30", "2027-02-28")).toBe(0.25);
    expect(yearsBetween("2026-01-15", "2026-07-15")).toBe(0.5);
    expect(yearsBetween("2026-11-30", "2026-12-15")).toBeCloseTo(15 / 31 / 12, 12);
  });
  it("leap years: 29 February is a month end; a day that does not exist is no date", () => {
    expect(yearsBetween("2024-02-29", "2025-02-28")).toBe(1);
    expect(yearsBetween("2027-12-31", "2028-02-29")).toBe(2 / 12);
    expect(yearsBetween("2027-12-31", "2028-02-28")).toBeCloseTo((1 + 28 / 29) / 12, 12);
    expect(yearsBetween("2027-05-31", "2026-11-30")).toBe(-0.5);
    expect(parseIsoDate("2028-02-29")).toEqual([2028, 2, 29]);
    expect(parseIsoDate("2026-02-29")).toBeNull();
    expect(parseIsoDate("2100-02-29")).toBeNull();
    expect(parseIsoDate("2026-1-05")).toBeNull();
  });
});

describe("foreign exchange: gold never nets against currencies", () => {
  it("gold +50 against USD −50 is 50 + 50, not 0", () => {
    const r = fxRisk([{ currency: "XAU", amount: 50, explicit: true, gold: true }, { currency: "USD", amount: -50, explicit: true }], "EUR", P.fx);
    expect(r.netShort).toBe(-50);
    expect(r.gold).toBe(50);
    expect(r.overallNetOpenPosition).toBe(100);
    expect(r.charge).toBe(8);
  });
  it("gold priced in USD adds nothing to the USD position", () => {
    const r = computeStandardised([{ instrument: "bar", instrumentType: "gold", currency: "USD", marketValue: 70 }], { reportingCurrency: "EUR" });
    expect(r.fx.byCurrency).toEqual([]);
    expect(r.fx.gold).toBe(70);
  });
  it("the reporting currency is no foreign-exchange position", () => {
    const r = computeStandardised([{ instrument: "EUR cash", instrumentType: "currency", currency: "EUR", marketValue: 500 }], { reportingCurrency: "EUR" });
    expect(r.fx.overallNetOpenPosition).toBe(0);
    expect(r.warnings.map((w) => w.code)).toContain("currency-in-reporting");
  });
  it("de minimis: always reported, applied only where the profile says so", () => {
    const exposures = [{ currency: "USD", amount: 10, explicit: true }];
    const reported = fxRisk(exposures, "EUR", { ...P.fx, eligibleCapital: 1000 });
    expect(reported.deMinimis).toMatchObject({ tested: true, gross: 10, grossLimit: 1000, netLimit: 20, met: true, applied: false });
    expect(reported.charge).toBeCloseTo(0.8, 12);
    const applied = fxRisk(exposures, "EUR", { ...P.fx, eligibleCapital: 1000, applyDeMinimis: true });
    expect(applied.deMinimis.applied).toBe(true);
    expect(applied.charge).toBe(0);
    expect(applied.deMinimis.chargeBeforeExemption).toBeCloseTo(0.8, 12);
    const over = fxRisk([{ currency: "USD", amount: 30, explicit: true }], "EUR", { ...P.fx, eligibleCapital: 1000, applyDeMinimis: true });
    expect(over.deMinimis.met).toBe(false);
    expect(over.charge).toBeCloseTo(2.4, 12);
    expect(fxRisk(exposures, "EUR", P.fx).deMinimis).toMatchObject({ tested: false, met: null, applied: false });
  });
});

describe("equity", () => {
  it("4 % specific where the profile says liquid and well diversified; markets kept apart", () => {
    const eq = (instrument: string, market: string, marketValue: number): StandardisedPosition => ({ instrument, instrumentType: "equity", nationalMarket: market, currency: "EUR", marketValue });
    const profile: StandardisedProfile = { ...P, equity: { ...P.equity, liquidAndDiversified: true } };
    const r = computeStandardised([eq("A", "DE", 1000), eq("B", "FR", -1000)], { reportingCurrency: "EUR", profile });
    expect(r.equity.byMarket.map((m) => [m.market, m.specific, m.general])).toEqual([["DE", 40, 80], ["FR", 40, 80]]);
  });
});

describe("derivatives as notional legs", () => {
  it("a bond future: long the deliverable at its maturity, short a zero-coupon leg to delivery", () => {
    const f: StandardisedPosition = { instrument: "FUT", instrumentType: "future", assetClass: "government_bond", currency: "EUR", marketValue: 0, notional: 1000, residualMaturityYears: 0.25, underlyingMaturityYears: 8.5, coupon: 6, issuerCategory: "government" };
    const r = computeStandardised([f], { reportingCurrency: "EUR" });
    expect(r.interestRate.legs.map((l) => [l.leg, l.amount, l.band])).toEqual([
      ["deliverable bond", 1000, "7–10 y | 5.7–7.3 y"],
      ["zero-coupon leg to delivery", -1000, "1–3 m"],
    ]);
    const l = r.interestRate.byCurrency[0];
    expect(l.bands[9].weightedLong).toBeCloseTo(37.5, 9);
    expect(l.bands[1].weightedShort).toBeCloseTo(-2, 9);
  });
  it("a swap received fixed: long the fixed leg at maturity, short the floating leg at the next reset", () => {
    const s: StandardisedPosition = { instrument: "SW", instrumentType: "swap", currency: "USD", marketValue: 0, notional: 1000, residualMaturityYears: 5, coupon: 3.1, nextResetYears: 0.5 };
    const r = computeStandardised([s], { reportingCurrency: "EUR" });
    expect(r.interestRate.legs.map((l) => [l.leg, l.amount, l.band])).toEqual([
      ["swap fixed leg", 1000, "4–5 y | 3.6–4.3 y"],
      ["swap floating leg", -1000, "3–6 m"],
    ]);
    expect(r.blocks.interestRateSpecific).toBe(0);
  });
  it("a floating-rate note is slotted by its next reset for general risk, by maturity for specific risk", () => {
    const n: StandardisedPosition = { instrument: "FRN", instrumentType: "bond", currency: "EUR", marketValue: 1000, issuerCategory: "qualifying", residualMaturityYears: 4, coupon: 4, nextResetYears: 0.2 };
    const r = computeStandardised([n], { reportingCurrency: "EUR" });
    expect(r.interestRate.legs[0].band).toBe("1–3 m");
    expect(r.interestRate.specific[0].rate).toBe(0.016);
  });
});

describe("options: the simplified approach", () => {
  const share: StandardisedPosition = { instrument: "S", instrumentType: "equity", nationalMarket: "DE", currency: "EUR", marketValue: 3000 };
  const put = (quantity: number, kind: "put" | "call" = "put", marketValue = 50): StandardisedPosition => ({
    instrument: `${kind} ${quantity}`, instrumentType: "option", assetClass: "equity", currency: "EUR", marketValue, underlying: "S", optionKind: kind, strike: 9, quantity, underlyingPrice: 10,
  });
  it("a put covering part of the long shares carves out only that part", () => {
    const r = computeStandardised([share, put(100)], { reportingCurrency: "EUR" });
    expect(r.options[0]).toMatchObject({ treatment: "hedged", underlyingValue: 1000, inTheMoney: 0 });
    expect(r.options[0].charge).toBeCloseTo(160, 9);
    expect(r.equity.byMarket[0].gross).toBeCloseTo(2000, 9);
  });
  it("a call on long shares is no hedge: the shares stay in the equity blocks, the call is charged as bought", () => {
    const r = computeStandardised([share, put(100, "call", 50)], { reportingCurrency: "EUR" });
    expect(r.options[0].treatment).toBe("bought");
    expect(r.options[0].charge).toBe(50); // the lesser of 1,000 × 16 % and the option's value 50
    expect(r.equity.byMarket[0].gross).toBe(3000);
  });
  it("a put on more shares than the book holds: the covered part is hedged, the rest charged as bought", () => {
    const half: StandardisedPosition = { ...share, marketValue: 500 };
    const r = computeStandardised([half, put(100, "put", 60)], { reportingCurrency: "EUR" });
    expect(r.options.map((o) => [o.treatment, o.underlyingValue, o.optionValue])).toEqual([["hedged", 500, 30], ["bought", 500, 30]]);
    expect(r.options[0].charge).toBeCloseTo(80, 9); // 500 × 16 %, out of the money
    expect(r.options[1].charge).toBe(30); // the lesser of 500 × 16 % and its share of the option's value
    expect(r.equity.byMarket[0].gross).toBe(0);
  });
  it("a written option is refused", () => {
    expect(() => computeStandardised([share, put(100, "put", -50)], { reportingCurrency: "EUR" })).toThrow(/written \(sold\) option/);
  });
});

// The commodity maturity ladder's rates (1.5 % spread, 0.6 % carry, 15 % outright) are from memory of the 1996 amendment.
describe("commodities: the maturity ladder", () => {
  it("matched in a band: spread on both sides; carried to a later band: carry per band moved; the rest outright", () => {
    const rules = P.commodities.ladder;
    const r = commodityLadder([{ commodity: "c", amount: 100, years: 0.05 }, { commodity: "c", amount: -100, years: 0.05 }], rules);
    expect(r.charge).toBeCloseTo(3, 12); // 1.5 % × (100 + 100)
    const carried = commodityLadder([{ commodity: "c", amount: 100, years: 0.05 }, { commodity: "c", amount: -60, years: 0.4 }], rules);
    // 60 carried two bands (≤1 m → 3–6 m): spread 1.5 % × 120 = 1.8, carry 0.6 % × 60 × 2 = 0.72, outright 15 % × 40 = 6
    expect(carried.charge).toBeCloseTo(1.8 + 0.72 + 6, 12);
    expect(carried.ladder![0].carried).toBe(60);
  });
  it("the profile chooses the ladder; maturities are then needed", () => {
    const profile: StandardisedProfile = { ...P, commodities: { ...P.commodities, method: "maturity" } };
    const c: StandardisedPosition = { instrument: "oil", instrumentType: "commodity", commodity: "oil", currency: "EUR", marketValue: 100 };
    expect(() => computeStandardised([c], { reportingCurrency: "EUR", profile })).toThrow(/residual_maturity_years/);
    const r = computeStandardised([{ ...c, residualMaturityYears: 0 }], { reportingCurrency: "EUR", profile });
    expect(r.commodities.byCommodity[0]).toMatchObject({ method: "maturity" });
    expect(r.commodities.byCommodity[0].charge).toBeCloseTo(15, 12);
  });
});

describe("total and risk-weighted assets", () => {
  it("sum of the blocks; × 12.5", () => {
    const r = computeStandardised(
      [
        { instrument: "A", instrumentType: "equity", nationalMarket: "DE", currency: "EUR", marketValue: 1000 },
        { instrument: "USD", instrumentType: "currency", currency: "USD", marketValue: 100 },
      ],
      { reportingCurrency: "EUR" },
    );
    expect(r.total).toBeCloseTo(80 + 80 + 8, 9);
    expect(r.rwa).toBeCloseTo(12.5 * r.total, 9);
  });
});
