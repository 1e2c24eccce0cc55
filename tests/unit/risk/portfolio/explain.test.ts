import { describe, expect, it } from "vitest";
import { explainRuns, explainVarChange } from "@/lib/risk/portfolio/explain";
import { matrixFromRows } from "@/lib/risk/portfolio/matrix";
import { runMonthEnd, type MonthEndInput } from "@/lib/risk/portfolio/run-month-end";
import { bookInput, syntheticBook } from "./synthetic-book";

const z99 = 2.326348; // Φ⁻¹(0.99), standard normal tables (e.g. Abramowitz & Stegun 1964, Handbook of Mathematical Functions, ch. 26; chapter from memory)

describe("explainVarChange", () => {
  it("attributes each change to its own step when only one thing moves (worked by hand)", () => {
    const r = matrixFromRows([[1, 0.5], [0.5, 1]]);
    const base = { factors: ["A", "B"], exposures: [100, 100], volatilities: [0.01, 0.01], correlation: r };
    // double the exposures: only the positions step moves, VaR doubles
    const pos = explainVarChange(base, { ...base, exposures: [200, 200] });
    expect(pos.steps[0].change).toBeCloseTo(pos.previousVar, 10);
    expect(pos.steps[1].change).toBeCloseTo(0, 12);
    expect(pos.steps[2].change).toBeCloseTo(0, 12);
    // σₚ = √(1 + 1 + 2·0.5) = √3 per 100 × 1 %: VaR = z·√3
    expect(pos.previousVar).toBeCloseTo(z99 * Math.sqrt(3), 5);
    const cor = explainVarChange(base, { ...base, correlation: matrixFromRows([[1, 0], [0, 1]]) });
    expect(cor.steps[2].change).toBeCloseTo(z99 * (Math.sqrt(2) - Math.sqrt(3)), 5);
    expect(cor.steps[0].change).toBe(0);
  });

  it("the steps add up to the whole change, new and dropped factors listed", () => {
    const prev = { factors: ["A", "B"], exposures: [100, -50], volatilities: [0.01, 0.02], correlation: matrixFromRows([[1, 0.3], [0.3, 1]]) };
    const cur = { factors: ["B", "C"], exposures: [80, 40], volatilities: [0.025, 0.015], correlation: matrixFromRows([[1, -0.2], [-0.2, 1]]) };
    const x = explainVarChange(prev, cur, 0.975);
    expect(x.steps.reduce((s, st) => s + st.change, 0)).toBeCloseTo(x.change, 12);
    expect(x.newFactors).toEqual(["C"]);
    expect(x.droppedFactors).toEqual(["A"]);
  });

  it("explains two runs' inputs, ending at this run's parametric VaR", () => {
    const book = syntheticBook(8, 700, 20, 5);
    const cut = 680;
    const lastMonth: MonthEndInput = bookInput(
      {
        positions: book.positions.map((p) => ({ ...p, marketValue: p.marketValue * 0.8 })),
        returns: { dates: book.returns.dates.slice(0, cut), factors: Object.fromEntries(Object.entries(book.returns.factors).map(([k, v]) => [k, Array.from(v).slice(0, cut)])) },
      },
      { covariance: "ewma" },
    );
    const thisMonth: MonthEndInput = bookInput(book, { covariance: "ewma" });
    const x = explainRuns(lastMonth, thisMonth);
    const run = runMonthEnd({ ...thisMonth, method: { methods: ["parametric"], covariance: "ewma" } });
    expect(x.currentVar).toBeCloseTo(run.methods[0].byConfidence[0].oneDay.var, 6);
    expect(x.steps.reduce((s, st) => s + st.change, 0)).toBeCloseTo(x.change, 6);
  });
});
