import { describe, expect, it } from "vitest";
import { capitalCharge } from "@/lib/risk/capital/capital";

describe("capitalCharge input checks", () => {
  const sixty = Array(60).fill(10);
  it("refuses non-finite figures and a missing stressed history", () => {
    expect(() => capitalCharge({ varHistory: [...sixty.slice(1), NaN], stressedVarHistory: sixty })).toThrow(/finite VaR/);
    expect(() => capitalCharge({ varHistory: sixty })).toThrow(/stressed VaR figures/);
    expect(() => capitalCharge({ varHistory: sixty, stressedVarHistory: sixty, plusFactor: -1 })).toThrow(/plus factor/);
  });
  it("an explicit multiplier overrides base plus factor; red zone gives 4", () => {
    expect(capitalCharge({ varHistory: sixty, stressedVarHistory: sixty, exceptions: 12 }).multiplier).toBe(4);
    expect(capitalCharge({ varHistory: sixty, stressedVarHistory: sixty, exceptions: 12, multiplier: 3.2 }).multiplier).toBe(3.2);
  });
});
