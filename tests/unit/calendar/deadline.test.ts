import { describe, expect, it } from "vitest";
import { addBusinessDaysWithHolidays, businessDaysBetween, deadlineFor, isBusinessDay, monthEnd } from "@/lib/calendar/deadline";

const none = new Set<string>();

describe("business days", () => {
  it("skips weekends", () => {
    // 2026-11-27 is a Friday (checked against a printed calendar, common knowledge).
    expect(addBusinessDaysWithHolidays("2026-11-27", 1, none)).toBe("2026-11-30");
    expect(isBusinessDay("2026-11-28", none)).toBe(false);
  });

  it("skips the firm's holidays", () => {
    const holidays = new Set(["2026-12-24", "2026-12-25"]);
    expect(addBusinessDaysWithHolidays("2026-12-23", 1, holidays)).toBe("2026-12-28");
  });

  it("counts business days left, negative when past", () => {
    expect(businessDaysBetween("2026-12-01", "2026-12-08", none)).toBe(5);
    expect(businessDaysBetween("2026-12-08", "2026-12-01", none)).toBe(-5);
    expect(businessDaysBetween("2026-12-01", "2026-12-01", none)).toBe(0);
  });
});

describe("deadlines", () => {
  it("15 business days after a month end", () => {
    // Nov 2026 ends on a Monday (30th); 15 business days later is Monday 21 Dec.
    expect(deadlineFor("2026-11-30", { kind: "business-days-after", days: 15 }, none)).toBe("2026-12-21");
  });

  it("a fixed day that falls on a holiday moves to the next business day", () => {
    const holidays = new Set(["2027-01-15"]);
    // 15 Jan 2027 is a Friday and a holiday here; the next business day is Monday 18 Jan.
    expect(deadlineFor("2026-12-31", { kind: "fixed-day-next-month", day: 15 }, holidays)).toBe("2027-01-18");
  });

  it("a fixed day past the end of a short month uses its last day", () => {
    // February 2028 has 29 days (leap year); 29 Feb 2028 is a Tuesday.
    expect(deadlineFor("2028-01-31", { kind: "fixed-day-next-month", day: 31 }, none)).toBe("2028-02-29");
    expect(monthEnd("2028-02-10")).toBe("2028-02-29");
    expect(monthEnd("2027-02-10")).toBe("2027-02-28");
  });
});
