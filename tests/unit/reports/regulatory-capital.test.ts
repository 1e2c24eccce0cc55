/**
 * The packs carry the filed capital figure: the standardised building blocks when the run's profile files them, the
 * value-at-risk based figure beside it as comparison, the RWA equivalent where asked, and the caution; content
 * stored before regimes existed still files the internal-models figure.
 */
import JSZip from "jszip";
import { beforeAll, describe, expect, it } from "vitest";
import { DRAFT_CAUTION } from "@/app/_components/draft-caution";
import XlsxPopulate from "xlsx-populate";
import { buildWordPack } from "@/reports/docx/filing-pack";
import { buildWorkbookPack } from "@/reports/xlsx/filing-pack";
import { formatAmount } from "@/reports/format";
import { regulatoryCapitalOfResults } from "@/reports/regulatory-capital";
import { filingSections } from "@/reports/sections";
import type { FilingViewModel } from "@/reports/view-model";
import { computeStandardised, STANDARDISED_1996_PROFILE, type StandardisedPosition } from "@/lib/risk/standardised";
import type { RunResults } from "@/lib/runs/types";
import { packFixture } from "./fixture";

// Central Bank of the UAE market-risk standards, equity example: one market, long 350,000, short 500,000, short
// 250,000, long 300,000, short 120,000 → general 8 % × |net| = 17,600, specific 8 % × gross = 121,600, total 139,200.
const EQUITY_EXAMPLE: StandardisedPosition[] = [350_000, -500_000, -250_000, 300_000, -120_000].map((mv, i) => ({
  instrument: `EQ-${i + 1}`,
  instrumentType: "equity",
  marketValue: mv,
  currency: "EUR",
  nationalMarket: "XX",
}));

let vm: FilingViewModel;
let legacy: FilingViewModel;

beforeAll(async () => {
  const fixture = await packFixture();
  legacy = fixture.vm;
  const result = computeStandardised(EQUITY_EXAMPLE, { reportingCurrency: "EUR", asOf: "2026-11-30", profile: { ...STANDARDISED_1996_PROFILE, showRwa: true } });
  const results = {
    monthEnd: { capital: { capital: fixture.vm.figures.capital.capital } },
    capitalProfile: { id: "p2", name: "Default (Basel market-risk framework)", version: 2, regimes: "both", filedRegime: "standardised", showRwa: true, standardised: STANDARDISED_1996_PROFILE },
    standardised: { result, problems: [], error: null },
  } as unknown as RunResults;
  vm = { ...fixture.vm, figures: { ...fixture.vm.figures, regulatoryCapital: regulatoryCapitalOfResults(results) } };
});

const sectionText = (v: FilingViewModel) => {
  const s = filingSections(v).find((x) => x.id === "regulatory-capital")!;
  return s.blocks.map((b) => ("text" in b ? b.text : `[${b.name}]`));
};

describe("the Capital filed section", () => {
  it("files the standardised figure, with the published example's total, and shows the VaR-based one beside it", () => {
    const text = sectionText(vm);
    expect(text[0]).toBe("Capital filed");
    expect(text).toContain("The capital figure filed for this period is the standardised 1996 building blocks figure: 139,200 EUR.");
    // × 12.5 (the reciprocal of the 8 % minimum ratio, 1996 amendment): 139,200 × 12.5 = 1,740,000
    expect(text).toContain("Risk-weighted-asset equivalent (capital × 12.5): 1,740,000 EUR.");
    expect(text).toContain(`Beside it, for comparison and not filed: the internal models (value-at-risk based) figure, ${formatAmount(legacy.figures.capital.capital)} EUR.`);
    expect(text).toContain("Computed under the firm's capital rule profile version 2 (Default (Basel market-risk framework)).");
    expect(text).toContain("Equities, specific risk: 121,600 EUR");
    expect(text).toContain("Equities, general market risk: 17,600 EUR");
    expect(text).toContain("XX: gross 1,520,000 EUR, net −220,000 EUR; specific 121,600 EUR, general 17,600 EUR");
    expect(text.at(-1)).toBe(DRAFT_CAUTION);
  });

  it("files the internal-models figure for content stored before capital regimes, without a comparison", () => {
    const text = sectionText({ ...legacy, figures: { ...legacy.figures, regulatoryCapital: undefined } });
    expect(text).toContain(`The capital figure filed for this period is the internal models (value-at-risk based) figure: ${formatAmount(legacy.figures.capital.capital)} EUR.`);
    expect(text.some((t) => t.startsWith("Beside it"))).toBe(false);
    expect(text).not.toContain("Standardised building blocks");
  });

  it("says why when the filed standardised figure could not be computed", () => {
    const results = {
      monthEnd: { capital: { capital: 1000 } },
      capitalProfile: { id: "p2", name: "P", version: 2, regimes: "both", filedRegime: "standardised", showRwa: false, standardised: STANDARDISED_1996_PROFILE },
      standardised: { result: null, problems: [{ row: 3, instrument: "B", column: "residual_maturity_years", message: "a bond needs a residual maturity" }], error: "The standardised figure could not be computed: row 3." },
    } as unknown as RunResults;
    const text = sectionText({ ...legacy, figures: { ...legacy.figures, regulatoryCapital: regulatoryCapitalOfResults(results) } });
    expect(text).toContain("The capital figure filed for this period is the standardised 1996 building blocks figure: not available: The standardised figure could not be computed: row 3..");
  });
});

describe("the Word pack", () => {
  it("carries the Capital filed section after the cover, with the filed figure and the comparison", async () => {
    const zip = await JSZip.loadAsync(await buildWordPack(vm, { charts: false }));
    const xml = await zip.file("word/document.xml")!.async("string");
    const plain = xml.replace(/<[^>]+>/g, "");
    const filedAt = plain.indexOf("Capital filed");
    expect(filedAt).toBeGreaterThan(0);
    expect(plain.indexOf("Capital summary")).toBeGreaterThan(filedAt);
    expect(plain).toContain("standardised 1996 building blocks figure: 139,200 EUR");
    expect(plain).toContain("for comparison and not filed");
  });
});

describe("the spreadsheet pack", () => {
  it("carries the filed figure, its RWA equivalent and the comparison on the Summary sheet, under the caution", async () => {
    const wb = await XlsxPopulate.fromDataAsync(await buildWorkbookPack(vm));
    const value = (name: string) => (wb.definedName(name) as { value(): unknown }).value();
    expect(value("filed_capital_regime")).toBe("Standardised 1996 building blocks");
    expect(value("filed_capital")).toBe(139_200);
    expect(value("filed_capital_rwa")).toBe(1_740_000);
    expect(value("comparison_capital_regime")).toBe("Internal models (value-at-risk based)");
    expect(value("comparison_capital")).toBe(legacy.figures.capital.capital);
    const texts: string[] = [];
    for (const cell of wb.sheet("Summary")!.usedRange()!.cells().flat()) {
      const v = cell.value();
      if (typeof v === "string") texts.push(v);
    }
    expect(texts.some((t) => t.includes(DRAFT_CAUTION))).toBe(true);
  });
});
