/**
 * The positions file's column guide: each column's meaning, unit, allowed values and an example, shown on the Data
 * page and written into the served template (templates/uploads/positions.csv: header and one example row). Pure.
 */
import { ASSET_CLASS_ALIASES, ASSET_CLASS_LABELS, ASSET_CLASSES } from "./asset-classes";
import { EARLIER_RATE_TOLERANCE, MARKET_VALUE_TOLERANCE, type PositionField } from "./parse-positions";
import { POSITION_ATTRIBUTE_GUIDE } from "./position-attributes";

export interface ColumnGuide {
  field: PositionField;
  /** the header the template writes (other spellings are accepted, see POSITION_FIELDS aliases) */
  column: string;
  required: boolean;
  meaning: string;
  unit: string;
  allowed: string;
  example: string;
}

const pct = (x: number) => `${(x * 100).toLocaleString("en", { maximumFractionDigits: 1 })} %`;

/** Every column of the positions template, in the template's order. */
export const POSITION_COLUMN_GUIDE: readonly ColumnGuide[] = [
  { field: "asOf", column: "as_of", required: true, meaning: "The date the position is held at: the period end, or the last business day before it.", unit: "date", allowed: "a day of the period's month, not in the future; written as the date format chosen when uploading (yyyy-mm-dd unless another is chosen)", example: "2026-11-30" },
  { field: "book", column: "book", required: true, meaning: "The book or account the position sits in.", unit: "text", allowed: "up to 120 characters", example: "TRADING" },
  { field: "instrument", column: "instrument_id", required: true, meaning: "The instrument's code, the same as in the price history file.", unit: "text", allowed: "up to 64 characters; one row per book and instrument", example: "NMB-EQ-EXAMPLE" },
  { field: "instrumentName", column: "instrument_name", required: true, meaning: "The instrument's name as it should appear in the filing.", unit: "text", allowed: "up to 200 characters (kept as text, never evaluated)", example: "Example Holdings Inc." },
  { field: "assetClass", column: "asset_class", required: true, meaning: "The asset class the position is grouped and charged under.", unit: "one of the classes", allowed: `${ASSET_CLASSES.join(", ")} (or a spelling from the table below)`, example: "equity" },
  { field: "currency", column: "currency", required: true, meaning: "The currency the instrument is priced in. Positions in another currency than the firm's reporting currency need its exchange-rate series (instrument CCY followed by the reporting currency, e.g. USDEUR) in the price history.", unit: "ISO 4217 code", allowed: "a three-letter ISO 4217 code", example: "USD" },
  { field: "quantity", column: "quantity", required: true, meaning: "Units held; negative for a short position. Bonds in units of the quoted price (per 100 nominal when priced per 100).", unit: "units", allowed: "a number in the number format chosen when uploading", example: "1500" },
  { field: "price", column: "price", required: true, meaning: "The instrument's close on the as-of date.", unit: "the instrument's currency per unit", allowed: "a number above zero", example: "42.10" },
  {
    field: "marketValue", column: "market_value", required: false,
    meaning: `Optional. Leave it empty and Ballast computes quantity × price × the period-end exchange rate. When given, it is in the reporting currency unless market_value_currency says otherwise, and it must agree with quantity × price × rate within ${pct(MARKET_VALUE_TOLERANCE)} (or at least 1 unit): a larger difference refuses the row unless market_value_note says why. Against a rate from before the period end (the series is not loaded that far yet) differences up to ${pct(EARLIER_RATE_TOLERANCE)} are only warned about.`,
    unit: "reporting currency, or market_value_currency; signed", allowed: "a number, or empty", example: "63150.00",
  },
  { field: "deltaExposure", column: "delta_exposure", required: false, meaning: "Optional. The delta-equivalent exposure of a non-linear instrument (an option, a future); used instead of the market value as the exposure to the instrument's price.", unit: "reporting currency; signed", allowed: "a number, or empty", example: "" },
  { field: "marketValueCurrency", column: "market_value_currency", required: false, meaning: "Optional. The currency market_value is written in, when it is not the reporting currency. Ballast converts it at the period-end rate shown on the upload's preview.", unit: "ISO 4217 code", allowed: "a three-letter ISO 4217 code with an exchange-rate series, or empty (reporting currency)", example: "USD" },
  { field: "marketValueNote", column: "market_value_note", required: false, meaning: "Optional. Why a given market value differs from quantity × price × rate (accrued interest, a valuation adjustment), or where its rate came from when the currency has no exchange-rate series. The reason is kept with the upload's warnings.", unit: "text", allowed: "up to 500 characters", example: "" },
];

/** The asset classes with every spelling the parser accepts, for the Data page. */
export function assetClassTable(): { assetClass: string; label: string; spellings: readonly string[] }[] {
  return ASSET_CLASSES.map((cls) => ({ assetClass: cls, label: ASSET_CLASS_LABELS[cls], spellings: ASSET_CLASS_ALIASES[cls] }));
}

/** The served positions template: the guide's header and one example row (an invented position: 1,500 × 42.10 USD). */
export function positionsTemplateCsv(): string {
  const quote = (cell: string) => (/[",\n]/.test(cell) ? `"${cell.replace(/"/g, '""')}"` : cell);
  // the optional standardised columns follow (lib/uploads/position-attributes.ts)
  const columns = [...POSITION_COLUMN_GUIDE, ...POSITION_ATTRIBUTE_GUIDE];
  const header = columns.map((g) => g.column).join(",");
  const example = columns.map((g) => quote(g.example)).join(",");
  return `${header}\n${example}\n`;
}
