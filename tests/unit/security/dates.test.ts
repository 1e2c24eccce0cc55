import { describe, expect, it } from "vitest";
import { isRealDate } from "@/lib/validation/dates";
import { DEFAULT_METHOD_CONTENT, methodContentSchema } from "@/lib/validation/method";
import { markFiledSchema } from "@/lib/validation/filings";

describe("dates at the edge", () => {
  it("knows which days exist (Gregorian leap rule: 2000 and 2028 leap, 1900 and 2100 not)", () => {
    for (const d of ["2026-02-28", "2028-02-29", "2000-02-29", "2026-12-31"]) expect(isRealDate(d), d).toBe(true);
    for (const d of ["2026-02-30", "2026-02-29", "1900-02-29", "2100-02-29", "9999-99-99", "2026-13-01", "2026-00-10", "2026-1-1", ""]) expect(isRealDate(d), d).toBe(false);
  });

  it.each([
    ["2026-02-30", "2026-03-31", "stressWindow.start"],
    ["2008-09-01", "9999-99-99", "stressWindow.end"],
    ["1900-01-02", "1900-06-30", "stressWindow.start"],
  ])("refuses a stress window %s to %s naming %s", (start, end, field) => {
    const parsed = methodContentSchema.safeParse({ ...DEFAULT_METHOD_CONTENT, stressWindow: { mode: "chosen", start, end } });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.path.join("."))).toContain(field);
  });

  it("accepts a real stress window and refuses a filing date that does not exist", () => {
    expect(methodContentSchema.safeParse({ ...DEFAULT_METHOD_CONTENT, stressWindow: { mode: "chosen", start: "2008-09-01", end: "2009-03-31" } }).success).toBe(true);
    expect(markFiledSchema.safeParse({ filedOn: "2026-02-30", reference: "R-1" }).success).toBe(false);
    expect(markFiledSchema.safeParse({ filedOn: "9999-12-31", reference: "R-1" }).success).toBe(false);
  });
});
