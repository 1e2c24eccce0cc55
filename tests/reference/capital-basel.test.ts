import { describe, expect, it } from "vitest";
import { BASEL_CAPITAL_PROFILE, capitalCharge } from "@/lib/risk/capital/capital";

// Source: Basel Committee (1996), "Amendment to the Capital Accord to incorporate market risks", B.4, and Basel
// Committee (2009), "Revisions to the Basel II market risk framework":
// capital = max(VaR(t−1), m_c·VaR_avg) + max(sVaR(t−1), m_s·sVaR_avg), m_c = 3 + plus factor, 60-day averages.
describe("capital formula, Basel Committee (1996) B.4 and (2009)", () => {
  const varHistory = Array.from({ length: 60 }, (_, i) => 100 + i); // mean 129.5, last 159
  const svarHistory = Array.from({ length: 60 }, (_, i) => 300 - i); // mean 270.5, last 241

  it("green zone: m_c = m_s = 3", () => {
    const r = capitalCharge({ varHistory, stressedVarHistory: svarHistory, plusFactor: 0 });
    expect(r.varAverage).toBeCloseTo(129.5, 12);
    expect(r.varTerm).toBeCloseTo(3 * 129.5, 12);
    expect(r.stressedVarTerm).toBeCloseTo(3 * 270.5, 12);
    expect(r.capital).toBeCloseTo(3 * 129.5 + 3 * 270.5, 10);
    expect(r.varBinding).toBe("average");
  });

  it("5 exceptions (yellow, plus factor 0.40 from Table 2): m_c = 3.40", () => {
    const r = capitalCharge({ varHistory, stressedVarHistory: svarHistory, exceptions: 5 });
    expect(r.multiplier).toBeCloseTo(3.4, 12);
    expect(r.capital).toBeCloseTo(3.4 * 129.5 + 3.4 * 270.5, 10);
  });

  it("VaR(t−1) binds when it exceeds m_c times the average", () => {
    const spike = [...Array(59).fill(10), 1000];
    const r = capitalCharge({ varHistory: spike, stressedVarHistory: Array(60).fill(1), plusFactor: 0 });
    expect(r.varTerm).toBe(1000);
    expect(r.varBinding).toBe("last");
  });

  it("only the last 60 figures are averaged; fewer than 60 are refused", () => {
    const longer = [...Array(10).fill(1e6), ...varHistory];
    expect(capitalCharge({ varHistory: longer, stressedVarHistory: svarHistory }).varAverage).toBeCloseTo(129.5, 12);
    expect(() => capitalCharge({ varHistory: varHistory.slice(1), stressedVarHistory: svarHistory })).toThrow(/at least 60 VaR/);
  });

  it("the firm may leave stressed VaR out and set its own multipliers", () => {
    const r = capitalCharge({ varHistory, multiplier: 4 }, { ...BASEL_CAPITAL_PROFILE, includeStressed: false });
    expect(r.capital).toBeCloseTo(4 * 129.5, 10);
  });
});
