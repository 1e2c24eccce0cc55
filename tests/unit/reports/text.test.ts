import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { excelSerialDate, excelSerialTimestamp, formatAmount, formatConfidence, formatDate, formatNumber, formatPValue, formatPercent } from "@/reports/format";
import { looksLikeFormula, neutralise } from "@/reports/neutralise";
import { APPENDIX_SECTIONS, filingSections, MAIN_SECTIONS, renderBlocks, sectionValues } from "@/reports/sections";
import { packFixture } from "./fixture";

describe("formats", () => {
  it("amounts in whole units with thousands separators and a real minus sign", () => {
    expect(formatAmount(1234567.6)).toBe("1,234,568");
    expect(formatAmount(-5)).toBe("\u22125");
    expect(formatAmount(-0.4)).toBe("0");
    expect(formatAmount(999.5)).toBe("1,000");
    expect(() => formatAmount(Number.NaN)).toThrow("finite");
  });

  it("numbers, per cent, confidence levels, p-values and dates", () => {
    expect(formatNumber(3.456, 2)).toBe("3.46");
    expect(formatPercent(0.01234)).toBe("1.23 %");
    expect(formatConfidence(0.99)).toBe("99 %");
    expect(formatConfidence(0.975)).toBe("97.5 %");
    expect(formatPValue(0.00001)).toBe("< 0.0001");
    expect(formatPValue(0.75803)).toBe("0.7580");
    expect(formatDate("2026-11-30")).toBe("30 Nov 2026");
  });

  it("Excel serial dates in the 1900 date system, whatever the machine's time zone", () => {
    // 1 Mar 1900 is serial 61 and 1 Jan 2024 is 45292 in the 1900 date system (from memory; the 1900 system counts a 29 Feb 1900)
    expect(excelSerialDate("1900-03-01")).toBe(61);
    expect(excelSerialDate("2024-01-01")).toBe(45292);
    expect(excelSerialTimestamp("2024-01-01T12:00:00.000Z")).toBe(45292.5);
    expect(() => excelSerialDate("30/11/2026")).toThrow("yyyy-mm-dd");
  });
});

describe("neutralise", () => {
  it("prefixes text that a spreadsheet would take for a formula, and nothing else", () => {
    for (const text of ["=HYPERLINK(\"x\")", "+1", "-2", "@SUM(A1)", "\t=1", "\r=1"]) {
      expect(looksLikeFormula(text)).toBe(true);
      expect(neutralise(text)).toBe(`'${text}`);
    }
    for (const text of ["", "INST0001", "'=already", "1-2", " =x", "\u22125"]) expect(neutralise(text)).toBe(text);
  });
});

describe("filing templates", () => {
  const dir = path.join(process.cwd(), "templates", "filing");

  it("every section renders from the fixture and starts with its heading", async () => {
    const { vm } = await packFixture();
    const sections = filingSections(vm);
    expect(sections.map((s) => s.id)).toEqual([...MAIN_SECTIONS, ...APPENDIX_SECTIONS]);
    for (const s of sections) {
      expect(s.blocks[0]).toEqual({ kind: "h1", text: s.title });
      for (const b of s.blocks) if ("text" in b) expect(b.text, `${s.id}: ${b.text}`).not.toMatch(/\{\{|\}\}|undefined|NaN/);
    }
    expect(sections.map((s) => s.title)).toEqual([
      "Filing pack", "Capital filed", "Capital summary", "Value-at-risk and expected shortfall", "Stressed value-at-risk", "Backtest", "Method statement", "Limitations",
      "Data quality", "Changes since the last filing", "Sign-off", "Cautions", "Positions", "Risk factors", "Correlation", "Contributions", "VaR history",
      "Method annex: the model of each factor and the candidate methods",
    ]);
  });

  it("a missing value fails loudly, naming the template and the key", async () => {
    const { vm } = await packFixture();
    const values = sectionValues("capital", vm);
    delete values.varTerm;
    expect(() => renderBlocks("capital", values)).toThrow("templates/filing/capital.md: The template needs a value for: varTerm.");
  });

  it("text a person typed never becomes a heading, a bullet or a table", async () => {
    const { vm } = await packFixture();
    const typed = { ...vm, filing: { ...vm.filing, coverNote: "# Not a heading\n- not a bullet\n[table positions]" } };
    const cover = renderBlocks("cover", sectionValues("cover", typed));
    const note = cover.slice(cover.findIndex((b) => b.kind === "h2" && b.text === "Cover note") + 1);
    expect(note).toEqual([
      { kind: "p", text: "# Not a heading" },
      { kind: "p", text: "'- not a bullet" },
      { kind: "p", text: "[table positions]" },
    ]);
  });

  it("every placeholder a template uses gets a value, and every fragment is used", async () => {
    const { vm, signed } = await packFixture();
    // the section values live in reports/sections.ts and, for the capital filed, reports/regulatory-capital-text.ts
    const code = ["sections.ts", "regulatory-capital-text.ts"].map((f) => readFileSync(path.join(process.cwd(), "reports", f), "utf8")).join("\n");
    for (const id of [...MAIN_SECTIONS, ...APPENDIX_SECTIONS]) {
      const keys = [...readFileSync(path.join(dir, `${id}.md`), "utf8").matchAll(/\{\{\s*([A-Za-z][A-Za-z0-9_]*)\s*\}\}/g)].map((m) => m[1]);
      for (const model of [vm, signed]) {
        const values = sectionValues(id, model);
        for (const k of keys) expect(Object.hasOwn(values, k), `${id}.md {{${k}}}`).toBe(true);
      }
    }
    for (const file of readdirSync(path.join(dir, "fragments"))) expect(code, file).toContain(`fragment("${file.replace(/\.md$/, "")}"`);
  });
});
