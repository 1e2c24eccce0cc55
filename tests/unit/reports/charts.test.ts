/**
 * The Word pack's charts are legible at their printed size (17 cm wide): category labels never overlap, stay inside
 * the picture and print at 6 pt or more, however many risk factors the book has; and they use the app's colours
 * (one table, lib/charts/palette.ts).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { MIN_PRINTED_PT, PRINTED_WIDTH_PT, varPnlChart, volatilityChart, type Chart } from "@/reports/charts";
import { CHART_PALETTE, ESTIMATOR_COLOURS } from "@/lib/charts/palette";
import type { FilingViewModel } from "@/reports/view-model";
import { packFixture } from "./fixture";

let vm: FilingViewModel;
beforeAll(async () => {
  vm = (await packFixture()).vm;
});

/** The same filing with `n` risk factors named like the demo's instruments. */
function withFactors(n: number): FilingViewModel {
  const copy = structuredClone(vm);
  const base = copy.figures.riskFactors;
  copy.figures.riskFactors = Array.from({ length: n }, (_, i) => ({ ...structuredClone(base[i % base.length]), factor: `NMB-EQ-VARGFJELL-${String(i).padStart(3, "0")}` }));
  return copy;
}

function expectLegible(chart: Chart): void {
  const labels = chart.axisLabels ?? [];
  expect(labels.length).toBeGreaterThan(0);
  for (const l of labels) {
    expect(l.fontPx * (PRINTED_WIDTH_PT / chart.width), l.text).toBeGreaterThanOrEqual(MIN_PRINTED_PT);
    expect(l.x0, l.text).toBeGreaterThanOrEqual(0);
    expect(l.x1, l.text).toBeLessThanOrEqual(chart.width);
    expect(l.y1, l.text).toBeLessThanOrEqual(chart.height);
  }
  for (let i = 0; i < labels.length; i++) {
    for (let j = i + 1; j < labels.length; j++) {
      const a = labels[i];
      const b = labels[j];
      const overlap = a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;
      expect(overlap, `${a.text} and ${b.text}`).toBe(false);
    }
  }
}

describe("legible at the printed size", () => {
  it("the fixture's volatility and P&L charts", () => {
    expectLegible(volatilityChart(vm)!);
    expectLegible(varPnlChart(vm)!);
  });

  it("a book of 47 factors with long names (like the demo's): labels turned, one panel", () => {
    const chart = volatilityChart(withFactors(47))!;
    expectLegible(chart);
    expect(chart.svg).toContain("rotate(-90");
    expect(chart.description).not.toContain("panels");
  });

  it("a book of 150 factors: several panels rather than crowded labels", () => {
    const chart = volatilityChart(withFactors(150))!;
    expectLegible(chart);
    expect(chart.description).toMatch(/in \d+ panels/);
  });
});

describe("the app's colours", () => {
  it("each estimator's bars and legend use the colour the app's charts give it", () => {
    const chart = volatilityChart(vm)!;
    const kinds = new Set(vm.figures.riskFactors.flatMap((f) => f.estimates.map((e) => e.estimator)));
    expect(kinds.size).toBeGreaterThan(1);
    for (const kind of kinds) expect(chart.svg, kind).toContain(`fill="${ESTIMATOR_COLOURS[kind]}"`);
  });

  it("the P&L chart's bars, exceptions and VaR line use the palette's series colours", () => {
    const svg = varPnlChart(vm)!.svg;
    expect(svg).toContain(`fill="${CHART_PALETTE.pnl}"`);
    expect(svg).toContain(`stroke="${CHART_PALETTE.varLine}"`);
  });
});
