import { describe, expect, it } from "vitest";
import { runMonthEnd } from "@/lib/risk/portfolio/run-month-end";
import { resultsUnderCurrentNames } from "@/lib/runs/stored-state";
import type { RunResults } from "@/lib/runs/types";
import { syntheticBook } from "../risk/portfolio/synthetic-book";

// Runs stored before the horizon figures were named for any horizon carry `tenDay`, `var10d`, `componentVar10d`, …;
// reading them back must give today's names with the same values. Checks the code against its own output (no outside
// source needed: a renaming, not a figure).
const book = syntheticBook(6, 700, 20, 3);
const monthEnd = runMonthEnd({ positions: book.positions, returns: book.returns, reportingCurrency: "USD", method: { methods: ["parametric", "historical"] } });
const current = { monthEnd } as Partial<RunResults> as RunResults; // only monthEnd matters to the renaming

const EARLIER: Record<string, string> = {
  horizon: "tenDay",
  varHorizon: "var10d",
  esHorizon: "es10d",
  componentVarHorizon: "componentVar10d",
  componentEsHorizon: "componentEs10d",
  standAloneVarHorizon: "standAloneVar10d",
  standAloneEsHorizon: "standAloneEs10d",
  diversificationBenefitHorizon: "diversificationBenefit10d",
};
function underEarlierNames(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(underEarlierNames);
  if (value === null || typeof value !== "object") return value;
  return Object.fromEntries(Object.entries(value).map(([k, v]) => [EARLIER[k] ?? k, underEarlierNames(v)]));
}

describe("stored run results under earlier names", () => {
  it("come back under today's names with the same values", () => {
    const stored = JSON.parse(JSON.stringify(underEarlierNames(current))) as RunResults;
    expect(JSON.stringify(stored)).toContain('"tenDay"');
    expect(JSON.stringify(stored)).toContain('"componentVar10d"');
    const read = resultsUnderCurrentNames(stored);
    expect(read).toEqual(JSON.parse(JSON.stringify(current)));
    expect(JSON.stringify(read)).not.toMatch(/tenDay|10d"/);
  });

  it("leave results already under today's names as they are", () => {
    expect(resultsUnderCurrentNames(current)).toBe(current);
  });
});
