import { describe, expect, it } from "vitest";
import { runBacktest } from "@/lib/risk/backtest/backtest";

describe("runBacktest", () => {
  const dates = Array.from({ length: 250 }, (_, i) => `2026-${String(1 + Math.floor(i / 28)).padStart(2, "0")}-${String(1 + (i % 28)).padStart(2, "0")}`);
  it("counts a loss strictly greater than the VaR as an exception, listing date and size", () => {
    const pnl = new Array(250).fill(1);
    const vars = new Array(250).fill(10);
    pnl[10] = -10; // equal to VaR: not an exception
    pnl[20] = -12;
    pnl[21] = -15;
    const r = runBacktest(dates, pnl, vars);
    expect(r.exceptions).toBe(2);
    expect(r.exceptionList).toEqual([
      { date: dates[20], pnl: -12, var: 10, excess: 2 },
      { date: dates[21], pnl: -15, var: 10, excess: 5 },
    ]);
    expect(r.zone).toBe("green");
    expect(r.christoffersen?.n11).toBe(1);
    expect(r.kupiec.exceptions).toBe(2);
    expect(r.warnings).toEqual([]);
  });

  it("warns when the window is not 250 days and refuses unequal lengths", () => {
    const r = runBacktest(dates.slice(0, 100), new Array(100).fill(0), new Array(100).fill(1));
    expect(r.warnings.map((w) => w.code)).toContain("backtest-window");
    expect(() => runBacktest(dates, [1], [1])).toThrow(/equal length/);
  });
});

describe("floating-point confidence", () => {
  it("1 − 0.99 still uses Table 2 directly", async () => {
    const { trafficLight } = await import("@/lib/risk/backtest/traffic-light");
    expect(trafficLight(250, 6, 1 - 0.99).plusFactorRule).toMatch(/Table 2/);
    expect(trafficLight(250, 6, 1 - 0.99).plusFactor).toBe(0.5);
  });
});
