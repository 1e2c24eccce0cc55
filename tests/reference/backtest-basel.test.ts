import { describe, expect, it } from "vitest";
import { binomialCdf, trafficLight } from "@/lib/risk/backtest/traffic-light";
import { capitalCharge } from "@/lib/risk/capital/capital";

// Source: Basel Committee on Banking Supervision (1996), "Supervisory framework for the use of backtesting in
// conjunction with the internal models approach to market risk capital requirements", Table 2
// (250 observations, 99 % one-day VaR).
const TABLE_2: [number, "green" | "yellow" | "red", number, number][] = [
  // exceptions, zone, cumulative probability (%), plus factor
  [0, "green", 8.11, 0.0],
  [1, "green", 28.58, 0.0],
  [2, "green", 54.32, 0.0],
  [3, "green", 75.81, 0.0],
  [4, "green", 89.22, 0.0],
  [5, "yellow", 95.88, 0.4],
  [6, "yellow", 98.63, 0.5],
  [7, "yellow", 99.6, 0.65],
  [8, "yellow", 99.89, 0.75],
  [9, "yellow", 99.97, 0.85],
  [10, "red", 99.99, 1.0],
];

describe("traffic-light zones, Basel Committee (1996) Table 2", () => {
  for (const [x, zone, cumulativePercent, plus] of TABLE_2) {
    it(`${x} exceptions in 250 days: ${zone}, ${cumulativePercent} %, plus factor ${plus}`, () => {
      const result = trafficLight(250, x, 0.01);
      // the table's cumulative probabilities are printed to 2 decimals in %
      expect(Math.round(result.cumulativeProbability * 10000) / 100).toBeCloseTo(cumulativePercent, 10);
      expect(result.zone).toBe(zone);
      expect(result.plusFactor).toBe(plus);
      // the multiplier column, through the capital formula's multiplier for that exception count
      expect(capitalCharge({ varHistory: Array(60).fill(1), stressedVarHistory: Array(60).fill(1), exceptions: x }).multiplier).toBeCloseTo(3 + plus, 12);
    });
  }

  it("10 or more exceptions are red with plus factor 1.00 (Table 2)", () => {
    for (const x of [10, 11, 15, 40]) {
      expect(trafficLight(250, x).zone).toBe("red");
      expect(trafficLight(250, x).plusFactor).toBe(1);
    }
  });

  it("P(X ≤ 0) = 0.99^250 (binomial rule, worked by hand)", () => {
    expect(binomialCdf(0, 250, 0.01)).toBeCloseTo(Math.pow(0.99, 250), 14);
  });

  it("other window lengths follow the same binomial rule (Basel Committee 1996, the zone rule behind Table 2)", () => {
    // 500 days at 1 %: expected 5 exceptions. Zones from P(X ≤ x) with yellow from 95 %, red from 99.99 %.
    for (let x = 0; x < 30; x++) {
      const c = binomialCdf(x, 500, 0.01);
      const expected = c >= 0.9999 ? "red" : c >= 0.95 ? "yellow" : "green";
      expect(trafficLight(500, x).zone).toBe(expected);
    }
    // the green/yellow boundary for 500 days lies above the 250-day one
    expect(trafficLight(500, 5).zone).toBe("green");
    expect(trafficLight(500, 9).zone).toBe("yellow");
  });
});
