import { describe, expect, it } from "vitest";
import XlsxPopulate from "xlsx-populate";
import { readTables, sniffType, readCsvText, excelSerialToIso } from "@/lib/uploads/read-table";
import { parsePositions, chooseTable, POSITION_FIELDS, MAX_POSITION_ROWS } from "@/lib/uploads/parse-positions";
import { parsePrices } from "@/lib/uploads/parse-prices";
import { readNumber, readDate } from "@/lib/uploads/cells";
import { checkZipProportions } from "@/lib/uploads/zip-guard";
import { FileRejected, type ReadOptions } from "@/lib/uploads/types";
import { outOfProportionZip } from "../helpers/lying-zip";

const HEADER = "as_of,book,instrument_id,instrument_name,asset_class,currency,quantity,price,market_value,delta_exposure";
const plain: ReadOptions = { numberFormat: "plain" };
const context = { today: "2026-12-01", reportingCurrency: "EUR", periodEnd: "2026-11-30", fxToReporting: { USD: 0.92 } };
const bytes = (text: string) => new TextEncoder().encode(text);

async function positionsFrom(text: string, options = plain) {
  const [table] = await readTables(bytes(text));
  return parsePositions(table, options, context);
}

describe("reading files", () => {
  it("refuses an empty file", async () => {
    await expect(readTables(new Uint8Array())).rejects.toThrow("The file is empty.");
    await expect(readTables(bytes("  \n\n"))).rejects.toThrow("The file is empty.");
  });

  it("refuses a PDF renamed .csv, by its bytes", () => {
    expect(() => sniffType(bytes("%PDF-1.7\n%âãÏÓ\n1 0 obj"))).toThrow(FileRejected);
    expect(() => sniffType(bytes("%PDF-1.7"))).toThrow("This is a PDF document, not a CSV or XLSX file.");
  });

  it("refuses other binary content", () => {
    expect(() => sniffType(new Uint8Array([0x00, 0x01, 0x02, 0x41]))).toThrow("binary");
  });

  it("reads UTF-8 with a BOM, semicolons and quoted fields", () => {
    const table = readCsvText('\uFEFFdate;instrument;close\n2026-11-02;"ALPHA; ""A""";101,5\n');
    expect(table.header).toEqual(["date", "instrument", "close"]);
    expect(table.rows[0]).toEqual(["2026-11-02", 'ALPHA; "A"', "101,5"]);
  });

  it("converts Excel date serials (serial 25569 is 1970-01-01; 46356 is 2026-11-30)", () => {
    // Excel counts days from 1900-01-00 with the 1900 leap-day quirk; DATE(2026,11,30) = 46356 (common practice, no source).
    expect(excelSerialToIso(25569)).toBe("1970-01-01");
    expect(excelSerialToIso(46356)).toBe("2026-11-30");
  });

  it("reads numbers only in the format the person chose", () => {
    expect(readNumber("1,234.56", "plain")).toEqual({ error: expect.stringContaining("comma") });
    expect(readNumber("1,234.56", "comma-thousands")).toEqual({ value: 1234.56 });
    expect(readNumber("1.234,56", "dot-thousands")).toEqual({ value: 1234.56 });
    expect(readNumber("12O0", "plain")).toEqual({ error: '"12O0" is not a number' });
    expect(readNumber("-3.5e2", "plain")).toEqual({ value: -350 });
  });

  it("refuses a date that does not exist", () => {
    expect(readDate("2026-02-30")).toEqual({ error: "2026-02-30 does not exist" });
    expect(readDate("2028-02-29")).toEqual({ value: "2028-02-29" });
    expect(readDate("30/11/2026")).toEqual({ error: '"30/11/2026" is not a date as yyyy-mm-dd' });
  });
});

describe("positions", () => {
  const good = `${HEADER}\n2026-11-30,TRADING,EQ-ALDER,Alder Robotics AG,equity,EUR,100,25.5,2550,\n2026-11-30,TRADING,EQ-BRISK,Brisk Foods Inc,equity,USD,-200,10,-1840,\n`;

  it("reads a good file with totals by asset class and currency", async () => {
    const parsed = await positionsFrom(good);
    expect(parsed.problems).toEqual([]);
    expect(parsed.rows).toHaveLength(2);
    expect(parsed.totals).toMatchObject({ positions: 2, grossMarketValue: 4390, netMarketValue: 710 });
    expect(parsed.totals.byCurrency.map((g) => g.key)).toEqual(["EUR", "USD"]);
  });

  it("says a header-only file has no rows", async () => {
    const parsed = await positionsFrom(`${HEADER}\n`);
    expect(parsed.problems[0].message).toBe("The file has a header but no position rows.");
  });

  it("names a missing required column", async () => {
    const parsed = await positionsFrom("as_of,book,instrument_id,instrument_name,asset_class,quantity,price\n2026-11-30,T,X,X,equity,1,1\n");
    expect(parsed.missingColumns).toEqual(["currency"]);
    expect(parsed.problems[0]).toMatchObject({ row: 1, severity: "error", message: expect.stringContaining("Missing required column: currency") });
  });

  it("matches column names case- and space-insensitively, and by an explicit mapping", async () => {
    const text = "As Of,Book,Instrument ID,Instrument Name,Asset Class,Ccy,Qty,Unit Price,Market Value\n2026-11-30,T,EQ-A,Alpha,Equity,EUR,2,3,6\n";
    expect((await positionsFrom(text)).problems).toEqual([]);
    const odd = "When,Book,Instrument ID,Instrument Name,Asset Class,Ccy,Qty,Unit Price\n2026-11-30,T,EQ-A,Alpha,Equity,EUR,2,3\n";
    expect((await positionsFrom(odd)).missingColumns).toEqual(["asOf"]);
    expect((await positionsFrom(odd, { numberFormat: "plain", mapping: { asOf: "When" } })).problems).toEqual([]);
  });

  it("lists every bad row with its row number, column and reason", async () => {
    const text = [
      HEADER,
      "2026-11-30,T,EQ-A,Alpha,equity,EUX,1,1,1,", // row 2: unknown currency
      "2026-11-30,T,EQ-B,Beta,equity,EUR,12O0,1,,", // row 3: non-numeric quantity
      "2026-02-30,T,EQ-C,Gamma,equity,EUR,1,1,1,", // row 4: a date that does not exist
      "2027-01-15,T,EQ-D,Delta,equity,EUR,1,1,1,", // row 5: a date in the future
      "2026-11-30,T,EQ-E,Epsilon,equity,EUR,1,0,0,", // row 6: price of zero
      "2026-11-30,T,EQ-F,Zeta,equity,EUR,1,-4,-4,", // row 7: negative price
      "2026-11-30,T,EQ-G,Eta,crypto,EUR,1,1,1,", // row 8: unknown asset class
      "2026-11-30,T,EQ-H,Theta,equity,EUR,1,2,2,", // row 9: good
      "2026-11-30,T,EQ-H,Theta again,equity,EUR,1,2,2,", // row 10: duplicate of row 9
    ].join("\n");
    const parsed = await positionsFrom(text);
    const byRow = new Map(parsed.problems.map((p) => [p.row, p]));
    expect(byRow.get(2)).toMatchObject({ field: "currency", message: 'currency "EUX" is not an ISO 4217 currency code' });
    expect(byRow.get(3)).toMatchObject({ field: "quantity", message: 'quantity "12O0" is not a number' });
    expect(byRow.get(4)).toMatchObject({ field: "as-of date", message: "as-of date 2026-02-30 does not exist" });
    expect(byRow.get(5)).toMatchObject({ field: "as-of date", message: "as-of date 2027-01-15 is in the future" });
    expect(byRow.get(6)).toMatchObject({ field: "price", message: "price must be above zero" });
    expect(byRow.get(7)).toMatchObject({ field: "price", message: "price must be above zero" });
    expect(byRow.get(8)?.message).toContain('"crypto" is not an asset class');
    expect(byRow.get(10)?.message).toContain("duplicate position");
    expect(byRow.get(10)?.message).toContain("row 9");
    expect(parsed.rows.map((r) => r.row)).toEqual([9]);
  });

  it("keeps formula-looking text as text", async () => {
    const text = `${HEADER}\n2026-11-30,+BOOK,EQ-A,"=HYPERLINK(""http://example.invalid"",""x"")",equity,EUR,1,1,1,\n2026-11-30,@desk,-EQ-B,-minus,equity,EUR,1,1,1,\n`;
    const parsed = await positionsFrom(text);
    expect(parsed.problems).toEqual([]);
    expect(parsed.rows[0].instrumentName).toBe('=HYPERLINK("http://example.invalid","x")');
    expect(parsed.rows[0].book).toBe("+BOOK");
    expect(parsed.rows[1]).toMatchObject({ book: "@desk", instrument: "-EQ-B", instrumentName: "-minus" });
  });

  it("cross-checks a given market value and refuses the row when it differs beyond the tolerance", async () => {
    const parsed = await positionsFrom(`${HEADER}\n2026-11-30,T,EQ-A,Alpha,equity,USD,100,10,1000,\n`);
    expect(parsed.rows).toHaveLength(0);
    expect(parsed.problems).toEqual([expect.objectContaining({ row: 2, severity: "error", field: "market value", message: expect.stringContaining("920.00") })]);
  });

  it("refuses a foreign-currency position when there is no exchange-rate series", async () => {
    const parsed = await positionsFrom(`${HEADER}\n2026-11-30,T,EQ-A,Alpha,equity,NOK,100,10,,\n`);
    expect(parsed.problems[0]).toMatchObject({ row: 2, severity: "error", field: "currency", message: expect.stringContaining("no NOKEUR exchange-rate series") });
  });

  it("accepts a file of 200,000 rows, within the limit of 250,000", async () => {
    const lines = [HEADER];
    for (let i = 0; i < 200_000; i++) lines.push(`2026-11-30,B${i % 7},EQ-${i},Name ${i},equity,EUR,${(i % 50) + 1},12.5,${((i % 50) + 1) * 12.5},`);
    const parsed = await positionsFrom(lines.join("\n"));
    expect(parsed.problems).toEqual([]);
    expect(parsed.rows).toHaveLength(200_000);
    expect(MAX_POSITION_ROWS).toBe(250_000);
  });

  it("refuses a file over the row limit, naming the limit", async () => {
    const table = { header: HEADER.split(","), rows: new Array(MAX_POSITION_ROWS + 1).fill(["2026-11-30"]), source: "csv" };
    const parsed = parsePositions(table, plain, context);
    expect(parsed.problems[0].message).toContain("at most 250,000");
  });
});

describe("price history", () => {
  it("reads the long layout and the wide layout to the same points", async () => {
    const [long] = await readTables(bytes("date,instrument,close\n2026-11-02,alpha,10\n2026-11-02,USDEUR,0.92\n2026-11-03,ALPHA,10.5\n"));
    const [wide] = await readTables(bytes("date,ALPHA,USDEUR\n2026-11-02,10,0.92\n2026-11-03,10.5,\n"));
    const a = parsePrices(long, plain, { today: "2026-12-01" });
    const b = parsePrices(wide, plain, { today: "2026-12-01" });
    expect(a.layout).toBe("long");
    expect(b.layout).toBe("wide");
    const key = (p: { date: string; instrument: string; close: number }) => `${p.instrument}@${p.date}=${p.close}`;
    expect(a.points.map(key).sort()).toEqual(b.points.map(key).sort());
    expect(a.summary).toMatchObject({ points: 3, instruments: 2, firstDate: "2026-11-02", lastDate: "2026-11-03" });
  });

  it("refuses zero and negative closes, future dates and duplicate dates, row by row", async () => {
    const [table] = await readTables(bytes("date,instrument,close\n2026-11-02,A,0\n2026-11-03,A,-1\n2027-01-04,A,5\n2026-11-04,A,5\n2026-11-04,A,6\n"));
    const parsed = parsePrices(table, plain, { today: "2026-12-01" });
    expect(parsed.problems.map((p) => [p.row, p.message])).toEqual([
      [2, "close 0 must be above zero"],
      [3, "close -1 must be above zero"],
      [4, "date 2027-01-04 is in the future"],
      [6, "duplicate date: A on 2026-11-04 already appears on row 5"],
    ]);
    expect(parsed.points).toHaveLength(1);
  });

  it("reads decimal commas only when asked", async () => {
    const [table] = await readTables(bytes("date;instrument;close\n2026-11-02;A;1.234,5\n"));
    expect(parsePrices(table, plain, { today: "2026-12-01" }).problems[0].message).toContain("not a plain number");
    expect(parsePrices(table, { numberFormat: "dot-thousands" }, { today: "2026-12-01" }).points[0].close).toBe(1234.5);
  });
});

describe("workbooks", () => {
  async function workbook(sheets: Record<string, unknown[][]>): Promise<Uint8Array> {
    const wb = await XlsxPopulate.fromBlankAsync();
    const names = Object.keys(sheets);
    wb.sheet(0)!.name(names[0]);
    for (const name of names.slice(1)) wb.addSheet(name);
    for (const [name, values] of Object.entries(sheets)) wb.sheet(name)!.cell("A1").value(values as never);
    return new Uint8Array((await wb.outputAsync()) as Buffer);
  }

  it("finds the sheet with the positions columns and reads dates stored as serials", async () => {
    const data = await workbook({
      Notes: [["Prepared by the desk"]],
      Book: [HEADER.split(","), [46356, "T", "EQ-A", "Alpha", "equity", "EUR", 3, 4, 12, null]],
    });
    const tables = await readTables(data);
    const table = chooseTable(tables, POSITION_FIELDS)!;
    expect(table.source).toBe('sheet "Book"');
    const parsed = parsePositions(table, plain, context);
    expect(parsed.problems).toEqual([]);
    expect(parsed.rows[0]).toMatchObject({ asOf: "2026-11-30", quantity: 3, marketValue: 12 });
  });

  it("has no table for a workbook without a matching sheet", async () => {
    const tables = await readTables(await workbook({ Summary: [["Quarter", "Result"], ["Q3", 5]] }));
    expect(chooseTable(tables, POSITION_FIELDS)).toBeNull();
  });

  it("refuses a zip whose declared expansion is out of proportion", () => {
    // one entry declaring 1 GB uncompressed inside a 100-byte archive
    const zip = outOfProportionZip();
    expect(() => checkZipProportions(zip)).toThrow(/out of proportion/);
  });
});
