/**
 * The spreadsheet pack's layout, shared by the template script (scripts/make-pack-template.ts, which writes
 * templates/filing-pack.xlsx from it) and the builder (./filing-pack.ts, which fills the template): sheet names,
 * the three top rows of every sheet (title, DRAFT marking or signature, caution), header rows, column widths,
 * number formats, and the defined names of the summary cells.
 */

/** Rows every sheet starts with. */
export const TITLE_ROW = 1;
export const MARKING_ROW = 2;
export const CAUTION_ROW = 3;
/** The header row of each sheet's table; data start on the row below. */
export const HEADER_ROW = 4;
export const FIRST_DATA_ROW = HEADER_ROW + 1;

export const SHEETS = ["Summary", "Positions", "Risk factors", "Correlation", "Contributions", "VaR history", "Backtest", "Data quality", "Method"] as const;
export type SheetName = (typeof SHEETS)[number];

export type ValueKind = "text" | "amount" | "integer" | "ratio" | "percent" | "confidence" | "pvalue" | "correlation" | "date" | "timestamp" | "stat";

/** Number formats by kind (Excel format codes; LibreOffice reads them the same). */
export const NUMBER_FORMATS: Record<Exclude<ValueKind, "text">, string> = {
  amount: "#,##0;-#,##0",
  integer: "0",
  ratio: "0.00",
  percent: "0.000%",
  confidence: "0.0%",
  pvalue: "0.0000",
  correlation: "0.00",
  stat: "0.000",
  date: "d mmm yyyy",
  timestamp: "yyyy-mm-dd hh:mm",
};

export const XLSX_COLOURS = {
  ink: "1C2733",
  soft: "3D4A57",
  muted: "6B7682",
  line: "D8D3C7",
  headerFill: "EFECE4",
  alert: "A2332B",
  ok: "2F6B3F",
  caution: "8A5A00",
  cautionFill: "F6ECD4",
};

/** Every styled cell names its font: a style without one makes some programs fall back to a serif face. */
export const BASE_FONT = { fontFamily: "Arial", fontSize: 10 } as const;

export const HEADER_STYLE = {
  ...BASE_FONT,
  bold: true,
  fontColor: XLSX_COLOURS.soft,
  fill: XLSX_COLOURS.headerFill,
  wrapText: true,
  verticalAlignment: "top",
  bottomBorder: true,
  bottomBorderColor: XLSX_COLOURS.line,
} as const;
export const TITLE_STYLE = { ...BASE_FONT, bold: true, fontSize: 14, fontColor: XLSX_COLOURS.ink } as const;
export const DRAFT_STYLE = { ...BASE_FONT, bold: true, fontSize: 11, fontColor: XLSX_COLOURS.alert } as const;
export const SIGNED_STYLE = { ...BASE_FONT, bold: true, fontSize: 11, fontColor: XLSX_COLOURS.ok } as const;
export const CAUTION_STYLE = { ...BASE_FONT, italic: true, fontColor: XLSX_COLOURS.caution, fill: XLSX_COLOURS.cautionFill, wrapText: true, verticalAlignment: "top" } as const;

export interface ColumnSpec {
  /** header text; `{ccy}` is replaced by the reporting currency, `{h}` by the horizon in days */
  header: string;
  kind: ValueKind;
  width: number;
}

/** Fixed columns per sheet (sheets with columns that depend on the run add theirs after these). */
export const COLUMNS: Record<SheetName, ColumnSpec[]> = {
  Summary: [
    { header: "Item", kind: "text", width: 44 },
    { header: "Value", kind: "text", width: 24 },
    { header: "Unit", kind: "text", width: 15 },
  ],
  Positions: [
    { header: "Instrument", kind: "text", width: 22 },
    { header: "Asset class", kind: "text", width: 22 },
    { header: "Currency", kind: "text", width: 10 },
    { header: "Market value ({ccy})", kind: "amount", width: 16 },
    { header: "Exposure ({ccy})", kind: "amount", width: 16 },
    { header: "VaR contribution, 1 day ({ccy})", kind: "amount", width: 18 },
    { header: "In the figures", kind: "text", width: 12 },
    { header: "Note", kind: "text", width: 50 },
  ],
  "Risk factors": [
    { header: "Factor", kind: "text", width: 20 },
    { header: "Kind", kind: "text", width: 14 },
    { header: "Exposure ({ccy})", kind: "amount", width: 16 },
  ],
  Correlation: [{ header: "Factor", kind: "text", width: 20 }],
  Contributions: [
    { header: "Confidence", kind: "confidence", width: 11 },
    { header: "By", kind: "text", width: 12 },
    { header: "Name", kind: "text", width: 22 },
    { header: "Asset class", kind: "text", width: 22 },
    { header: "Currency", kind: "text", width: 10 },
    { header: "Market value ({ccy})", kind: "amount", width: 16 },
    { header: "Component VaR, 1 day ({ccy})", kind: "amount", width: 16 },
    { header: "Component ES, 1 day ({ccy})", kind: "amount", width: 16 },
    { header: "Component VaR, {h} days ({ccy})", kind: "amount", width: 16 },
    { header: "Component ES, {h} days ({ccy})", kind: "amount", width: 16 },
    { header: "Share of VaR", kind: "percent", width: 12 },
    { header: "Stand-alone VaR, 1 day ({ccy})", kind: "amount", width: 16 },
    { header: "Stand-alone VaR, {h} days ({ccy})", kind: "amount", width: 16 },
  ],
  "VaR history": [{ header: "Data to", kind: "date", width: 13 }],
  Backtest: [
    { header: "Date", kind: "date", width: 13 },
    { header: "P&L ({ccy})", kind: "amount", width: 16 },
    { header: "VaR, 1 day ({ccy})", kind: "amount", width: 16 },
    { header: "Exception", kind: "text", width: 10 },
    { header: "Loss beyond VaR ({ccy})", kind: "amount", width: 16 },
    { header: "Explanation", kind: "text", width: 60 },
  ],
  "Data quality": [
    { header: "Severity", kind: "text", width: 10 },
    { header: "Check", kind: "text", width: 44 },
    { header: "Instrument", kind: "text", width: 20 },
    { header: "Finding", kind: "text", width: 80 },
    { header: "Dates", kind: "text", width: 30 },
  ],
  Method: [
    { header: "Topic", kind: "text", width: 30 },
    { header: "Text", kind: "text", width: 110 },
  ],
};

/** Frozen panes per sheet: the top-left cell of the scrolling part. */
export const FREEZE: Record<SheetName, string> = {
  Summary: `A${FIRST_DATA_ROW}`,
  Positions: `B${FIRST_DATA_ROW}`,
  "Risk factors": `B${FIRST_DATA_ROW}`,
  Correlation: `B${FIRST_DATA_ROW}`,
  Contributions: `A${FIRST_DATA_ROW}`,
  "VaR history": `B${FIRST_DATA_ROW}`,
  Backtest: `B${FIRST_DATA_ROW}`,
  "Data quality": `A${FIRST_DATA_ROW}`,
  Method: `A${FIRST_DATA_ROW}`,
};

/** Width of the columns a run adds (estimators, confidences, correlation factors). */
export const DYNAMIC_COLUMN_WIDTH = 16;

export interface SummaryItem {
  /** the workbook's defined name for the value cell */
  name: string;
  label: string;
  kind: ValueKind;
  /** "ccy" for the reporting currency */
  unit: string;
}

/** The Summary sheet's items, one per row from FIRST_DATA_ROW, the value in column B under a defined name. */
export const SUMMARY_ITEMS: SummaryItem[] = [
  { name: "firm_name", label: "Firm", kind: "text", unit: "" },
  { name: "reporting_currency", label: "Reporting currency", kind: "text", unit: "" },
  { name: "regulator", label: "Regulator", kind: "text", unit: "" },
  { name: "period_end", label: "Reporting period ends", kind: "date", unit: "" },
  { name: "filing_deadline", label: "Filing deadline", kind: "date", unit: "" },
  { name: "filing_version", label: "Filing version", kind: "integer", unit: "" },
  { name: "filing_status", label: "Status", kind: "text", unit: "" },
  { name: "prepared_by", label: "Prepared by", kind: "text", unit: "" },
  { name: "submitted_by", label: "Submitted for review by", kind: "text", unit: "" },
  { name: "figures_as_of", label: "Figures as of", kind: "date", unit: "" },
  { name: "primary_method", label: "Primary VaR method", kind: "text", unit: "" },
  { name: "filed_capital_regime", label: "Capital filed: which figure", kind: "text", unit: "" },
  { name: "filed_capital", label: "Capital filed", kind: "amount", unit: "ccy" },
  { name: "filed_capital_rwa", label: "Capital filed: risk-weighted-asset equivalent (× 12.5)", kind: "amount", unit: "ccy" },
  { name: "comparison_capital_regime", label: "Comparison, not filed: which figure", kind: "text", unit: "" },
  { name: "comparison_capital", label: "Comparison, not filed", kind: "amount", unit: "ccy" },
  { name: "capital", label: "Capital, internal models (VaR based)", kind: "amount", unit: "ccy" },
  { name: "capital_confidence", label: "Capital: VaR confidence", kind: "confidence", unit: "" },
  { name: "capital_horizon_days", label: "Capital: VaR horizon", kind: "integer", unit: "days" },
  { name: "averaging_days", label: "Capital: averaging window", kind: "integer", unit: "days" },
  { name: "var_last", label: "Latest VaR, VaR(t−1)", kind: "amount", unit: "ccy" },
  { name: "var_average", label: "Average VaR over the window", kind: "amount", unit: "ccy" },
  { name: "multiplier_base", label: "Multiplier base", kind: "ratio", unit: "" },
  { name: "plus_factor", label: "Backtest plus factor", kind: "ratio", unit: "" },
  { name: "multiplier", label: "Multiplier m_c", kind: "ratio", unit: "" },
  { name: "var_term", label: "VaR term", kind: "amount", unit: "ccy" },
  { name: "svar_last", label: "Latest stressed VaR, sVaR(t−1)", kind: "amount", unit: "ccy" },
  { name: "svar_average", label: "Average stressed VaR over the window", kind: "amount", unit: "ccy" },
  { name: "svar_multiplier", label: "Multiplier m_s", kind: "ratio", unit: "" },
  { name: "svar_term", label: "Stressed VaR term", kind: "amount", unit: "ccy" },
  { name: "stress_window_start", label: "Stress window starts", kind: "date", unit: "" },
  { name: "stress_window_end", label: "Stress window ends", kind: "date", unit: "" },
  { name: "backtest_days", label: "Backtest days", kind: "integer", unit: "days" },
  { name: "backtest_exceptions", label: "Backtest exceptions", kind: "integer", unit: "" },
  { name: "backtest_expected", label: "Exceptions expected", kind: "ratio", unit: "" },
  { name: "backtest_zone", label: "Backtest zone", kind: "text", unit: "" },
  { name: "kupiec_lr", label: "Kupiec likelihood ratio", kind: "stat", unit: "" },
  { name: "kupiec_p", label: "Kupiec p-value", kind: "pvalue", unit: "" },
  { name: "christoffersen_ind_lr", label: "Christoffersen independence ratio", kind: "stat", unit: "" },
  { name: "christoffersen_ind_p", label: "Christoffersen independence p-value", kind: "pvalue", unit: "" },
  { name: "christoffersen_cc_lr", label: "Christoffersen conditional coverage ratio", kind: "stat", unit: "" },
  { name: "christoffersen_cc_p", label: "Christoffersen conditional coverage p-value", kind: "pvalue", unit: "" },
  { name: "method_version", label: "Method statement version", kind: "integer", unit: "" },
  { name: "run_id", label: "Run", kind: "text", unit: "" },
  { name: "engine_version", label: "Engine version", kind: "text", unit: "" },
  { name: "signed_by", label: "Signed by", kind: "text", unit: "" },
  { name: "licence_reference", label: "Signer's licence or registration reference", kind: "text", unit: "" },
  { name: "signed_at", label: "Signed at (UTC)", kind: "timestamp", unit: "" },
  { name: "content_hash", label: "Content hash (SHA-256)", kind: "text", unit: "" },
];

/** Defined names of the three top cells of the Summary sheet. */
export const SUMMARY_TITLE_NAME = "pack_title";
export const SUMMARY_MARKING_NAME = "status_marking";
export const SUMMARY_CAUTION_NAME = "caution";

/** Where the VaR and ES table starts on the Summary sheet (a title row, then its header row). */
export const SUMMARY_VAR_TITLE_ROW = FIRST_DATA_ROW + SUMMARY_ITEMS.length + 1;
export const SUMMARY_VAR_HEADER_ROW = SUMMARY_VAR_TITLE_ROW + 1;
/** Columns A–F; A–C share the widths of the items above. */
export const SUMMARY_VAR_COLUMNS: ColumnSpec[] = [
  { header: "Figure", kind: "text", width: 44 },
  { header: "Confidence", kind: "confidence", width: 24 },
  { header: "VaR, 1 day ({ccy})", kind: "amount", width: 15 },
  { header: "ES, 1 day ({ccy})", kind: "amount", width: 15 },
  { header: "VaR, {h} days ({ccy})", kind: "amount", width: 15 },
  { header: "ES, {h} days ({ccy})", kind: "amount", width: 15 },
];

/** A header with the currency and horizon filled in. */
export function headerText(spec: ColumnSpec, currency: string, horizonDays: number): string {
  return spec.header.replace(/\{ccy\}/g, currency).replace(/\{h\}/g, String(horizonDays));
}
