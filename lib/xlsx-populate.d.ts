// xlsx-populate publishes no types; this covers the part Ballast uses.
declare module "xlsx-populate" {
  interface Cell {
    value(): unknown;
    value(value: unknown): Cell;
    style(name: string): unknown;
    style(name: string, value: unknown): Cell;
    style(styles: Record<string, unknown>): Cell;
    formula(): string | undefined;
    address(): string;
    rowNumber(): number;
    columnNumber(): number;
  }
  interface Range {
    value(): unknown[][];
    value(values: unknown[][]): Range;
    style(name: string, value: unknown): Range;
    style(styles: Record<string, unknown>): Range;
    cells(): Cell[][];
  }
  interface Column {
    width(): number | undefined;
    width(width: number): Column;
  }
  interface Row {
    cell(column: number | string): Cell;
    height(height: number): Row;
  }
  interface Sheet {
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
    delete(): Workbook;
  }
  interface Workbook {
    sheets(): Sheet[];
    sheet(nameOrIndex: string | number): Sheet | undefined;
    addSheet(name: string, indexOrBefore?: number | string): Sheet;
    definedName(name: string): Cell | Range | Sheet | undefined;
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
