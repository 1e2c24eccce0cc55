import { describe, expect, it } from "vitest";
import { computeStandardised, type StandardisedPosition } from "@/lib/risk/standardised";
import { expectPrinted } from "./standardised-helpers";

// Foreign exchange by the shorthand method: overall net open position = max(sum of net longs, |sum of net shorts|)
// + |net gold|, charge 8 %. The reporting currency of the examples is not one of the listed currencies; XTS (the
// ISO 4217 code reserved for testing) stands for it.
const REPORTING = "XTS";
const currency = (ccy: string, marketValue: number): StandardisedPosition => ({ instrument: `${ccy} cash`, instrumentType: "currency", currency: ccy, marketValue });
const gold = (marketValue: number): StandardisedPosition => ({ instrument: "gold", instrumentType: "gold", currency: "XAU", marketValue });

describe("FX-1: shorthand with gold", () => {
  // Source: Basel Committee (1996) market-risk amendment, A.3 example, as carried in the Abu Dhabi Global Market
  // FSRA prudential rulebook guidance: JPY +50, EUR +100, GBP +150, SAR −20, USD −180, gold −35 → longs 300,
  // + 35 gold = 335; charge 26.8.
  const r = computeStandardised([currency("JPY", 50), currency("EUR", 100), currency("GBP", 150), currency("SAR", -20), currency("USD", -180), gold(-35)], { reportingCurrency: REPORTING });
  it("net longs 300, net shorts −200, gold 35, overall 335", () => {
    expectPrinted(r.fx.netLong, 300, 0, "net longs");
    expectPrinted(r.fx.netShort, -200, 0, "net shorts");
    expectPrinted(r.fx.gold, -35, 0, "gold");
    expectPrinted(r.fx.overallNetOpenPosition, 335, 0, "overall net open position");
  });
  it("charge 26.8", () => {
    expectPrinted(r.fx.charge, 26.8, 1, "FX charge");
    expectPrinted(r.blocks.fx, 26.8, 1, "FX block");
    expectPrinted(r.total, 26.8, 1, "total");
  });
});

describe("FX-3: shorthand with gold", () => {
  // Source: Central Bank of Bahrain rulebook, CA-6.5.2: GBP +100, EUR +150, SAR +50, USD −180, JPY −20, gold −20
  // → +300 / −200 / gold 20 → 320; charge 25.6.
  const r = computeStandardised([currency("GBP", 100), currency("EUR", 150), currency("SAR", 50), currency("USD", -180), currency("JPY", -20), gold(-20)], { reportingCurrency: REPORTING });
  it("+300 / −200 / gold 20 → 320; charge 25.6", () => {
    expectPrinted(r.fx.netLong, 300, 0, "net longs");
    expectPrinted(r.fx.netShort, -200, 0, "net shorts");
    expectPrinted(Math.abs(r.fx.gold), 20, 0, "gold");
    expectPrinted(r.fx.overallNetOpenPosition, 320, 0, "overall net open position");
    expectPrinted(r.fx.charge, 25.6, 1, "FX charge");
  });
  it("the same exposures held as foreign-currency positions (not currency positions) give the same figures", () => {
    // common practice, no source: every position's currency counts toward that currency's net open position
    const held: StandardisedPosition[] = [
      { instrument: "UK equity", instrumentType: "equity", nationalMarket: "UK", currency: "GBP", marketValue: 100 },
      currency("EUR", 150), currency("SAR", 50), currency("USD", -180), currency("JPY", -20), gold(-20),
    ];
    const h = computeStandardised(held, { reportingCurrency: REPORTING });
    expect(h.fx.overallNetOpenPosition).toBeCloseTo(r.fx.overallNetOpenPosition, 12);
    expect(h.fx.byCurrency.find((l) => l.currency === "GBP")).toMatchObject({ fromPositions: 100, fromCurrencyPositions: 0, net: 100 });
  });
});
