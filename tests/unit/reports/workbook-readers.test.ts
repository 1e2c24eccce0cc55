/**
 * The workbook pack opens in common readers: shared cell formats (a handful, not one per cell), no empty fill
 * elements (SpreadsheetML, ECMA-376 Part 1 §18.8.20: a <fill> holds a patternFill or a gradientFill), and a standard
 * Python reader (openpyxl) loads it and reads the same values; skipped with the reason where python3 with openpyxl
 * is not installed. LibreOffice is checked by libreoffice.test.ts.
 */
import { execFileSync, spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import JSZip from "jszip";
import XlsxPopulate from "xlsx-populate";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildWorkbookPack } from "@/reports/xlsx/filing-pack";
import { remapSheet, shareStyles } from "@/reports/xlsx/shared-styles";
import { asPackWorkbook } from "@/reports/xlsx/workbook-types";
import { packFixture } from "./fixture";

// the first Python on the path, else the system's (Debian's python3-openpyxl installs there)
const python = ["python3", "/usr/bin/python3"].find((p) => spawnSync(p, ["-c", "import openpyxl"], { stdio: "ignore" }).status === 0);
const openpyxl = python !== undefined;
const reason = openpyxl ? "" : " (openpyxl check skipped: python3 with openpyxl is not installed; apt-get install python3-openpyxl)";
const dir = mkdtempSync(path.join(os.tmpdir(), "ballast-xlsx-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

let bytes: Buffer;
let styles: string;
let cells: number;

beforeAll(async () => {
  const { vm } = await packFixture();
  bytes = await buildWorkbookPack(vm);
  const zip = await JSZip.loadAsync(bytes);
  styles = await zip.file("xl/styles.xml")!.async("string");
  cells = 0;
  for (const name of Object.keys(zip.files).filter((n) => /^xl\/worksheets\/[^/]+\.xml$/.test(n))) cells += ((await zip.file(name)!.async("string")).match(/<c\b/g) ?? []).length;
});

describe("shared cell styles", () => {
  it("stores a handful of cell formats for the whole pack, not one per cell", () => {
    const xfs = (/<cellXfs count="(\d+)"/.exec(styles) ?? [])[1];
    expect(cells).toBeGreaterThan(500);
    expect(Number(xfs)).toBeLessThanOrEqual(60);
    expect(styles.match(/<cellXfs\b[\s\S]*?<\/cellXfs>/)![0].match(/<xf\b/g)).toHaveLength(Number(xfs));
  });

  it("has no empty fill element, and the two reserved fills first", () => {
    expect(styles).not.toMatch(/<fill\s*\/>|<fill>\s*<\/fill>/);
    const fills = styles.match(/<fills\b[\s\S]*?<\/fills>/)![0];
    expect(fills).toMatch(/^<fills count="\d+"><fill><patternFill patternType="none"\/><\/fill><fill><patternFill patternType="gray125"\/><\/fill>/);
  });

  it("merges identical formats and remaps the cells to them (a small hand-made stylesheet)", () => {
    const xml =
      '<styleSheet><fonts count="3"><font><sz val="10"/></font><font><b/></font><font><b/></font></fonts>' +
      '<fills count="4"><fill><patternFill patternType="none"/></fill><fill><patternFill patternType="gray125"/></fill><fill/><fill/></fills>' +
      '<borders count="2"><border/><border/></borders><cellStyleXfs count="1"><xf fontId="0" fillId="0" borderId="0"/></cellStyleXfs>' +
      '<cellXfs count="4"><xf fontId="0" fillId="0" borderId="0"/><xf fontId="1" fillId="2" borderId="1"/><xf fontId="2" fillId="3" borderId="0"/><xf fontId="2" fillId="3" borderId="1"/></cellXfs></styleSheet>';
    const { xml: out, xfMap } = shareStyles(xml);
    expect(out).toContain('<fonts count="2"><font><sz val="10"/></font><font><b/></font></fonts>');
    expect(out).toContain('<fills count="2">');
    expect(out).toContain('<borders count="1">');
    expect(out).toContain('<cellXfs count="2"><xf fontId="0" fillId="0" borderId="0"/><xf fontId="1" fillId="0" borderId="0"/></cellXfs>');
    expect(xfMap).toEqual([0, 1, 1, 1]);
    expect(remapSheet('<row r="1" s="3"><c r="A1" s="2" t="s"><v>0</v></c></row><cols><col min="1" max="1" style="1"/></cols>', xfMap)).toBe(
      '<row r="1" s="1"><c r="A1" s="1" t="s"><v>0</v></c></row><cols><col min="1" max="1" style="1"/></cols>',
    );
  });

  it("keeps every cell's value and number format (read back with xlsx-populate)", async () => {
    const wb = asPackWorkbook(await XlsxPopulate.fromDataAsync(bytes));
    const positions = wb.sheet("Positions")!;
    expect(typeof positions.cell(5, 4).value()).toBe("number");
    expect(positions.cell(5, 4).style("numberFormat")).toBe("#,##0;-#,##0");
    expect(wb.sheet("Summary")!.cell(2, 1).value()).toBe("DRAFT — NOT SIGNED");
  });
});

describe(`a standard Python reader opens the pack${reason}`, () => {
  it.skipIf(!openpyxl)("openpyxl loads every sheet and reads the same values as xlsx-populate", async () => {
    const file = path.join(dir, "pack.xlsx");
    writeFileSync(file, bytes);
    const script = [
      "import json, sys, openpyxl",
      "wb = openpyxl.load_workbook(sys.argv[1])",
      "out = {}",
      "for ws in wb.worksheets:",
      "    out[ws.title] = {'A2': ws['A2'].value, 'D5': ws['D5'].value, 'D5format': ws['D5'].number_format, 'rows': ws.max_row}",
      "print(json.dumps(out))",
    ].join("\n");
    writeFileSync(path.join(dir, "read.py"), script);
    const read = JSON.parse(execFileSync(python!, [path.join(dir, "read.py"), file], { encoding: "utf8" })) as Record<string, { A2: unknown; D5: unknown; D5format: string; rows: number }>;
    const wb = asPackWorkbook(await XlsxPopulate.fromDataAsync(readFileSync(file)));
    expect(Object.keys(read)).toEqual(wb.sheets().map((s) => s.name()));
    for (const name of Object.keys(read)) expect(read[name].A2, name).toBe("DRAFT — NOT SIGNED");
    expect(read.Positions.D5).toBe(wb.sheet("Positions")!.cell(5, 4).value());
    expect(read.Positions.D5format).toBe("#,##0;-#,##0");
    expect(read.Positions.rows).toBeGreaterThan(5);
  });
});
