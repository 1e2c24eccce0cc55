import { describe, expect, it } from "vitest";
import { bandIndex, computeStandardised, interestRateGeneral, offsetZones, STANDARDISED_1996_PROFILE, type StandardisedPosition } from "@/lib/risk/standardised";

// Rules: Basel Committee (1996) market-risk amendment, Part A.1 (maturity ladder; upper edges inclusive).
const rules = STANDARDISED_1996_PROFILE.interestRate;
const label = (years: number, coupon: number, method: "maturity" | "duration" = "maturity") => rules.bands[bandIndex(rules, method, years, coupon)].band;
const bond = (instrument: string, marketValue: number, years: number, coupon = 5, currency = "EUR"): StandardisedPosition => ({
  instrument, instrumentType: "bond", marketValue, currency, issuerCategory: "government", residualMaturityYears: years, coupon,
});

describe("band edges: the upper edge is inclusive", () => {
  it("zone 1 edges (1, 3, 6, 12 months) fall in the nearer band", () => {
    expect(label(1 / 12, 5)).toBe("≤ 1 m");
    expect(label(1 / 12 + 1e-6, 5)).toBe("1–3 m");
    expect(label(0.25, 5)).toBe("1–3 m");
    expect(label(0.25 + 1e-6, 5)).toBe("3–6 m");
    expect(label(0.5, 5)).toBe("3–6 m");
    expect(label(0.5 + 1e-6, 5)).toBe("6–12 m");
    expect(label(1, 5)).toBe("6–12 m");
    expect(label(1 + 1e-6, 5)).toBe("1–2 y | 1–1.9 y");
  });
  it("coupon ≥ 3 % column: 2, 3, 4, 5, 7, 10, 15, 20 years; beyond 20 is the open row", () => {
    const edges = [2, 3, 4, 5, 7, 10, 15, 20];
    edges.forEach((y, k) => {
      expect(bandIndex(rules, "maturity", y, 5), `${y} y`).toBe(4 + k);
      expect(bandIndex(rules, "maturity", y + 1e-6, 5), `just over ${y} y`).toBe(5 + k);
    });
    expect(label(60, 5)).toBe("> 20 y | 10.6–12 y");
  });
  it("coupon < 3 % column: 1.9, 2.8, 3.6, 4.3, 5.7, 7.3, 9.3, 10.6, 12, 20 years; beyond 20 is the open row", () => {
    const edges = [1.9, 2.8, 3.6, 4.3, 5.7, 7.3, 9.3, 10.6, 12, 20];
    edges.forEach((y, k) => {
      expect(bandIndex(rules, "maturity", y, 2), `${y} y`).toBe(4 + k);
      expect(bandIndex(rules, "maturity", y + 1e-6, 2), `just over ${y} y`).toBe(5 + k);
    });
    expect(label(20.5, 2)).toBe("> 20 y (coupon < 3 %)");
  });
  it("residual maturities from dates: six months month-end to month-end is exactly the 3–6 m band's edge", () => {
    const p: StandardisedPosition = { ...bond("B", 100, 0), residualMaturityYears: undefined, maturityDate: "2027-05-31" };
    const r = computeStandardised([p], { reportingCurrency: "EUR", asOf: "2026-11-30" });
    expect(r.interestRate.legs[0].years).toBe(0.5);
    expect(r.interestRate.legs[0].band).toBe("3–6 m");
  });
});

describe("coupon column choice", () => {
  it("3 % exactly uses the ≥ 3 % column; 2.99 % the < 3 % column", () => {
    expect(label(2.5, 3)).toBe("2–3 y | 1.9–2.8 y");
    expect(label(2.5, 2.99)).toBe("2–3 y | 1.9–2.8 y");
    expect(label(2.9, 3)).toBe("2–3 y | 1.9–2.8 y");
    expect(label(2.9, 2.99)).toBe("3–4 y | 2.8–3.6 y");
    expect(label(15, 3)).toBe("10–15 y | 7.3–9.3 y");
    expect(label(15, 0)).toBe("12–20 y (coupon < 3 %)");
  });
  it("the weight follows the column: 100 at 25 years is 6 % at a 5 % coupon and 12.5 % at zero coupon", () => {
    const [high] = interestRateGeneral([{ currency: "EUR", amount: 100, years: 25, coupon: 5 }], rules, "maturity");
    const [low] = interestRateGeneral([{ currency: "EUR", amount: 100, years: 25, coupon: 0 }], rules, "maturity");
    expect(high.bands[12].weightedLong).toBeCloseTo(6, 12);
    expect(low.bands[14].weightedLong).toBeCloseTo(12.5, 12);
  });
  it("the duration method slots on modified duration in the < 3 % column whatever the coupon", () => {
    expect(label(2.9, 8, "duration")).toBe("3–4 y | 2.8–3.6 y");
    expect(label(11, 8, "duration")).toBe("> 20 y | 10.6–12 y");
  });
});

describe("between-zone offsets in the published order: 1–2, then 2–3, then 1–3", () => {
  // zone nets +10 (1), −5 (2), −10 (3): 1–2 offsets 5 at 40 %, 2–3 has nothing left in zone 2, 1–3 offsets 5 at 100 %
  const ladder = (z1: number, z2: number, z3: number) =>
    interestRateGeneral(
      [
        { currency: "EUR", amount: z1 / 0.007, years: 0.75, coupon: 5 }, // 6–12 m, 0.70 %
        { currency: "EUR", amount: z2 / 0.0125, years: 1.5, coupon: 5 }, // 1–2 y, 1.25 %
        { currency: "EUR", amount: z3 / 0.0325, years: 6, coupon: 5 }, // 5–7 y, 3.25 %
      ],
      rules,
      "maturity",
    )[0];
  it("+10, −5, −10: 2.00 + 0 + 5.00, residual 5", () => {
    const l = ladder(10, -5, -10);
    expect(l.betweenDetail.zone12.matched).toBeCloseTo(5, 9);
    expect(l.between.zone12).toBeCloseTo(2, 9);
    expect(l.betweenDetail.zone23.matched).toBe(0);
    expect(l.betweenDetail.zone13.matched).toBeCloseTo(5, 9);
    expect(l.between.zone13).toBeCloseTo(5, 9);
    expect(l.residual).toBeCloseTo(5, 9);
    // a different order (1–3 first) would offset 10 at 100 % and leave zone 2 short: 10 + 0 + residual 5
    expect(l.charge).toBeCloseTo(2 + 5 + 5, 9);
  });
  it("+4, −10, +8: zone 2 offsets zone 1 first (4), then its remaining 6 against zone 3", () => {
    const l = ladder(4, -10, 8);
    expect(l.betweenDetail.zone12).toMatchObject({ rate: 0.4 });
    expect(l.betweenDetail.zone12.matched).toBeCloseTo(4, 9);
    expect(l.betweenDetail.zone23.matched).toBeCloseTo(6, 9);
    expect(l.betweenDetail.zone13.matched).toBe(0);
    expect(l.residual).toBeCloseTo(2, 9);
  });
  it("offsetZones does nothing between nets of the same sign", () => {
    expect(offsetZones(3, 4, 0.4)).toEqual({ matched: 0, rate: 0.4, charge: 0, remainingA: 3, remainingB: 4 });
  });
  it("the 1–3 rate is the profile's (150 % in some jurisdictions)", () => {
    const profile = { ...rules, betweenZones: { ...rules.betweenZones, zone13: 1.5 } };
    const [l] = interestRateGeneral([{ currency: "EUR", amount: 10 / 0.007, years: 0.75, coupon: 5 }, { currency: "EUR", amount: -10 / 0.0325, years: 6, coupon: 5 }], profile, "maturity");
    expect(l.between.zone13).toBeCloseTo(15, 9);
  });
});

describe("one ladder per currency, summed without offset", () => {
  it("EUR long and USD short in the same band are two ladders with two residuals", () => {
    const r = computeStandardised([bond("E", 1000, 6, 5, "EUR"), bond("U", -1000, 6, 5, "USD")], { reportingCurrency: "EUR" });
    expect(r.interestRate.byCurrency.map((c) => c.currency)).toEqual(["EUR", "USD"]);
    for (const c of r.interestRate.byCurrency) {
      expect(c.vertical).toBe(0);
      expect(c.residual).toBeCloseTo(32.5, 9);
    }
    expect(r.blocks.interestRateGeneral).toBeCloseTo(65, 9);
    // the same two in one currency match in the band: 10 % of 32.5
    const one = computeStandardised([bond("E", 1000, 6), bond("U", -1000, 6)], { reportingCurrency: "EUR" });
    expect(one.blocks.interestRateGeneral).toBeCloseTo(3.25, 9);
  });
});

describe("within-zone disallowance", () => {
  it("zone 1 at 40 %, zones 2 and 3 at 30 %, on the matched part of the bands' nets", () => {
    const [l] = interestRateGeneral(
      [
        { currency: "EUR", amount: 1000, years: 0.2, coupon: 5 }, // 1–3 m long, weighted 2
        { currency: "EUR", amount: -1000, years: 0.4, coupon: 5 }, // 3–6 m short, weighted −4
        { currency: "EUR", amount: 1000, years: 1.5, coupon: 5 }, // 1–2 y long 12.5
        { currency: "EUR", amount: -1000, years: 2.5, coupon: 5 }, // 2–3 y short −17.5
      ],
      rules,
      "maturity",
    );
    expect(l.zones[0]).toMatchObject({ zone: 1, rate: 0.4 });
    expect(l.zones[0].matched).toBeCloseTo(2, 9);
    expect(l.zones[0].charge).toBeCloseTo(0.8, 9);
    expect(l.zones[1].matched).toBeCloseTo(12.5, 9);
    expect(l.zones[1].charge).toBeCloseTo(3.75, 9);
    expect(l.withinZones).toBeCloseTo(4.55, 9);
  });
});
