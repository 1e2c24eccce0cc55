/**
 * Positions that cannot be misread: date formats, the period's dates, the one asset-class table, market values with
 * their currency, the cross-check as an error unless the row says why, exchange-rate series required, and the case
 * of a SEK book whose market values were given in SEK (it must give the right VaR or a clear error, never 5× it).
 */
import { describe, expect, it } from "vitest";
import { readCsvText } from "@/lib/uploads/read-table";
import { readDate } from "@/lib/uploads/cells";
import { EARLIER_RATE_TOLERANCE, MARKET_VALUE_TOLERANCE, parsePositions, POSITION_FIELDS, type PositionParseContext } from "@/lib/uploads/parse-positions";
import { ASSET_CLASS_ALIASES, ASSET_CLASSES, parseAssetClass } from "@/lib/uploads/asset-classes";
import { POSITION_COLUMN_GUIDE, positionsTemplateCsv } from "@/lib/uploads/position-guide";
import { portfolioVar } from "@/lib/risk/portfolio/run-month-end";
import { mulberry32 } from "@/lib/risk/random";
import type { ReadOptions } from "@/lib/uploads/types";
import { readFileSync } from "node:fs";
import path from "node:path";

const HEADER = "as_of,book,instrument_id,instrument_name,asset_class,currency,quantity,price,market_value,delta_exposure";
const plain: ReadOptions = { numberFormat: "plain" };
const EUR_NOV: PositionParseContext = { today: "2026-12-01", reportingCurrency: "EUR", periodEnd: "2026-11-30", fxToReporting: { USD: 0.92 } };

function parse(text: string, options: ReadOptions = plain, context: PositionParseContext = EUR_NOV) {
  return parsePositions(readCsvText(text), options, context);
}

describe("date formats, chosen like number formats", () => {
  it("refuses 31/12/2026 as ISO with a hint, and reads it day first when chosen", () => {
    const december: PositionParseContext = { ...EUR_NOV, today: "2027-01-04", periodEnd: "2026-12-31" };
    const text = `${HEADER}\n31/12/2026,T,EQ-A,Alpha,equity,EUR,10,5,50,\n`;
    const iso = parse(text, plain, december);
    expect(iso.problems).toEqual([expect.objectContaining({ row: 2, severity: "error", field: "as-of date", message: expect.stringContaining("choose the date format") })]);
    const dayFirst = parse(text, { ...plain, dateFormat: "day-month-year" }, december);
    expect(dayFirst.problems).toEqual([]);
    expect(dayFirst.rows[0].asOf).toBe("2026-12-31");
  });

  it("reads month first, and says when a written date does not exist", () => {
    expect(readDate("12/31/2026", "month-day-year")).toEqual({ value: "2026-12-31" });
    expect(readDate("31.12.2026", "day-month-year")).toEqual({ value: "2026-12-31" });
    expect(readDate("31/02/2026", "day-month-year")).toEqual({ error: '"31/02/2026" does not exist as dd/mm/yyyy' });
    expect(readDate("12/31/2026", "day-month-year")).toEqual({ error: '"12/31/2026" does not exist as dd/mm/yyyy' });
    // workbook dates and Excel serials are read whatever the text format (46356 is 2026-11-30, common practice, no source)
    expect(readDate(46356, "day-month-year")).toEqual({ value: "2026-11-30" });
  });
});

describe("as-of dates outside the period", () => {
  it("refuses positions dated 30 November in the December period, naming the row", () => {
    const december: PositionParseContext = { ...EUR_NOV, today: "2026-12-31", periodEnd: "2026-12-31" };
    const parsed = parse(`${HEADER}\n2026-12-31,T,EQ-A,Alpha,equity,EUR,10,5,50,\n2026-11-30,T,EQ-B,Beta,equity,EUR,10,5,50,\n`, plain, december);
    expect(parsed.rows.map((r) => r.row)).toEqual([2]);
    expect(parsed.problems).toEqual([
      expect.objectContaining({ row: 3, severity: "error", field: "as-of date", message: "as-of date 2026-11-30 is outside the period 2026-12-01 to 2026-12-31: upload it to the period it belongs to" }),
    ]);
  });

  it("only warns about an earlier day of the same month (a period ending on a weekend)", () => {
    const october: PositionParseContext = { ...EUR_NOV, periodEnd: "2026-10-31" };
    const parsed = parse(`${HEADER}\n2026-10-30,T,EQ-A,Alpha,equity,EUR,10,5,50,\n`, plain, october);
    expect(parsed.rows).toHaveLength(1);
    expect(parsed.problems).toEqual([expect.objectContaining({ severity: "warning", field: "as-of date" })]);
  });
});

describe("asset classes from one table", () => {
  it("accepts bond as well as stock, and every spelling the table shows", () => {
    expect(parseAssetClass("bond")).toBe("corporate_bond");
    expect(parseAssetClass("Stock")).toBe("equity");
    for (const cls of ASSET_CLASSES) {
      expect(parseAssetClass(cls)).toBe(cls);
      for (const alias of ASSET_CLASS_ALIASES[cls]) expect(parseAssetClass(alias), alias).toBe(cls);
    }
    expect(parseAssetClass("crypto")).toBeNull();
  });
});

describe("market values", () => {
  it("converts a market value given with its currency at the rate, and lists the rate used", () => {
    const parsed = parse(`${HEADER},market_value_currency\n2026-11-30,T,EQ-US,Usonia,equity,USD,100,10,1000,,USD\n`);
    expect(parsed.problems).toEqual([]);
    expect(parsed.rows[0].marketValue).toBeCloseTo(920, 9); // 1,000 USD × 0.92 EUR per USD
    expect(parsed.rates).toEqual([{ currency: "USD", pair: "USDEUR", rate: 0.92, date: null, periodEnd: true }]);
  });

  it("computes the market value from quantity × price × rate when it is left empty", () => {
    const parsed = parse(`${HEADER}\n2026-11-30,T,EQ-US,Usonia,equity,USD,-100,10,,\n`);
    expect(parsed.rows[0]).toMatchObject({ marketValue: -920, marketValueGiven: false });
  });

  it(`refuses a value that disagrees beyond ${MARKET_VALUE_TOLERANCE * 100} % unless the row says why`, () => {
    const refused = parse(`${HEADER}\n2026-11-30,T,EQ-A,Alpha,equity,EUR,100,10,1100,\n`);
    expect(refused.rows).toHaveLength(0);
    expect(refused.problems).toEqual([expect.objectContaining({ row: 2, severity: "error", field: "market value", message: expect.stringContaining("market_value_note") })]);
    const explained = parse(`${HEADER},market_value_note\n2026-11-30,T,EQ-A,Alpha,equity,EUR,100,10,1100,,Dirty price: accrued interest included\n`);
    expect(explained.rows[0].marketValue).toBe(1100);
    expect(explained.problems).toEqual([expect.objectContaining({ severity: "warning", message: expect.stringContaining("because: Dirty price: accrued interest included") })]);
    // within the tolerance (0.4 %) nothing is said
    expect(parse(`${HEADER}\n2026-11-30,T,EQ-A,Alpha,equity,EUR,100,10,1004,\n`).problems).toEqual([]);
  });

  it(`against a rate from before the period end, warns up to ${EARLIER_RATE_TOLERANCE * 100} % and refuses beyond`, () => {
    const early: PositionParseContext = { ...EUR_NOV, fxDates: { USD: "2026-11-20" } };
    const moved = parse(`${HEADER}\n2026-11-30,T,EQ-US,Usonia,equity,USD,100,10,940,\n`, plain, early);
    expect(moved.problems).toEqual([expect.objectContaining({ severity: "warning", message: expect.stringContaining("2026-11-20, before the period end") })]);
    expect(moved.rates?.[0]).toMatchObject({ date: "2026-11-20", periodEnd: false });
    const wrong = parse(`${HEADER}\n2026-11-30,T,EQ-US,Usonia,equity,USD,100,10,1000,\n`, plain, { ...early, fxToReporting: { USD: 0.5 } });
    expect(wrong.problems[0]).toMatchObject({ severity: "error" });
    // 8 % off is within the band, but a value equal to quantity × price in USD is refused as written in USD
    const inUsd = parse(`${HEADER}\n2026-11-30,T,EQ-US,Usonia,equity,USD,100,10,1000,\n`, plain, early);
    expect(inUsd.problems[0]).toMatchObject({ severity: "error", message: expect.stringContaining("looks like a value in USD") });
  });

  it("refuses a foreign-currency position without an exchange-rate series, unless valued in the reporting currency with a reason", () => {
    const refused = parse(`${HEADER}\n2026-11-30,T,EQ-NO,Nordfjell,equity,NOK,100,10,85,\n`);
    expect(refused.problems).toEqual([expect.objectContaining({ row: 2, severity: "error", field: "currency", message: expect.stringContaining("no NOKEUR exchange-rate series") })]);
    const explained = parse(`${HEADER},market_value_note\n2026-11-30,T,EQ-NO,Nordfjell,equity,NOK,100,10,85,,Valued at the custodian's rate\n`);
    expect(explained.rows).toHaveLength(1);
    expect(explained.problems).toEqual([expect.objectContaining({ severity: "warning", message: expect.stringContaining("currency risk out") })]);
  });
});

describe("a SEK book in a EUR firm", () => {
  // Invented book: two Swedish shares; invented rate 0.087 EUR per SEK.
  const SEK: PositionParseContext = { today: "2026-12-01", reportingCurrency: "EUR", periodEnd: "2026-11-30", fxToReporting: { SEK: 0.087 }, fxDates: { SEK: "2026-11-30" } };
  const rows = [
    ["2026-11-30", "TRADING", "EQ-SKOG", "Skogsvik Timber AB", "equity", "SEK", "12000", "245.5"],
    ["2026-11-30", "TRADING", "EQ-HAMN", "Hamnvik Shipping AB", "equity", "SEK", "-4000", "118.2"],
  ];
  const sekValue = (r: string[]) => (Number(r[6]) * Number(r[7])).toFixed(2);

  it("market values written in SEK without saying so are refused row by row, with the fix named", () => {
    const parsed = parse([HEADER, ...rows.map((r) => [...r, sekValue(r), ""].join(","))].join("\n"), plain, SEK);
    expect(parsed.rows).toHaveLength(0);
    expect(parsed.problems.map((p) => [p.row, p.severity])).toEqual([[2, "error"], [3, "error"]]);
    expect(parsed.problems[0].message).toContain("looks like a value in SEK: add a market_value_currency column");
  });

  it("with no SEKEUR series the file is refused before confirmation", () => {
    const parsed = parse([HEADER, ...rows.map((r) => [...r, "", ""].join(","))].join("\n"), plain, { ...SEK, fxToReporting: {}, fxDates: {} });
    expect(parsed.rows).toHaveLength(0);
    expect(parsed.problems.every((p) => p.severity === "error" && p.message.includes("no SEKEUR exchange-rate series"))).toBe(true);
  });

  it("given with market_value_currency SEK, the VaR equals that of the same book valued in EUR (not 1/0.087 ≈ 11.5 × it)", () => {
    const inSek = parse([`${HEADER},market_value_currency`, ...rows.map((r) => [...r, sekValue(r), "", "SEK"].join(","))].join("\n"), plain, SEK);
    const computed = parse([HEADER, ...rows.map((r) => [...r, "", ""].join(","))].join("\n"), plain, SEK);
    expect(inSek.problems).toEqual([]);
    expect(inSek.rows.map((r) => r.marketValue)).toEqual(computed.rows.map((r) => r.marketValue));
    expect(inSek.rows[0].marketValue).toBeCloseTo(12000 * 245.5 * 0.087, 6);

    // deterministic synthetic returns (fixed seed) for the two shares and the SEKEUR rate
    const random = mulberry32(20261130);
    const days = 300;
    const dates = Array.from({ length: days }, (_, i) => new Date(Date.UTC(2025, 8, 1) + i * 86_400_000).toISOString().slice(0, 10));
    const series = () => Float64Array.from({ length: days }, () => (random() - 0.5) * 0.04);
    const returns = { dates, factors: { "EQ-SKOG": series(), "EQ-HAMN": series(), SEKEUR: series() } };
    const varOf = (book: typeof inSek.rows) =>
      portfolioVar({
        positions: book.map((r) => ({ instrument: r.instrument, marketValue: r.marketValue, currency: r.currency, assetClass: r.assetClass })),
        returns,
        reportingCurrency: "EUR",
        method: { methods: ["parametric"], covariance: "equal", confidences: [0.99], stressWindow: undefined },
      }).methods[0].byConfidence[0].oneDay.var;
    const misread = inSek.rows.map((r, i) => ({ ...r, marketValue: Number(sekValue(rows[i])) })); // what taking SEK as EUR would give
    const right = varOf(inSek.rows);
    expect(right).toBeGreaterThan(0);
    expect(right).toBeCloseTo(varOf(computed.rows), 6);
    // parametric VaR is linear in the exposures: the misread book is 1/0.087 times as large
    expect(varOf(misread) / right).toBeCloseTo(1 / 0.087, 6);
  });
});

describe("the column guide", () => {
  it("explains every core column the parser reads, with its unit and an example", () => {
    // the standardised attribute columns are described beside their reader (lib/uploads/position-attributes.ts)
    const core = ["asOf", "book", "instrument", "instrumentName", "assetClass", "currency", "quantity", "price", "marketValue", "deltaExposure", "marketValueCurrency", "marketValueNote"];
    expect(core.every((f) => f in POSITION_FIELDS)).toBe(true);
    for (const field of core) {
      const entry = POSITION_COLUMN_GUIDE.find((g) => g.field === field);
      expect(entry, field).toBeDefined();
      expect(entry!.meaning.length, field).toBeGreaterThan(10);
      expect(entry!.unit.length, field).toBeGreaterThan(0);
    }
  });

  it("the served template has every guide column and an example row that reads without a problem", () => {
    const file = readFileSync(path.join(process.cwd(), "templates/uploads/positions.csv"), "utf8");
    const header = file.slice(0, file.indexOf("\n")).split(",");
    for (const g of POSITION_COLUMN_GUIDE) expect(header, g.column).toContain(g.column);
    expect(positionsTemplateCsv().split("\n")).toHaveLength(3); // header, example, final newline
    const parsed = parse(file, plain, { ...EUR_NOV, fxToReporting: { USD: 0.92 } });
    expect(parsed.problems).toEqual([]);
    expect(parsed.rows).toHaveLength(1);
    expect(parsed.rows[0].marketValue).toBeCloseTo(1500 * 42.1 * 0.92, 6); // 63,150 USD at 0.92 EUR per USD
  });
});
