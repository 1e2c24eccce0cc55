import { describe, expect, it } from "vitest";
import { computeStandardised, type StandardisedPosition } from "@/lib/risk/standardised";
import { expectPrinted } from "./standardised-helpers";

describe("EQ-1: equity, one market, 8 % + 8 %", () => {
  // Source: Central Bank of the UAE market-risk standards, equity example: long 350,000; short 500,000; short
  // 250,000; long 300,000; short 120,000 → general 17,600; specific 121,600; total 139,200. (The source's sentence
  // also prints "121,000", a misprint; its total is right.)
  const values = [350_000, -500_000, -250_000, 300_000, -120_000];
  const positions: StandardisedPosition[] = values.map((marketValue, i) => ({ instrument: `share ${i + 1}`, instrumentType: "equity", nationalMarket: "AE", currency: "AED", marketValue }));
  const r = computeStandardised(positions, { reportingCurrency: "AED" });
  const m = r.equity.byMarket[0];
  it("gross 1,520,000 and net −220,000", () => {
    expectPrinted(m.gross, 1_520_000, 0, "gross");
    expectPrinted(m.net, -220_000, 0, "net");
  });
  it("general 17,600; specific 121,600; total 139,200", () => {
    expectPrinted(m.general, 17_600, 0, "general");
    expectPrinted(m.specific, 121_600, 0, "specific");
    expectPrinted(r.total, 139_200, 0, "total");
  });
});

describe("OP-1: options, simplified carve-out", () => {
  // Source: Abu Dhabi Global Market FSRA guidance; Central Bank of Bahrain CA-13.2.2: 100 shares at 10 hedged
  // with a bought put struck at 11 → 1,000 × 16 % − 100 = 60.
  const positions: StandardisedPosition[] = [
    { instrument: "share", instrumentType: "equity", nationalMarket: "AE", currency: "AED", marketValue: 1000 },
    // the premium's value plays no part in the carve-out
    { instrument: "put on share", instrumentType: "option", assetClass: "equity", currency: "AED", marketValue: 120, underlying: "share", optionKind: "put", strike: 11, quantity: 100, underlyingPrice: 10 },
  ];
  const r = computeStandardised(positions, { reportingCurrency: "AED" });
  it("1,000 × (8 % + 8 %) − 100 in the money = 60", () => {
    expect(r.options).toHaveLength(1);
    const o = r.options[0];
    expect(o.treatment).toBe("hedged");
    expectPrinted(o.underlyingValue, 1000, 0, "underlying value");
    expectPrinted(o.specificRate + o.generalRate, 0.16, 2, "specific + general rate");
    expectPrinted(o.inTheMoney, 100, 0, "in the money");
    expectPrinted(o.charge, 60, 0, "option charge");
  });
  it("the hedged shares leave the equity blocks; the total is the carve-out's 60", () => {
    expect(r.blocks.equitySpecific + r.blocks.equityGeneral).toBe(0);
    expectPrinted(r.total, 60, 0, "total");
  });
});

describe("CM-1: commodities, simplified approach", () => {
  // Source: Central Bank of the UAE market-risk standards, commodities example: one commodity at 5.00 EUR/kg,
  // EUR/AED 4.25: long 128 kg, short 160 kg, long 96 kg, short 96 kg → AED 2,720 / −3,400 / 2,040 / −2,040
  // → 15 % × 680 = 102; 3 % × 10,200 = 306; 408.
  const kg = [128, -160, 96, -96];
  const positions: StandardisedPosition[] = kg.map((q, i) => ({ instrument: `lot ${i + 1}`, instrumentType: "commodity", commodity: "the commodity", currency: "AED", marketValue: q * 5 * 4.25 }));
  const r = computeStandardised(positions, { reportingCurrency: "AED" });
  const c = r.commodities.byCommodity[0];
  it("AED 2,720 / −3,400 / 2,040 / −2,040: net −680, gross 10,200", () => {
    expectPrinted(positions[0].marketValue, 2720, 0, "long 128 kg");
    expectPrinted(positions[1].marketValue, -3400, 0, "short 160 kg");
    expectPrinted(c.net, -680, 0, "net");
    expectPrinted(c.gross, 10_200, 0, "gross");
  });
  it("15 % × 680 = 102; 3 % × 10,200 = 306; 408", () => {
    expectPrinted(c.netCharge, 102, 0, "net charge");
    expectPrinted(c.grossCharge, 306, 0, "gross charge");
    expectPrinted(c.charge, 408, 0, "commodity charge");
    expectPrinted(r.total, 408, 0, "total");
  });
});
