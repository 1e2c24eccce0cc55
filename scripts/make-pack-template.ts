/**
 * Writes templates/filing-pack.xlsx, the workbook the spreadsheet filing pack fills, from the layout in
 * reports/xlsx/layout.ts: one sheet per part of the filing, each with a title row, the DRAFT marking, the draft
 * caution and a styled, frozen header row; column widths and number formats; and defined names for the Summary
 * sheet's cells. Run after changing the layout:
 *
 *   npx tsx scripts/make-pack-template.ts
 *
 * The output is committed; tests/unit/reports/workbook-pack.test.ts checks that it matches the layout.
 */
import { writeFileSync } from "node:fs";
import path from "node:path";
import XlsxPopulate from "xlsx-populate";
import JSZip from "jszip";
import { DRAFT_CAUTION } from "@/app/_components/draft-caution";
import {
  // the rows every sheet starts with, and the frozen panes
  TITLE_ROW, MARKING_ROW, CAUTION_ROW, HEADER_ROW, FIRST_DATA_ROW, FREEZE,
  // styles and number formats
  BASE_FONT, TITLE_STYLE, DRAFT_STYLE, CAUTION_STYLE, HEADER_STYLE, NUMBER_FORMATS,
  // the sheets, their columns and the Summary sheet's named cells
  SHEETS, COLUMNS, headerText, SUMMARY_ITEMS, SUMMARY_TITLE_NAME, SUMMARY_MARKING_NAME, SUMMARY_CAUTION_NAME,
  SUMMARY_VAR_COLUMNS, SUMMARY_VAR_HEADER_ROW, SUMMARY_VAR_TITLE_ROW,
} from "@/reports/xlsx/layout";
import { asPackWorkbook } from "@/reports/xlsx/workbook-types";
import { withSharedStyles } from "@/reports/xlsx/shared-styles";

const TEMPLATE_PATH = path.join(process.cwd(), "templates", "filing-pack.xlsx");

/** The marking a pack carries until it is signed. */
const TEMPLATE_MARKING = "DRAFT — NOT SIGNED";

async function makePackTemplate(): Promise<Buffer> {
  const wb = asPackWorkbook(await XlsxPopulate.fromBlankAsync());
  const first = wb.sheet(0)!;
  first.name(SHEETS[0]);
  for (const name of SHEETS.slice(1)) wb.addSheet(name);

  for (const name of SHEETS) {
    const sheet = wb.sheet(name)!;
    const columns = COLUMNS[name];
    columns.forEach((c, i) => {
      const col = sheet.column(i + 1);
      col.width(c.width);
      if (c.kind !== "text") col.style({ ...BASE_FONT, numberFormat: NUMBER_FORMATS[c.kind] });
      if (name === "Method") col.style({ ...BASE_FONT, verticalAlignment: "top", ...(i === 1 ? { wrapText: true } : {}) });
    });
    sheet.cell(TITLE_ROW, 1).value(name === "Summary" ? "Filing pack" : name).style(TITLE_STYLE);
    sheet.cell(MARKING_ROW, 1).value(TEMPLATE_MARKING).style(DRAFT_STYLE);
    sheet.cell(CAUTION_ROW, 1).value(DRAFT_CAUTION).style(CAUTION_STYLE);
    columns.forEach((c, i) => {
      sheet.cell(HEADER_ROW, i + 1).value(headerText(c, "reporting currency", 10)).style({ ...HEADER_STYLE, horizontalAlignment: c.kind === "text" ? "left" : "right" });
    });
    sheet.row(HEADER_ROW).height(32);
    sheet.freezePanes(FREEZE[name]);
    // printed pages repeat the title, the marking, the caution and the header row
    sheet.definedName("_xlnm.Print_Titles", `'${name}'!$${TITLE_ROW}:$${HEADER_ROW}`);
  }

  const summary = wb.sheet("Summary")!;
  wb.definedName(SUMMARY_TITLE_NAME, summary.cell(TITLE_ROW, 1));
  wb.definedName(SUMMARY_MARKING_NAME, summary.cell(MARKING_ROW, 1));
  wb.definedName(SUMMARY_CAUTION_NAME, summary.cell(CAUTION_ROW, 1));
  SUMMARY_ITEMS.forEach((item, i) => {
    const row = FIRST_DATA_ROW + i;
    summary.cell(row, 1).value(item.label);
    const value = summary.cell(row, 2);
    value.style({ ...BASE_FONT, horizontalAlignment: item.kind === "text" ? "left" : "right", ...(item.kind !== "text" ? { numberFormat: NUMBER_FORMATS[item.kind] } : {}) });
    if (item.unit === "days") summary.cell(row, 3).value("days");
    wb.definedName(item.name, value);
  });
  summary.cell(SUMMARY_VAR_TITLE_ROW, 1).value("Value-at-risk and expected shortfall").style({ ...BASE_FONT, bold: true, fontSize: 12 });
  SUMMARY_VAR_COLUMNS.forEach((c, i) => {
    summary.cell(SUMMARY_VAR_HEADER_ROW, i + 1).value(headerText(c, "reporting currency", 10)).style({ ...HEADER_STYLE, horizontalAlignment: c.kind === "text" ? "left" : "right" });
    if (i >= 3) summary.column(i + 1).width(c.width);
  });
  summary.row(SUMMARY_VAR_HEADER_ROW).height(32);
  summary.active(true);
  const out = await wb.outputAsync();
  return printSetup(Buffer.from(out as Uint8Array));
}

/**
 * What xlsx-populate has no API for, written into the package's XML: 10-point Arial as the workbook's font, landscape A4
 * pages one page wide with a page-number footer, and no trace of the blank workbook's origin path.
 */
async function printSetup(bytes: Buffer): Promise<Buffer> {
  const zip = await JSZip.loadAsync(bytes);
  const styles = await zip.file("xl/styles.xml")!.async("string");
  zip.file(
    "xl/styles.xml",
    styles
      .replace(/<name val="Calibri"\/>/g, '<name val="Arial"/>')
      .replace(/<family val="2"\/><scheme val="minor"\/>/g, '<family val="2"/>')
      .replace(/(<fonts[^>]*><font>(?:(?!<\/font>)[\s\S])*?)<sz val="11"\/>/, '$1<sz val="10"/>'),
  );
  const workbook = await zip.file("xl/workbook.xml")!.async("string");
  zip.file("xl/workbook.xml", workbook.replace(/<mc:AlternateContent[\s\S]*?<\/mc:AlternateContent>/, ""));
  for (const file of Object.keys(zip.files).filter((f) => /^xl\/worksheets\/sheet\d+\.xml$/.test(f))) {
    let xml = await zip.file(file)!.async("string");
    xml = xml.replace(/<sheetPr\/>|<sheetPr>/, (m) => (m === "<sheetPr/>" ? '<sheetPr><pageSetUpPr fitToPage="1"/></sheetPr>' : '<sheetPr><pageSetUpPr fitToPage="1"/>'));
    xml = xml.replace(/<pageMargins[^>]*\/>/, "");
    xml = xml.replace(
      "</worksheet>",
      '<pageMargins left="0.5" right="0.5" top="0.6" bottom="0.7" header="0.3" footer="0.3"/>' +
        '<pageSetup paperSize="9" orientation="landscape" fitToWidth="1" fitToHeight="0"/>' +
        '<headerFooter><oddFooter>&amp;L&amp;8Ballast filing pack · &amp;A&amp;R&amp;8Page &amp;P of &amp;N</oddFooter></headerFooter></worksheet>',
    );
    zip.file(file, xml);
  }
  // one shared cell format per distinct style, no empty fills (reports/xlsx/shared-styles.ts)
  return withSharedStyles(await zip.generateAsync({ type: "nodebuffer", compression: "DEFLATE" }));
}

async function main() {
  const bytes = await makePackTemplate();
  writeFileSync(TEMPLATE_PATH, bytes);
  console.log(`wrote ${path.relative(process.cwd(), TEMPLATE_PATH)} (${bytes.length} bytes)`);
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
