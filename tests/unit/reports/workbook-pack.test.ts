import { readFileSync } from "node:fs";
import path from "node:path";
import JSZip from "jszip";
import XlsxPopulate from "xlsx-populate";
import { describe, expect, it } from "vitest";
import { DRAFT_CAUTION } from "@/app/_components/draft-caution";
import { excelSerialDate, excelSerialTimestamp } from "@/reports/format";
import { buildWorkbookPack } from "@/reports/xlsx/filing-pack";
import { COLUMNS, FREEZE, NUMBER_FORMATS, SHEETS, SUMMARY_ITEMS, SUMMARY_VAR_HEADER_ROW, headerText, type SheetName } from "@/reports/xlsx/layout";
import { asPackWorkbook, type PackCell, type PackSheet, type PackWorkbook } from "@/reports/xlsx/workbook-types";
import { FORMULA_TEXT, packFixture, packsBuiltBeforeAll } from "./fixture";

async function open(bytes: Buffer): Promise<PackWorkbook> {
  return asPackWorkbook(await XlsxPopulate.fromDataAsync(bytes));
}

/** Data rows of a sheet's table (from row 5) as [value, number format] per cell, up to the first empty row. */
function tableRows(sheet: PackSheet, columns: number): PackCell[][] {
  const rows: PackCell[][] = [];
  for (let r = 5; sheet.cell(r, 1).value() !== undefined; r++) rows.push(Array.from({ length: columns }, (_, c) => sheet.cell(r, c + 1)));
  return rows;
}

function expectNumber(cell: PackCell, value: number, format: string): void {
  expect(cell.value(), cell.address()).toBe(value);
  expect(typeof cell.value()).toBe("number");
  expect(cell.style("numberFormat"), cell.address()).toBe(format);
}

const packs = packsBuiltBeforeAll(buildWorkbookPack, open);

describe("the workbook pack", () => {
  it("has the sheets in order, each with its title, the DRAFT marking, the caution and frozen headers", () => {
    expect(packs.draft.sheets().map((s) => s.name())).toEqual([...SHEETS]);
    for (const name of SHEETS) {
      const s = packs.draft.sheet(name)!;
      expect(String(s.cell(1, 1).value())).toContain("Northmoor Brokerage Ltd");
      expect(s.cell(2, 1).value()).toBe("DRAFT — NOT SIGNED");
      expect(s.cell(3, 1).value()).toBe(`Draft caution: ${DRAFT_CAUTION}`);
      expect(s.panes()).toMatchObject({ state: "frozen", topLeftCell: FREEZE[name] });
      COLUMNS[name].forEach((c, i) => {
        expect(s.column(i + 1).width(), `${name} column ${i + 1}`).toBe(c.width);
        if (name !== "Summary") expect(s.cell(4, i + 1).value()).toBe(headerText(c, "EUR", 10));
      });
    }
    expect(packs.draft.definedName("caution")!.value()).toBe(`Draft caution: ${DRAFT_CAUTION}`);
  });

  it("writes every summary figure under its defined name: numbers as numbers, dates as dates", () => {
    const c = packs.vm.figures.capital;
    const b = packs.vm.figures.backtest;
    const numbers: Record<string, number> = {
      capital: c.capital, var_last: c.varLast, var_average: c.varAverage, multiplier: c.multiplier, plus_factor: c.plusFactor, var_term: c.varTerm,
      svar_last: c.stressedVarLast!, svar_average: c.stressedVarAverage!, svar_multiplier: c.stressedMultiplier!, svar_term: c.stressedVarTerm,
      capital_confidence: c.confidence, capital_horizon_days: c.horizonDays, averaging_days: c.averagingDays, backtest_days: b.days, backtest_exceptions: b.exceptions,
      backtest_expected: b.expectedExceptions, kupiec_lr: b.kupiec.lr, kupiec_p: b.kupiec.pValue, christoffersen_cc_p: b.christoffersen!.pValueCc, filing_version: 2, method_version: 3,
    };
    const kinds = new Map(SUMMARY_ITEMS.map((i) => [i.name, i.kind]));
    for (const [name, value] of Object.entries(numbers)) expectNumber(packs.draft.definedName(name)!, value, NUMBER_FORMATS[kinds.get(name) as keyof typeof NUMBER_FORMATS]);
    expectNumber(packs.draft.definedName("period_end")!, excelSerialDate(packs.vm.period.end), NUMBER_FORMATS.date);
    expectNumber(packs.draft.definedName("filing_deadline")!, excelSerialDate("2025-02-14"), NUMBER_FORMATS.date);
    expectNumber(packs.draft.definedName("stress_window_start")!, excelSerialDate(packs.vm.figures.stressed.window.start), NUMBER_FORMATS.date);
    expect(packs.draft.definedName("firm_name")!.value()).toBe("Northmoor Brokerage Ltd");
    expect(packs.draft.definedName("backtest_zone")!.value()).toBe(b.zone);
    expect(packs.draft.definedName("signed_by")!.value()).toBe("Not signed");
    // the VaR and ES table under the items: every method and confidence, then the stressed figures
    const s = packs.draft.sheet("Summary")!;
    let r = SUMMARY_VAR_HEADER_ROW + 1;
    for (const m of packs.vm.figures.totals) {
      for (const x of m.byConfidence) {
        expectNumber(s.cell(r, 2), x.confidence, NUMBER_FORMATS.confidence);
        [x.oneDay.var, x.oneDay.es, x.horizon.var, x.horizon.es].forEach((v, i) => expectNumber(s.cell(r, 3 + i), v, NUMBER_FORMATS.amount));
        r++;
      }
    }
    for (const x of packs.vm.figures.stressed.byConfidence) {
      expect(String(s.cell(r, 1).value())).toMatch(/^Stressed VaR and ES/);
      [x.oneDay.var, x.oneDay.es, x.horizon.var, x.horizon.es].forEach((v, i) => expectNumber(s.cell(r, 3 + i), v, NUMBER_FORMATS.amount));
      r++;
    }
  });

  it("lists every position, factor, correlation, contribution, history point and backtest day with the view model's figures", () => {
    const f = packs.vm.figures;
    const positions = tableRows(packs.draft.sheet("Positions")!, 8);
    expect(positions).toHaveLength(f.positions.length);
    positions.forEach((row, i) => {
      const p = f.positions[i];
      expectNumber(row[3], p.marketValue, NUMBER_FORMATS.amount);
      if (p.included) {
        expect(row[0].value()).toBe(p.instrument);
        expectNumber(row[4], p.exposure!, NUMBER_FORMATS.amount);
        expectNumber(row[5], p.componentVar1d!, NUMBER_FORMATS.amount);
      }
    });

    const factors = tableRows(packs.draft.sheet("Risk factors")!, 9);
    expect(factors.map((r) => r[0].value())).toEqual(f.riskFactors.map((r) => r.factor));
    factors.forEach((row, i) => {
      const rf = f.riskFactors[i];
      expectNumber(row[2], rf.exposure, NUMBER_FORMATS.amount);
      rf.estimates.forEach((e, k) => expectNumber(row[3 + k], e.volatility!, NUMBER_FORMATS.percent));
      expect(row[7].value()).toBe(rf.chosenLabel);
      expectNumber(row[8], rf.chosenVolatility!, NUMBER_FORMATS.percent);
    });
    expect(packs.draft.sheet("Risk factors")!.cell(4, 4).value()).toBe("Equal-weight moving average, 1-day volatility");

    const corr = f.correlation!;
    const corrRows = tableRows(packs.draft.sheet("Correlation")!, corr.factors.length + 1);
    corrRows.forEach((row, i) => {
      expect(row[0].value()).toBe(corr.factors[i]);
      corr.matrix[i].forEach((v, j) => expectNumber(row[j + 1], v, NUMBER_FORMATS.correlation));
    });

    const contributions = tableRows(packs.draft.sheet("Contributions")!, 13);
    const perConfidence = f.contributions[0].byPosition.length + f.contributions[0].byAssetClass.length + f.contributions[0].byCurrency.length + 1;
    expect(contributions).toHaveLength(perConfidence * f.contributions.length);
    f.contributions[1].byPosition.forEach((p, i) => {
      const row = contributions[perConfidence + i];
      expectNumber(row[0], f.contributions[1].confidence, NUMBER_FORMATS.confidence);
      expect(row[1].value()).toBe("position");
      expectNumber(row[6], p.componentVar1d, NUMBER_FORMATS.amount);
      expectNumber(row[9], p.componentEsHorizon, NUMBER_FORMATS.amount);
      expectNumber(row[10], p.shareOfVar, NUMBER_FORMATS.percent);
    });

    const history = tableRows(packs.draft.sheet("VaR history")!, 2 + 4 * f.confidences.length);
    expect(history).toHaveLength(f.varHistory.points.length);
    history.forEach((row, i) => {
      const p = f.varHistory.points[i];
      expectNumber(row[0], excelSerialDate(p.asOf), NUMBER_FORMATS.date);
      f.confidences.forEach((_c, k) => {
        expectNumber(row[1 + 4 * k], p.var1d[k], NUMBER_FORMATS.amount);
        expectNumber(row[4 + 4 * k], p.esHorizon[k], NUMBER_FORMATS.amount);
      });
      if (p.pnlNext !== null) expectNumber(row[1 + 4 * f.confidences.length], p.pnlNext, NUMBER_FORMATS.amount);
    });

    const backtest = tableRows(packs.draft.sheet("Backtest")!, 6);
    expect(backtest).toHaveLength(f.backtest.pnlVsVar.length);
    backtest.forEach((row, i) => {
      const d = f.backtest.pnlVsVar[i];
      expectNumber(row[0], excelSerialDate(d.date), NUMBER_FORMATS.date);
      expectNumber(row[1], d.pnl, NUMBER_FORMATS.amount);
      expectNumber(row[2], d.var, NUMBER_FORMATS.amount);
      expect(row[3].value() ?? "").toBe(d.exception ? "yes" : "");
    });
    const exceptions = backtest.filter((row) => row[3].value() === "yes");
    expect(exceptions.map((row) => row[4].value())).toEqual(f.backtest.exceptionList.map((e) => e.excess));
    expect(exceptions.map((row) => row[5].value())).toEqual(f.backtest.exceptionList.map((e) => `'${e.explanation}`));

    const quality = tableRows(packs.draft.sheet("Data quality")!, 5);
    expect(quality.map((r) => r[3].value())).toEqual(packs.vm.dataQuality.items.map((i) => (i.message.startsWith("=") ? `'${i.message}` : i.message)));

    const method = tableRows(packs.draft.sheet("Method")!, 2).map((r) => r[1].value());
    for (const s of packs.vm.method.sentences) expect(method).toContain(s);
    expect(method).toContain(DRAFT_CAUTION);
  });

  it("keeps formula-looking text as text: prefixed, and no cell anywhere holds a formula", async () => {
    const positions = tableRows(packs.draft.sheet("Positions")!, 8);
    const formulaRow = positions.find((r) => String(r[0].value()).includes("HYPERLINK"))!;
    expect(formulaRow[0].value()).toBe(`Main · ${FORMULA_TEXT}`); // starts with "Main", nothing to neutralise
    const quality = tableRows(packs.draft.sheet("Data quality")!, 5);
    const cell = quality.find((r) => r[2].value() === `'${FORMULA_TEXT}`)![2];
    expect(cell.formula()).toBeUndefined();
    const method = tableRows(packs.draft.sheet("Method")!, 2);
    expect(method.map((r) => r[1].value())).toContain(`'${FORMULA_TEXT} was found in the positions file and is listed as left out.`);
    expect(method.map((r) => r[1].value())).toContain("'=SUM(A1:A9) is how the desk's own sheet totals the book; it is not used here.");
    for (const s of packs.draft.sheets()) {
      for (const row of s.usedRange()!.cells()) for (const c of row) expect(c.formula(), `${s.name()}!${c.address()}`).toBeUndefined();
    }
    // and in the file itself: no formula element in any sheet, no cached value standing in for one
    const zip = await JSZip.loadAsync(packs.draftBytes);
    for (const file of Object.keys(zip.files).filter((f) => f.startsWith("xl/worksheets/sheet"))) {
      expect(await zip.file(file)!.async("string"), file).not.toMatch(/<f[ >]/);
    }
  });

  it("once signed, carries the signature and the content hash instead of the DRAFT marking", () => {
    for (const name of SHEETS) expect(String(packs.signed.sheet(name)!.cell(2, 1).value())).toMatch(/^SIGNED by Helen Marsh on 3 Dec 2026 · SHA-256 [0-9a-f]{12}…$/);
    expect(packs.signed.definedName("content_hash")!.value()).toMatch(/^[0-9a-f]{64}$/);
    expect(packs.signed.definedName("signed_by")!.value()).toBe("Helen Marsh");
    expectNumber(packs.signed.definedName("signed_at")!, excelSerialTimestamp("2026-12-03T15:42:00.000Z"), NUMBER_FORMATS.timestamp);
    expect(packs.signed.definedName("filing_status")!.value()).toBe("Signed");
  });

  it("refuses to build a signed pack whose content differs from what was signed", async () => {
    const { signed: s } = await packFixture();
    const changed = structuredClone(s);
    changed.figures.capital.capital += 1;
    await expect(buildWorkbookPack(changed)).rejects.toThrow("does not match this filing's content");
  });
});

describe("the template workbook", () => {
  it("matches the layout: sheets, header rows, widths, frozen panes, defined names and print titles", async () => {
    const bytes = readFileSync(path.join(process.cwd(), "templates", "filing-pack.xlsx"));
    const wb = await open(bytes);
    expect(wb.sheets().map((s) => s.name())).toEqual([...SHEETS]);
    for (const name of SHEETS as readonly SheetName[]) {
      const s = wb.sheet(name)!;
      expect(s.cell(2, 1).value()).toBe("DRAFT — NOT SIGNED");
      expect(s.cell(3, 1).value()).toBe(DRAFT_CAUTION);
      COLUMNS[name].forEach((c, i) => {
        expect(s.cell(4, i + 1).value()).toBe(headerText(c, "reporting currency", 10));
        expect(s.column(i + 1).width()).toBe(c.width);
      });
      expect(s.panes()).toMatchObject({ state: "frozen", topLeftCell: FREEZE[name] });
    }
    for (const item of SUMMARY_ITEMS) expect(wb.definedName(item.name), item.name).toBeDefined();
    const workbookXml = await (await JSZip.loadAsync(bytes)).file("xl/workbook.xml")!.async("string");
    expect(workbookXml.match(/_xlnm\.Print_Titles/g)).toHaveLength(SHEETS.length);
  });
});
