/** Shapes shared by the upload parsers: problems found, and the number format a person chose. */

export type Severity = "error" | "warning";

/** One problem in an uploaded file: the file row (header = row 1), the column, and what is wrong. */
export interface Problem {
  row: number | null;
  field: string | null;
  message: string;
  severity: Severity;
}

/** How numbers are written in the file. Thousands separators and decimal commas are read only when chosen. */
export type NumberFormat = "plain" | "comma-thousands" | "dot-thousands";

export const NUMBER_FORMAT_LABELS: Record<NumberFormat, string> = {
  plain: "Plain: 1234.56",
  "comma-thousands": "Comma thousands: 1,234.56",
  "dot-thousands": "Dot thousands, decimal comma: 1.234,56",
};

/** How dates are written in the file's text cells (workbook dates and Excel serials are read whatever is chosen). */
export type DateFormat = "iso" | "day-month-year" | "month-day-year";

export const DATE_FORMAT_LABELS: Record<DateFormat, string> = {
  iso: "Year first: 2026-11-30",
  "day-month-year": "Day first: 30/11/2026",
  "month-day-year": "Month first: 11/30/2026",
};

/** Options a person chose for reading one file. */
export interface ReadOptions {
  numberFormat: NumberFormat;
  /** how text dates are written; ISO yyyy-mm-dd when not chosen */
  dateFormat?: DateFormat;
  /** required field → the file's column header, when the names differ */
  mapping?: Record<string, string>;
}

/**
 * Told how far a parser has got: `done` of `total` rows checked (for a wide price file, prices). Called every
 * PROGRESS_EVERY rows and once at the end; a parse that refuses the file before its rows is not reported.
 */
export type ParseProgress = (done: number, total: number) => void;

/** How many rows a parser checks between two progress reports. */
export const PROGRESS_EVERY = 10_000;

/** A table read from a CSV or a workbook sheet: header cells and data rows of raw cell values. */
export interface RawTable {
  header: string[];
  rows: unknown[][];
  /** "csv" or the workbook sheet the rows came from */
  source: string;
}

/** An upload refused as a whole (wrong type, empty, too large), before any row is read. */
export class FileRejected extends Error {}
