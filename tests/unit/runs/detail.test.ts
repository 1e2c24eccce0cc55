/**
 * A run's per-position detail apart from its figures (lib/runs/detail.ts): split and joined back it is the same
 * results; a detail that does not fit the figures is refused rather than joined wrongly. Pure; the values are the
 * functions' own definitions, no outside source needed.
 */
import { describe, expect, it } from "vitest";
import { joinDetail, splitDetail } from "@/lib/runs/detail";
import type { RunResults } from "@/lib/runs/types";

const contribution = (instrument: string, componentVar: number) => ({ instrument, componentVar }) as unknown;
const confidence = (c: number, rows: unknown[]) => ({ confidence: c, oneDay: { var: 1, es: 1 }, contributions: rows });
const results = {
  monthEnd: {
    asOf: "2026-11-30",
    methods: [
      { method: "parametric", byConfidence: [confidence(0.99, [contribution("A", 0.6), contribution("B", 0.4)]), confidence(0.975, [contribution("A", 0.5)])] },
      { method: "historical", byConfidence: [confidence(0.99, [contribution("B", 1)])] },
    ],
  },
  notes: ["kept"],
} as unknown as RunResults;

describe("a run's per-position detail", () => {
  it("leaves the figures without contributions, marked, and joins back to the same results", () => {
    const { figures, detail } = splitDetail(results);
    expect(figures.detailApart).toBe(true);
    expect(figures.monthEnd.methods.map((m) => m.byConfidence.map((c) => c.contributions.length))).toEqual([[0, 0], [0]]);
    expect(figures.monthEnd.methods[0].byConfidence[0].oneDay).toEqual({ var: 1, es: 1 });
    expect(detail.contributions.map((m) => m.map((c) => c.length))).toEqual([[2, 1], [1]]);
    expect(joinDetail(figures, detail)).toEqual(results);
    // the results split are not changed
    expect(results.monthEnd.methods[0].byConfidence[0].contributions).toHaveLength(2);
    expect(results.detailApart).toBeUndefined();
  });

  it("refuses a detail that does not fit the figures", () => {
    const { figures, detail } = splitDetail(results);
    expect(() => joinDetail(figures, { contributions: detail.contributions.slice(0, 1) })).toThrow(/does not match/);
    expect(() => joinDetail(figures, { contributions: [detail.contributions[0].slice(0, 1), detail.contributions[1]] })).toThrow(/method parametric/);
  });
});
