/**
 * The Word pack's styles, declared once: the document defaults, headings, notes, table text, the header marking and
 * the footer. Colours follow the app's ink-on-paper palette (tailwind.config.ts); Arial is used because every
 * office suite has it or a metric-compatible stand-in (LibreOffice maps it to Liberation Sans).
 */
import { AlignmentType, LineRuleType, type IStylesOptions } from "docx";

export const FONT = "Arial";

export const COLOURS = {
  ink: "1C2733",
  soft: "3D4A57",
  muted: "6B7682",
  line: "D8D3C7",
  headerFill: "EFECE4",
  totalFill: "F7F5F0",
  brass: "A8671C",
  caution: "8A5A00",
  cautionFill: "F6ECD4",
  alert: "A2332B",
  ok: "2F6B3F",
} as const;

/** Style ids used by the builder. */
export const STYLE = {
  note: "BallastNote",
  tableText: "BallastTableText",
  tableNumber: "BallastTableNumber",
  tableHeader: "BallastTableHeader",
  tableHeaderNumber: "BallastTableHeaderNumber",
  caption: "BallastCaption",
  marking: "BallastMarking",
  headerText: "BallastHeaderText",
  footerText: "BallastFooterText",
  caution: "BallastCaution",
  coverTitle: "BallastCoverTitle",
  hash: "BallastHash",
} as const;

/** Sizes are in half-points (docx's unit for run sizes): 20 = 10 pt. */
export const filingStyles: IStylesOptions = {
  default: {
    document: {
      run: { font: FONT, size: 20, color: COLOURS.ink },
      paragraph: { spacing: { after: 120, line: 264, lineRule: LineRuleType.AUTO } },
    },
    heading1: {
      run: { font: FONT, size: 30, bold: true, color: COLOURS.ink },
      paragraph: { spacing: { before: 360, after: 160 }, keepNext: true, keepLines: true, border: { bottom: { style: "single", size: 6, color: COLOURS.line, space: 4 } } },
    },
    heading2: {
      run: { font: FONT, size: 23, bold: true, color: COLOURS.soft },
      paragraph: { spacing: { before: 240, after: 100 }, keepNext: true, keepLines: true },
    },
  },
  paragraphStyles: [
    { id: STYLE.note, name: "Ballast note", basedOn: "Normal", next: "Normal", run: { size: 17, italics: true, color: COLOURS.soft }, paragraph: { spacing: { after: 100 }, indent: { left: 240 } } },
    { id: STYLE.tableText, name: "Ballast table text", basedOn: "Normal", run: { size: 16 }, paragraph: { spacing: { before: 20, after: 20, line: 240, lineRule: LineRuleType.AUTO } } },
    { id: STYLE.tableNumber, name: "Ballast table number", basedOn: STYLE.tableText, run: { size: 16 }, paragraph: { alignment: AlignmentType.RIGHT } },
    { id: STYLE.tableHeader, name: "Ballast table header", basedOn: STYLE.tableText, run: { size: 16, bold: true, color: COLOURS.soft }, paragraph: { keepNext: true } },
    { id: STYLE.tableHeaderNumber, name: "Ballast table header, number", basedOn: STYLE.tableHeader, run: { size: 16, bold: true, color: COLOURS.soft }, paragraph: { alignment: AlignmentType.RIGHT } },
    { id: STYLE.caption, name: "Ballast caption", basedOn: "Normal", next: "Normal", run: { size: 17, bold: true, color: COLOURS.soft }, paragraph: { spacing: { before: 160, after: 60 }, keepNext: true } },
    { id: STYLE.marking, name: "Ballast marking", basedOn: "Normal", run: { size: 18, bold: true, color: COLOURS.alert }, paragraph: { spacing: { after: 0 } } },
    { id: STYLE.headerText, name: "Ballast header text", basedOn: "Normal", run: { size: 15, color: COLOURS.muted }, paragraph: { spacing: { after: 0 } } },
    { id: STYLE.footerText, name: "Ballast footer text", basedOn: "Normal", run: { size: 14, color: COLOURS.muted }, paragraph: { spacing: { after: 0, line: 220, lineRule: LineRuleType.AUTO } } },
    {
      id: STYLE.caution,
      name: "Ballast caution",
      basedOn: "Normal",
      next: "Normal",
      run: { size: 18, color: COLOURS.caution },
      paragraph: { shading: { type: "clear", color: "auto", fill: COLOURS.cautionFill }, border: { left: { style: "single", size: 18, color: COLOURS.caution, space: 6 } }, spacing: { before: 120, after: 160 }, indent: { left: 160, right: 160 } },
    },
    { id: STYLE.coverTitle, name: "Ballast cover title", basedOn: "Normal", next: "Normal", run: { size: 44, bold: true, color: COLOURS.ink }, paragraph: { spacing: { before: 480, after: 120 } } },
    { id: STYLE.hash, name: "Ballast hash", basedOn: "Normal", run: { font: "Courier New", size: 16 }, paragraph: { spacing: { after: 60 } } },
  ],
};
