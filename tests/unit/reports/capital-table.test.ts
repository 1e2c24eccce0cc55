/**
 * The one capital table spec (reports/capital-table.ts): the Word pack's capital table is exactly its headings and
 * rows, in the filing page's wording. No figures are checked against an outside source here: the rows are the view
 * model's own figures, formatted by reports/format.ts.
 */
import JSZip from "jszip";
import { beforeAll, describe, expect, it } from "vitest";
import { buildWordPack } from "@/reports/docx/filing-pack";
import { CAPITAL_TABLE_COLUMNS, capitalTableRows } from "@/reports/capital-table";
import { formatAmount } from "@/reports/format";
import type { CapitalFigures, FilingViewModel } from "@/reports/view-model";
import { builtPacks } from "./fixture";

function decode(text: string): string {
  return text.replace(/&lt;/g, "<").replace(/&gt;/g, ">").replace(/&quot;/g, '"').replace(/&apos;/g, "'").replace(/&amp;/g, "&");
}

/** Every table of a Word document as rows of cell texts. */
function tables(xml: string): string[][][] {
  const textOf = (x: string) => decode([...x.matchAll(/<w:t(?:\s[^>]*)?>([^<]*)<\/w:t>/g)].map((m) => m[1]).join(""));
  return [...xml.matchAll(/<w:tbl>([\s\S]*?)<\/w:tbl>/g)].map((t) =>
    [...t[1].matchAll(/<w:tr(?:\s[^>]*)?>([\s\S]*?)<\/w:tr>/g)].map((r) => [...r[1].matchAll(/<w:tc>([\s\S]*?)<\/w:tc>/g)].map((c) => textOf(c[1]))),
  );
}

let vm: FilingViewModel;
let document: string;

beforeAll(async () => {
  ({ vm, draft: document } = await builtPacks(buildWordPack, async (bytes) => (await JSZip.loadAsync(bytes)).file("word/document.xml")!.async("string")));
});

describe("the capital table spec", () => {
  it("is what the Word pack's capital table shows: the headings, then every row in order", () => {
    const { rows } = capitalTableRows(vm.figures.capital, vm.figures.currency);
    const capital = tables(document).find((t) => t[0]?.[0] === "Term");
    expect(capital).toEqual([CAPITAL_TABLE_COLUMNS.map((c) => c.header), ...rows]);
  });

  it("uses the filing page's wording for the multipliers and terms", () => {
    const { rows } = capitalTableRows(vm.figures.capital, vm.figures.currency);
    const labels = rows.map((r) => r[0]);
    expect(labels).toContain("Multiplier = base + plus factor");
    expect(labels).toContain("VaR term = max(VaR(t−1), multiplier × average)");
    expect(labels.join("\n")).not.toMatch(/m_c|m_s/);
  });

  it("leaves the stressed terms out when the profile does not include them, the capital last and the only total", () => {
    const c: CapitalFigures = { ...vm.figures.capital, includesStressed: false, stressedVarLast: null, stressedVarAverage: null, stressedMultiplier: null };
    const { rows, totalRows } = capitalTableRows(c, "EUR");
    expect(rows.map((r) => r[0])).toEqual(["Latest VaR, VaR(t−1)", `Average VaR over ${c.averagingDays} days`, "Multiplier = base + plus factor", "VaR term = max(VaR(t−1), multiplier × average)", "Capital"]);
    expect(rows.at(-1)).toEqual(["Capital", formatAmount(c.capital), "EUR"]);
    expect(totalRows).toEqual([rows.length - 1]);
  });
});
