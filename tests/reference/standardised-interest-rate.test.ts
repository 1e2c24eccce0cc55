import { describe, expect, it } from "vitest";
import { computeStandardised, ladderCharge, STANDARDISED_1996_PROFILE, type StandardisedPosition, type StandardisedProfile } from "@/lib/risk/standardised";
import { expectPrinted, govBond, HIGH_COUPON_BAND_YEARS } from "./standardised-helpers";

const rules = STANDARDISED_1996_PROFILE.interestRate;

describe("IR-M1: maturity method, 13 bands, coupon ≥ 3 %", () => {
  // Source: Dubai Financial Services Authority, prudential rulebook (PIB) A5.2.18 guidance: long / short per band
  // ≤1m 100/−50; 1–3m 200/−100; 3–6m 300/−200; 6–12m 400/−300; 1–2y 100/−200; 2–3y 200/−300; 3–4y 300/−400;
  // 4–5y 100/−100; 5–7y 200/−200; 7–10y 300/−100; 10–15y 100/−200; 15–20y 200/−100; >20y 300/−300
  // → vertical matched sum 55.35; total 13.29 (13.285 unrounded).
  const longs = [100, 200, 300, 400, 100, 200, 300, 100, 200, 300, 100, 200, 300];
  const shorts = [-50, -100, -200, -300, -200, -300, -400, -100, -200, -100, -200, -100, -300];
  const positions: StandardisedPosition[] = HIGH_COUPON_BAND_YEARS.flatMap((y, i) => [govBond(`L${i}`, longs[i], y), govBond(`S${i}`, shorts[i], y)]);
  const r = computeStandardised(positions, { reportingCurrency: "EUR" });
  const ladder = r.interestRate.byCurrency[0];
  it("every position lands in its own band (13 of the 15 rows used)", () => {
    expect(ladder.bands.slice(0, 13).map((b) => b.long)).toEqual(longs);
    expect(ladder.bands.slice(13).every((b) => b.long === 0 && b.short === 0)).toBe(true);
  });
  it("vertical matched sum 55.35", () => expectPrinted(ladder.verticalMatched, 55.35, 2, "matched sum"));
  it("total 13.29, 13.285 unrounded", () => {
    expectPrinted(ladder.charge, 13.285, 3, "ladder charge, unrounded");
    expectPrinted(r.blocks.interestRateGeneral, 13.29, 2, "general market risk");
    expect(r.blocks.interestRateSpecific).toBe(0); // government issues only
    expectPrinted(r.total, 13.29, 2, "total");
  });
});

describe("IR-M3: one band's vertical disallowance", () => {
  // Source: Qatar Financial Centre Regulatory Authority, IBANK 6.6.8: weighted long 100, weighted short −90
  // → matched 90 → 9.
  const perBand = rules.bands.map(() => ({ long: 0, short: 0, weightedLong: 0, weightedShort: 0 }));
  perBand[9] = { long: 100 / 0.0375, short: -90 / 0.0375, weightedLong: 100, weightedShort: -90 };
  const l = ladderCharge(rules, "maturity", "EUR", perBand);
  it("matched 90, vertical disallowance 9", () => {
    expectPrinted(l.bands[9].matched, 90, 0, "matched");
    expectPrinted(l.bands[9].verticalCharge, 9, 0, "vertical disallowance");
    expectPrinted(l.vertical, 9, 0, "vertical total");
  });
  it("the same through positions in the 7–10 y band", () => {
    const r = computeStandardised([govBond("A", 100 / 0.0375, 8), govBond("B", -90 / 0.0375, 8)], { reportingCurrency: "EUR" });
    expectPrinted(r.interestRate.byCurrency[0].bands[9].verticalCharge, 9, 0, "vertical disallowance");
  });
});

describe("IR-D1: duration method, 15 bands", () => {
  // Source: Dubai Financial Services Authority, PIB A5.2.22 guidance: long / short / modified duration per band
  // ≤1m 100/−50/0.00; 1–3m 200/−100/0.20; 3–6m 300/−200/0.40; 6–12m 400/−300/0.70; 1–1.9y 100/−200/1.40;
  // 1.9–2.8y 200/−300/2.20; 2.8–3.6y 300/−400/3.00; 3.6–4.3y 100/−100/3.65; 4.3–5.7y 200/−200/4.65;
  // 5.7–7.3y 300/−100/5.80; 7.3–9.3y 100/−200/7.50; 9.3–10.6y 200/−100/9.75; 10.6–12y 0/0/11.00;
  // 12–20y 300/−300/14.50; >20y 0/0/22.00 → total 11.58 (11.582875 unrounded).
  const longs = [100, 200, 300, 400, 100, 200, 300, 100, 200, 300, 100, 200, 0, 300, 0];
  const shorts = [-50, -100, -200, -300, -200, -300, -400, -100, -200, -100, -200, -100, 0, -300, 0];
  const durations = [0, 0.2, 0.4, 0.7, 1.4, 2.2, 3.0, 3.65, 4.65, 5.8, 7.5, 9.75, 11, 14.5, 22];
  const positions = durations.flatMap((d, i) => [govBond(`L${i}`, longs[i], d, 5, d), govBond(`S${i}`, shorts[i], d, 5, d)]);
  const profile: StandardisedProfile = { ...STANDARDISED_1996_PROFILE, interestRate: { ...rules, method: "duration" } };
  const r = computeStandardised(positions, { reportingCurrency: "EUR", profile });
  const ladder = r.interestRate.byCurrency[0];
  it("vertical disallowance at 5 %, bands on modified duration", () => {
    expect(ladder.method).toBe("duration");
    expect(ladder.verticalRate).toBe(0.05);
    expect(ladder.bands.map((b) => b.long)).toEqual(longs);
  });
  it("total 11.58, 11.582875 unrounded", () => {
    expectPrinted(ladder.charge, 11.582875, 6, "ladder charge, unrounded");
    expectPrinted(r.total, 11.58, 2, "total");
  });
});

describe("SR-1: debt specific risk by category", () => {
  // Source: a banking textbook's exhibit "BIS market risk calculation (debt securities)", pp. 8·20–8·21 (title and
  // author not read): 0–1m government 5,000; 1–3m government 5,000; 3–6m qualifying 4,000; 6–12m qualifying
  // −7,500; 1–2y government −2,500; 2–3y government 2,500; 3–4y government 2,500; 3–4y qualifying −2,000; 4–5y
  // government 1,500; 5–7y qualifying −1,000; 7–10y government −1,500; 10–15y government −1,500; 10–15y other
  // 1,000; 15–20y government 1,500; >20y qualifying 1,000 → 229.00 (10 + 75 + 32 + 16 + 80 + 16).
  const book: [number, StandardisedPosition["issuerCategory"], number][] = [
    [0, "government", 5000], [1, "government", 5000], [2, "qualifying", 4000], [3, "qualifying", -7500],
    [4, "government", -2500], [5, "government", 2500], [6, "government", 2500], [6, "qualifying", -2000],
    [7, "government", 1500], [8, "qualifying", -1000], [9, "government", -1500], [10, "government", -1500],
    [10, "other", 1000], [11, "government", 1500], [12, "qualifying", 1000],
  ];
  const positions: StandardisedPosition[] = book.map(([band, issuerCategory, marketValue], i) => ({
    instrument: `issue ${i + 1}`, instrumentType: "bond", currency: "EUR", marketValue, issuerCategory, residualMaturityYears: HIGH_COUPON_BAND_YEARS[band], coupon: 5,
  }));
  const r = computeStandardised(positions, { reportingCurrency: "EUR" });
  it("the six charged issues: 10, 75, 32, 16, 80, 16", () => {
    const charged = r.interestRate.specific.filter((l) => l.charge > 0).map((l) => l.charge);
    [10, 75, 32, 16, 80, 16].forEach((c, i) => expectPrinted(charged[i], c, 2, `issue charge ${i + 1}`));
    expect(charged).toHaveLength(6);
  });
  it("total specific risk 229.00", () => expectPrinted(r.blocks.interestRateSpecific, 229, 2, "specific risk"));
});
