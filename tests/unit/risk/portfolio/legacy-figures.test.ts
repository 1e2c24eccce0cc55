import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import { runMonthEnd, type MonthEndMethod } from "@/lib/risk/portfolio/run-month-end";
import { bookInput, syntheticBook } from "./synthetic-book";

// Today's figures before issue 13, recorded from the engine at commit 2fee9cf (same figures as 54e9cd0: that commit
// added types only) on syntheticBook(12, 700, 60, 11): the methods without `volatility` must reproduce them EXACTLY
// (bit for bit: toBe, not toBeCloseTo). Source: this repository's own earlier output, no outside source.
interface Fixture {
  method: MonthEndMethod;
  methods: { method: string; portfolioVolatility: number; byConfidence: { confidence: number; oneDay: { var: number; es: number }; tenDay: { var: number; es: number }; componentVar: number[] }[] }[];
  history: number[];
  history10: number[];
  backtest: { days: number; exceptions: number };
  capital: number;
  stressed: number;
}
const fixture = JSON.parse(readFileSync(path.join(__dirname, "fixtures/legacy-figures.json"), "utf8")) as { configs: Record<string, Fixture> };
const book = syntheticBook(12, 700, 60, 11);

describe("methods configured as before issue 13 give the same figures, bit for bit", () => {
  for (const [name, f] of Object.entries(fixture.configs)) {
    it(`${name}: ${JSON.stringify(f.method)}`, () => {
      const r = runMonthEnd(bookInput(book, f.method));
      f.methods.forEach((m, i) => {
        expect(r.methods[i].method).toBe(m.method);
        expect(r.methods[i].portfolioVolatility).toBe(m.portfolioVolatility);
        m.byConfidence.forEach((c, j) => {
          const got = r.methods[i].byConfidence[j];
          expect(got.oneDay).toEqual(c.oneDay);
          expect(got.horizon).toEqual(c.tenDay); // recorded when the engine named the horizon figure `tenDay`
          expect(got.contributions.map((p) => p.componentVar)).toEqual(c.componentVar);
        });
      });
      expect(r.varHistory.points.map((p) => p.var1d[0])).toEqual(f.history);
      expect(r.varHistory.points.map((p) => p.varHorizon[0])).toEqual(f.history10);
      expect({ days: r.backtest.days, exceptions: r.backtest.exceptions }).toEqual(f.backtest);
      expect(r.capital.capital).toBe(f.capital);
      expect(r.stressed.byConfidence[0].oneDay.var).toBe(f.stressed);
    });
  }
});
