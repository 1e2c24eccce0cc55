// xlsx-populate publishes no types; this covers the part Ballast uses (the upload readers, the filing pack and its
// template script). reports/xlsx/workbook-types.ts gives these the filing pack's names.
declare module "xlsx-populate" {
  export type StyleValues = Record<string, unknown>;
  export interface Cell {
    value(): unknown;
    value(value: unknown): Cell;
    style(name: string): unknown;
    style(name: string, value: unknown): Cell;
    style(styles: StyleValues): Cell;
    formula(): string | undefined;
    address(): string;
    rowNumber(): number;
    columnNumber(): number;
  }
  export interface Range {
    value(): unknown[][];
    value(values: unknown[][]): Range;
    style(name: string, value: unknown): Range;
    style(styles: StyleValues): Range;
    cells(): Cell[][];
    merged(): boolean;
    merged(merged: boolean): Range;
  }
  export interface Column {
    width(): number | undefined;
    width(width: number): Column;
    style(name: string): unknown;
    style(name: string, value: unknown): Column;
    style(styles: StyleValues): Column;
  }
  export interface Row {
    cell(column: number | string): Cell;
    height(): number | undefined;
    height(height: number): Row;
  }
  export interface PaneOptions {
    state?: "split" | "frozen" | "frozenSplit";
    topLeftCell?: string;
    xSplit?: number;
    ySplit?: number;
    activePane?: string;
  }
  export interface Sheet {
    name(): string;
    name(name: string): Sheet;
    cell(address: string): Cell;
    cell(row: number, column: number): Cell;
    range(address: string): Range;
    range(startRow: number, startColumn: number, endRow: number, endColumn: number): Range;
    usedRange(): Range | undefined;
    column(column: number | string): Column;
    row(row: number): Row;
    freezePanes(columns: number, rows: number): Sheet;
    freezePanes(address: string): Sheet;
    panes(): PaneOptions | undefined;
    active(): boolean;
    active(active: true): Sheet;
    definedName(name: string, refersTo: string): Sheet;
    delete(): Workbook;
  }
  export interface Workbook {
    sheets(): Sheet[];
    sheet(nameOrIndex: string | number): Sheet | undefined;
    addSheet(name: string, indexOrBefore?: number | string): Sheet;
    definedName(name: string): Cell | undefined; // Ballast's workbooks name single cells only
    definedName(name: string, refersTo: Cell | Range | Sheet | string): Workbook;
    outputAsync(options?: { type?: string; password?: string }): Promise<Buffer | Uint8Array>;
  }
  const XlsxPopulate: {
    fromDataAsync(data: Buffer | ArrayBuffer | Uint8Array, options?: { password?: string }): Promise<Workbook>;
    fromFileAsync(path: string, options?: { password?: string }): Promise<Workbook>;
    fromBlankAsync(): Promise<Workbook>;
  };
  export default XlsxPopulate;
}
