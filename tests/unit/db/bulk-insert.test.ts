import { describe, expect, it } from "vitest";
import { sqlLiteral, orderedId } from "@/db/bulk-insert";

describe("bulk insert literals", () => {
  it("quotes strings safely, whatever they contain", () => {
    expect(sqlLiteral("O'Brien")).toBe("'O''Brien'");
    expect(sqlLiteral("'); DROP TABLE positions; --")).toBe("'''); DROP TABLE positions; --'");
    expect(sqlLiteral('=HYPERLINK("x")')).toBe(`'=HYPERLINK("x")'`);
    expect(sqlLiteral("Zürich ✓")).toBe("'Zürich ✓'");
  });

  it("writes numbers, booleans and nulls, and refuses non-finite numbers", () => {
    expect(sqlLiteral(-12.5)).toBe("-12.5");
    expect(sqlLiteral(1e-7)).toBe("1e-7");
    expect(sqlLiteral(true)).toBe("1");
    expect(sqlLiteral(null)).toBe("NULL");
    expect(() => sqlLiteral(Number.NaN)).toThrow(RangeError);
  });

  it("makes ids that sort in creation order and do not repeat", () => {
    const ids = Array.from({ length: 10_000 }, orderedId);
    expect(new Set(ids).size).toBe(ids.length);
    expect([...ids].sort()).toEqual(ids);
  });
});
