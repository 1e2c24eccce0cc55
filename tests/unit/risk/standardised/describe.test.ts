import { describe, expect, it } from "vitest";
import { computeStandardised, pct, STANDARDISED_1996_PROFILE, type StandardisedPosition, type StandardisedProfile } from "@/lib/risk/standardised";

const P = STANDARDISED_1996_PROFILE;
const equity: StandardisedPosition = { instrument: "A", instrumentType: "equity", nationalMarket: "DE", currency: "EUR", marketValue: 100 };
const bond: StandardisedPosition = { instrument: "B", instrumentType: "bond", issuerCategory: "other", coupon: 2, residualMaturityYears: 3, modifiedDuration: 2.8, currency: "USD", marketValue: 100 };
const statement = (positions: StandardisedPosition[], profile: StandardisedProfile = P) => computeStandardised(positions, { reportingCurrency: "EUR", profile }).statement.join("\n");

describe("the method statement says what was computed, with the profile's own rates", () => {
  it("rates as printed", () => {
    expect(pct(0.0025)).toBe("0.25 %");
    expect(pct(0.08)).toBe("8 %");
    expect(pct(1.5)).toBe("150 %");
  });
  it("no debt in the book: no debt sentences", () => {
    const s = statement([equity]);
    expect(s).not.toMatch(/Debt specific risk/);
    expect(s).not.toMatch(/Debt general market risk/);
    expect(s).toMatch(/Equity per national market: specific risk 8 %/);
  });
  it("a jurisdiction's 150 % between zones 1 and 3, and the duration method at 5 %", () => {
    const profile: StandardisedProfile = { ...P, interestRate: { ...P.interestRate, method: "duration", betweenZones: { ...P.interestRate.betweenZones, zone13: 1.5 } } };
    const s = statement([bond], profile);
    expect(s).toMatch(/by the duration method/);
    expect(s).toMatch(/vertical disallowance 5 %/);
    expect(s).toMatch(/then 1 and 3 at 150 %/);
    expect(statement([bond])).toMatch(/by the maturity method.*vertical disallowance 10 %.*then 1 and 3 at 100 %/);
  });
  it("liquid and well diversified: 4 %, and it says why", () => {
    const s = statement([equity], { ...P, equity: { ...P.equity, liquidAndDiversified: true } });
    expect(s).toMatch(/specific risk 4 % of the gross position/);
    expect(s).toMatch(/liquid and well diversified/);
  });
  it("the de minimis outcome: not made, met and applied, met and not applied", () => {
    const usd: StandardisedPosition = { instrument: "USD", instrumentType: "currency", currency: "USD", marketValue: 10 };
    expect(statement([usd])).toMatch(/de minimis test was not made/);
    expect(statement([usd], { ...P, fx: { ...P.fx, eligibleCapital: 1000, applyDeMinimis: true } })).toMatch(/is met; the profile applies the exemption/);
    expect(statement([usd], { ...P, fx: { ...P.fx, eligibleCapital: 1000 } })).toMatch(/is met; the profile does not apply the exemption/);
    expect(statement([usd], { ...P, fx: { ...P.fx, eligibleCapital: 100, applyDeMinimis: true } })).toMatch(/is not met; the charge stands/);
  });
  it("derivative legs and options only when the book has them", () => {
    expect(statement([bond])).not.toMatch(/notional legs/);
    const swap: StandardisedPosition = { instrument: "S", instrumentType: "swap", currency: "EUR", marketValue: 0, notional: 100, residualMaturityYears: 5, coupon: 3, nextResetYears: 0.5 };
    expect(statement([swap])).toMatch(/Interest-rate derivatives as notional legs/);
    expect(statement([equity])).not.toMatch(/Bought options/);
  });
  it("the result lists what the engine does not do", () => {
    const r = computeStandardised([equity], { reportingCurrency: "EUR" });
    expect(r.limitations.some((l) => /written options are refused/.test(l))).toBe(true);
  });
});
