/**
 * The positions file's optional standardised columns: read and checked cell by cell, carried on the row, and — for a
 * firm that files the standardised figure — a position lacking an attribute its block needs is an error naming the
 * file row and the column, and the row is not kept.
 */
import { describe, expect, it } from "vitest";
import { readTables } from "@/lib/uploads/read-table";
import { parsePositions } from "@/lib/uploads/parse-positions";
import { standardisedPositionOf, standardisedQualityItems } from "@/lib/uploads/position-attributes";
import { dataQualityReport } from "@/lib/uploads/data-quality";
import { STANDARDISED_1996_PROFILE } from "@/lib/risk/standardised";
import type { ReadOptions } from "@/lib/uploads/types";

const HEADER =
  "as_of,book,instrument_id,instrument_name,asset_class,currency,quantity,price,market_value,delta_exposure,instrument_type,issuer_category,maturity_date,residual_maturity_years,coupon,next_reset_date,modified_duration,national_market,commodity,notional,underlying_maturity_years";
const plain: ReadOptions = { numberFormat: "plain" };
const base = { today: "2026-12-01", reportingCurrency: "EUR", periodEnd: "2026-11-30" };
const bytes = (text: string) => new TextEncoder().encode(text);

async function parse(lines: string[], filed = false) {
  const [table] = await readTables(bytes([HEADER, ...lines].join("\n") + "\n"));
  return parsePositions(table, plain, { ...base, ...(filed ? { filedStandardisedProfile: STANDARDISED_1996_PROFILE } : {}) });
}

const BOND = "2026-11-30,TREASURY,GB-2031,Aurenia 2.25% 2031,government_bond,EUR,1000,104.158,104158.00,,bond,government,2031-06-15,,2.25,,,,,,";
const EQUITY = "2026-11-30,TRADING,EQ-A,Alder AG,equity,EUR,100,50,5000.00,,,,,,,,,DE,,,";
const BILL = "2026-11-30,TREASURY,TB-3M,Aurenia bill Feb 2027,government_bond,EUR,500,99.3,49650.00,,bill,government,,0.25,0,,,,,,";
const BOND_NO_MATURITY = "2026-11-30,TREASURY,GB-2033,Ostrelia 3.25% 2033,government_bond,EUR,1000,113.477,113477.00,,bond,government,,,3.25,,,,,,";
const FUTURE = "2026-11-30,HEDGE,CF-CRUDE,Crude future,commodity_future,EUR,1000,90,90000.00,90000.00,,,,,,,,,crude oil,90000,";

describe("reading the optional columns", () => {
  it("carries each attribute the file gives on the row, and none on a row that gives none", async () => {
    const parsed = await parse([BOND, EQUITY, "2026-11-30,TRADING,EQ-B,Bracken SE,equity,EUR,10,40,400.00,,,,,,,,,,,,"]);
    expect(parsed.problems).toEqual([]);
    expect(parsed.rows[0].attributes).toEqual({ instrumentType: "bond", issuerCategory: "government", maturityDate: "2031-06-15", coupon: 2.25 });
    expect(parsed.rows[1].attributes).toEqual({ nationalMarket: "DE" });
    expect(parsed.rows[2].attributes).toBeUndefined();
  });

  it("names the row and column of an unreadable attribute", async () => {
    const parsed = await parse([
      "2026-11-30,TREASURY,GB-X,X,government_bond,EUR,1,100,100.00,,debenture,government,2031-02-30,,2.5,,,,,,",
      "2026-11-30,TREASURY,GB-Y,Y,government_bond,EUR,1,100,100.00,,bond,supranational,,3,abc,,,,,,",
    ]);
    const errors = parsed.problems.map((p) => [p.row, p.field, p.severity]);
    expect(errors).toEqual(
      expect.arrayContaining([
        [2, "instrument type", "error"],
        [2, "maturity date", "error"],
        [3, "issuer category", "error"],
        [3, "coupon (%)", "error"],
      ]),
    );
    expect(parsed.problems.find((p) => p.field === "instrument type")!.message).toMatch(/"debenture" is not one Ballast knows/);
    expect(parsed.rows).toHaveLength(0);
  });

  it("reads the instrument type from the asset class where the file gives none", () => {
    const p = standardisedPositionOf({ instrument: "EQ-A", assetClass: "equity", currency: "EUR", quantity: 1, marketValue: 10, attributes: { nationalMarket: "DE" } });
    expect(p).toEqual({ instrument: "EQ-A", assetClass: "equity", instrumentType: "equity", marketValue: 10, currency: "EUR", nationalMarket: "DE" });
    expect(standardisedPositionOf({ instrument: "F", assetClass: "commodity_future", currency: "USD", quantity: 1, marketValue: 10 }).instrumentType).toBe("future");
  });
});

describe("a firm that files the standardised figure", () => {
  it("accepts a book whose positions give what their blocks need", async () => {
    const parsed = await parse([BOND, EQUITY, BILL, FUTURE], true);
    expect(parsed.problems).toEqual([]);
    expect(parsed.rows).toHaveLength(4);
  });

  it("refuses a bond without a maturity, naming its file row and the maturity column, and keeps no such row", async () => {
    const parsed = await parse([BOND, BOND_NO_MATURITY, EQUITY], true);
    const errors = parsed.problems.filter((p) => p.severity === "error");
    expect(errors).toHaveLength(1);
    expect(errors[0].row).toBe(3);
    expect(errors[0].field).toBe("residual maturity (years)");
    expect(errors[0].message).toMatch(/residual_maturity_years/);
    expect(errors[0].message).toMatch(/maturity_date/);
    expect(parsed.rows.map((r) => r.instrument)).toEqual(["GB-2031", "EQ-A"]);
  });

  it("refuses an equity without its national market and a commodity future without its notional", async () => {
    const parsed = await parse(["2026-11-30,TRADING,EQ-B,Bracken SE,equity,EUR,10,40,400.00,,,,,,,,,,,,", "2026-11-30,HEDGE,CF-GOLD,Gold future,commodity_future,EUR,10,2000,20000.00,20000.00,,,,,,,,,gold,,"], true);
    expect(parsed.problems.map((p) => [p.row, p.field])).toEqual([
      [2, "national market"],
      [3, "notional"],
    ]);
  });

  it("asks nothing of a firm that files the internal-models figure", async () => {
    const parsed = await parse([BOND_NO_MATURITY, "2026-11-30,TRADING,EQ-B,Bracken SE,equity,EUR,10,40,400.00,,,,,,,,,,,,"]);
    expect(parsed.problems).toEqual([]);
    expect(parsed.rows).toHaveLength(2);
  });
});

describe("the data-quality report under a profile that files the standardised figure", () => {
  it("lists each confirmed position lacking an attribute as an error naming its row, counted with the rest", () => {
    const rows = [
      { row: 2, instrument: "GB-2031", assetClass: "government_bond", currency: "EUR", quantity: 1, marketValue: 100, attributes: { instrumentType: "bond" as const, issuerCategory: "government" as const, coupon: 2.25 } },
      { row: 3, instrument: "EQ-A", assetClass: "equity", currency: "EUR", quantity: 1, marketValue: 50, attributes: { nationalMarket: "DE" } },
    ];
    const extraItems = standardisedQualityItems(rows, { reportingCurrency: "EUR", asOf: "2026-11-30", profile: STANDARDISED_1996_PROFILE });
    expect(extraItems).toHaveLength(1);
    expect(extraItems[0]).toMatchObject({ check: "standardised-attribute", severity: "error", instrument: "GB-2031" });
    expect(extraItems[0].message).toMatch(/^Row 2 \(GB-2031\), column residual_maturity_years: a bond needs a residual maturity/);
    const report = dataQualityReport([], new Map(), { reportingCurrency: "EUR", periodEnd: "2026-11-30", extraItems });
    expect(report.counts.error).toBe(1);
    expect(report.byCheck).toEqual([{ check: "standardised-attribute", label: "Position lacks what the filed standardised figure needs", severity: "error", count: 1 }]);
  });
});
