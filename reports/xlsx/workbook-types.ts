/**
 * The part of xlsx-populate's API the filing pack and its template script use, typed here (lib/xlsx-populate.d.ts
 * covers what the upload readers use, and its interfaces are not open to merging). Workbooks from
 * `XlsxPopulate.fromFileAsync` / `fromBlankAsync` / `fromDataAsync` give a `PackWorkbook` through `asPackWorkbook`.
 */
export type StyleValues = Record<string, unknown>;

export interface PackCell {
  value(): unknown;
  value(value: string | number | boolean | null | undefined): PackCell;
  style(name: string): unknown;
  style(name: string, value: unknown): PackCell;
  style(styles: StyleValues): PackCell;
  formula(): string | undefined;
  address(): string;
  rowNumber(): number;
  columnNumber(): number;
}

export interface PackColumn {
  width(): number | undefined;
  width(width: number): PackColumn;
  style(name: string): unknown;
  style(name: string, value: unknown): PackColumn;
  style(styles: StyleValues): PackColumn;
}

export interface PackRow {
  cell(column: number | string): PackCell;
  height(): number | undefined;
  height(height: number): PackRow;
}

export interface PaneOptions {
  state?: "split" | "frozen" | "frozenSplit";
  topLeftCell?: string;
  xSplit?: number;
  ySplit?: number;
  activePane?: string;
}

export interface PackRange {
  value(): unknown[][];
  cells(): PackCell[][];
  style(styles: StyleValues): PackRange;
  merged(): boolean;
  merged(merged: boolean): PackRange;
}

export interface PackSheet {
  name(): string;
  name(name: string): PackSheet;
  cell(row: number, column: number): PackCell;
  cell(address: string): PackCell;
  range(startRow: number, startColumn: number, endRow: number, endColumn: number): PackRange;
  usedRange(): PackRange | undefined;
  column(column: number | string): PackColumn;
  row(row: number): PackRow;
  freezePanes(topLeftCell: string): PackSheet;
  panes(): PaneOptions | undefined;
  active(): boolean;
  active(active: true): PackSheet;
  definedName(name: string, refersTo: string): PackSheet;
}

export interface PackWorkbook {
  sheets(): PackSheet[];
  sheet(nameOrIndex: string | number): PackSheet | undefined;
  addSheet(name: string): PackSheet;
  definedName(name: string): PackCell | undefined;
  definedName(name: string, refersTo: PackCell): PackWorkbook;
  outputAsync(): Promise<Buffer | Uint8Array>;
}

/** Whether a value is a workbook with the API above (xlsx-populate publishes no types; its objects are checked here). */
function isPackWorkbook(value: unknown): value is PackWorkbook {
  if (typeof value !== "object" || value === null) return false;
  const methods = ["sheets", "sheet", "addSheet", "definedName", "outputAsync"] as const;
  return methods.every((name) => typeof Reflect.get(value, name) === "function");
}

/** A workbook xlsx-populate opened, as a PackWorkbook. @throws when it is not one */
export function asPackWorkbook(value: unknown): PackWorkbook {
  if (!isPackWorkbook(value)) throw new TypeError("xlsx-populate returned something that is not a workbook");
  return value;
}
