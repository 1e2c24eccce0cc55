import { describe, expect, it } from "vitest";
import { addBusinessDaysWithHolidays, businessDaysBetween, deadlineFor, isBusinessDay, latestMonthEnd, monthEnd, nextMonthEnds, subtractBusinessDays } from "@/lib/calendar/deadline";

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

describe("business days: more cases", () => {
  it("a business-days deadline that would land on a holiday moves past it", () => {
    // 2026-11-30 + 15 business days is Monday 21 Dec; with 21 Dec a holiday it becomes Tuesday 22 Dec.
    expect(deadlineFor("2026-11-30", { kind: "business-days-after", days: 15 }, new Set(["2026-12-21"]))).toBe("2026-12-22");
    // Holidays on a weekend change nothing.
    expect(deadlineFor("2026-11-30", { kind: "business-days-after", days: 15 }, new Set(["2026-12-05", "2026-12-06"]))).toBe("2026-12-21");
  });

  it("a fixed day on a weekend moves to Monday, and across a run of holidays", () => {
    // 2027-02-13 is a Saturday.
    expect(deadlineFor("2027-01-31", { kind: "fixed-day-next-month", day: 13 }, none)).toBe("2027-02-15");
    // 24–26 Dec 2026 are Thu–Sat; with the 24th and 25th holidays the next business day is Monday 28 Dec.
    expect(deadlineFor("2026-11-30", { kind: "fixed-day-next-month", day: 24 }, new Set(["2026-12-24", "2026-12-25"]))).toBe("2026-12-28");
  });

  it("crosses month and year ends", () => {
    // Thursday 31 Dec 2026 + 1 business day, with 1 Jan 2027 (Friday) a holiday → Monday 4 Jan 2027.
    expect(addBusinessDaysWithHolidays("2026-12-31", 1, new Set(["2027-01-01"]))).toBe("2027-01-04");
    // December 2026 ends on a Thursday: 15 business days later with the demo holidays (31 Dec, 1 Jan) is 22 Jan 2027.
    expect(deadlineFor("2026-12-31", { kind: "business-days-after", days: 15 }, new Set(["2026-12-31", "2027-01-01"]))).toBe("2027-01-22");
  });

  it("counts 29 February in a leap year and not in others", () => {
    // 2028-02-28 is a Monday; Tuesday 29 Feb 2028 exists, so one business day later is the 29th.
    expect(addBusinessDaysWithHolidays("2028-02-28", 1, none)).toBe("2028-02-29");
    // 2027 is not a leap year: Friday 26 Feb 2027 + 1 business day is Monday 1 March.
    expect(addBusinessDaysWithHolidays("2027-02-26", 1, none)).toBe("2027-03-01");
    // February 2028 has 21 business days (1 Feb is a Tuesday, 29 Feb a Tuesday).
    expect(businessDaysBetween("2028-01-31", "2028-02-29", none)).toBe(21);
    expect(deadlineFor("2028-01-31", { kind: "business-days-after", days: 20 }, none)).toBe("2028-02-28");
  });

  it("n = 0 keeps a business day and moves a weekend or holiday forward", () => {
    expect(addBusinessDaysWithHolidays("2026-12-01", 0, none)).toBe("2026-12-01");
    expect(addBusinessDaysWithHolidays("2026-12-05", 0, none)).toBe("2026-12-07");
    expect(addBusinessDaysWithHolidays("2026-12-24", 0, new Set(["2026-12-24", "2026-12-25"]))).toBe("2026-12-28");
  });

  it("counts business days left across holidays (the demo's 24–26 Dec)", () => {
    const demo = new Set(["2026-12-24", "2026-12-25", "2026-12-26", "2026-12-31", "2027-01-01"]);
    // (21 Dec, 4 Jan]: 22, 23, 28, 29, 30 Dec and 4 Jan.
    expect(businessDaysBetween("2026-12-21", "2027-01-04", demo)).toBe(6);
    // From a Saturday the count is the same as from the Friday before.
    expect(businessDaysBetween("2026-12-12", "2026-12-21", none)).toBe(businessDaysBetween("2026-12-11", "2026-12-21", none));
  });

  it("steps back n business days (the day a reminder goes out)", () => {
    // Five business days before Monday 21 Dec 2026 is Monday 14 Dec.
    expect(subtractBusinessDays("2026-12-21", 5, none)).toBe("2026-12-14");
    expect(businessDaysBetween("2026-12-14", "2026-12-21", none)).toBe(5);
    // One business day before Monday 28 Dec with 24–25 Dec holidays is Wednesday 23 Dec.
    expect(subtractBusinessDays("2026-12-28", 1, new Set(["2026-12-24", "2026-12-25"]))).toBe("2026-12-23");
  });

  it("finds month ends", () => {
    expect(latestMonthEnd("2026-12-14")).toBe("2026-11-30");
    expect(latestMonthEnd("2026-11-30")).toBe("2026-11-30");
    expect(latestMonthEnd("2028-03-01")).toBe("2028-02-29");
    expect(latestMonthEnd("2027-01-15")).toBe("2026-12-31");
    expect(nextMonthEnds("2026-12-01", 3)).toEqual(["2026-12-31", "2027-01-31", "2027-02-28"]);
    expect(nextMonthEnds("2026-12-31", 2)).toEqual(["2027-01-31", "2027-02-28"]);
  });
});
