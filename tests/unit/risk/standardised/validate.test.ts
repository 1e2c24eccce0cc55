import { describe, expect, it } from "vitest";
import { computeStandardised, STANDARDISED_1996_PROFILE, StandardisedInputError, validateStandardisedPositions, type StandardisedPosition } from "@/lib/risk/standardised";

const ok: StandardisedPosition = { instrument: "EQ", instrumentType: "equity", nationalMarket: "DE", currency: "EUR", marketValue: 100 };

describe("position validation names the row, the field and the column", () => {
  it("a bond without maturity, issuer category or coupon", () => {
    const issues = validateStandardisedPositions([ok, { instrument: "B", instrumentType: "bond", currency: "EUR", marketValue: 100 }], { reportingCurrency: "EUR" });
    expect(issues.map((i) => [i.row, i.field, i.column])).toEqual([
      [1, "issuerCategory", "issuer_category"],
      [1, "residualMaturityYears", "residual_maturity_years"],
      [1, "coupon", "coupon"],
    ]);
    expect(issues[1].message).toMatch(/residual maturity/);
  });
  it("a maturity date needs the as-of date and must not be before it", () => {
    const b: StandardisedPosition = { instrument: "B", instrumentType: "bill", currency: "EUR", marketValue: 100, issuerCategory: "government", maturityDate: "2026-10-01" };
    expect(validateStandardisedPositions([b], { reportingCurrency: "EUR" })[0]).toMatchObject({ field: "maturityDate", column: "maturity_date" });
    expect(validateStandardisedPositions([b], { reportingCurrency: "EUR", asOf: "2026-11-30" })[0].message).toMatch(/before the as-of date/);
    expect(validateStandardisedPositions([{ ...b, maturityDate: "2027-02-31" }], { reportingCurrency: "EUR", asOf: "2026-11-30" })[0].message).toMatch(/not a yyyy-mm-dd date/);
    expect(validateStandardisedPositions([{ ...b, maturityDate: "2027-02-28" }], { reportingCurrency: "EUR", asOf: "2026-11-30" })).toEqual([]);
  });
  it("the duration method needs modified durations", () => {
    const b: StandardisedPosition = { instrument: "B", instrumentType: "bond", currency: "EUR", marketValue: 100, issuerCategory: "government", residualMaturityYears: 3, coupon: 2 };
    const profile = { ...STANDARDISED_1996_PROFILE, interestRate: { ...STANDARDISED_1996_PROFILE.interestRate, method: "duration" as const } };
    expect(validateStandardisedPositions([b], { reportingCurrency: "EUR" })).toEqual([]);
    expect(validateStandardisedPositions([b], { reportingCurrency: "EUR", profile }).map((i) => i.column)).toEqual(["modified_duration"]);
  });
  it("unknown types and categories, bad currencies and equities without a market", () => {
    const issues = validateStandardisedPositions(
      [
        { ...ok, instrumentType: "warrant" as StandardisedPosition["instrumentType"] },
        { ...ok, currency: "euro" },
        { ...ok, nationalMarket: " " },
        { instrument: "B", instrumentType: "bond", currency: "EUR", marketValue: 1, issuerCategory: "junk" as StandardisedPosition["issuerCategory"], residualMaturityYears: 1, coupon: 1 },
      ],
      { reportingCurrency: "EUR" },
    );
    expect(issues.map((i) => [i.row, i.column])).toEqual([[0, "instrument_type"], [1, "currency"], [2, "national_market"], [3, "issuer_category"]]);
  });
  it("a future must say what it is on; options need their terms", () => {
    const issues = validateStandardisedPositions(
      [
        { instrument: "F", instrumentType: "future", currency: "EUR", marketValue: 0, notional: 100 },
        { instrument: "O", instrumentType: "option", currency: "EUR", marketValue: 5, assetClass: "equity" },
      ],
      { reportingCurrency: "EUR" },
    );
    expect(issues.map((i) => [i.row, i.column])).toEqual([[0, "asset_class"], [1, "underlying"], [1, "option_kind"], [1, "strike"], [1, "quantity"], [1, "underlying_price"]]);
  });
  it("the engine refuses a set with issues, every issue attached", () => {
    try {
      computeStandardised([ok, { instrument: "B", instrumentType: "bond", currency: "EUR", marketValue: 100 }], { reportingCurrency: "EUR" });
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(StandardisedInputError);
      expect((error as StandardisedInputError).issues).toHaveLength(3);
      expect((error as Error).message).toBe('position 2, column "issuer_category": a bond needs its issuer category (government, qualifying or other) (and 2 more)');
    }
  });
});
