import { describe, expect, it } from "vitest";
import { runMonthEnd } from "@/lib/risk/portfolio/run-month-end";
import { resultsUnderCurrentNames } from "@/lib/runs/stored-state";
import type { RunResults } from "@/lib/runs/types";
import { bookInput, syntheticBook } from "../risk/portfolio/synthetic-book";

// Runs stored before the horizon figures were named for any horizon carry `tenDay`, `var10d`, `componentVar10d`, …;
// reading them back must give today's names with the same values. Checks the code against its own output (no outside
// source needed: a renaming, not a figure).
const book = syntheticBook(6, 700, 20, 3);
const monthEnd = runMonthEnd(bookInput(book, { methods: ["parametric", "historical"] }));
const current = { monthEnd } as Partial<RunResults> as RunResults; // only monthEnd matters to the renaming

/** The earlier name of each of today's horizon names: `horizon` was `tenDay`, and each other `…Horizon` was `…10d`. */
const RENAMED = ["var", "es", "componentVar", "componentEs", "standAloneVar", "standAloneEs", "diversificationBenefit"].map((m) => `${m}Horizon`);
const earlierName = (key: string) => (key === "horizon" ? "tenDay" : RENAMED.includes(key) ? key.replace(/Horizon$/, "10d") : key);
/** Results as a run stored them under the earlier names: the stored JSON text with each object key renamed. */
const storedUnderEarlierNames = (results: RunResults) =>
  JSON.parse(JSON.stringify(results).replace(/"(\w+)":/g, (_, key: string) => `"${earlierName(key)}":`)) as RunResults;

describe("stored run results under earlier names", () => {
  it("come back under today's names with the same values", () => {
    const stored = storedUnderEarlierNames(current);
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
