import { describe, expect, it } from "vitest";
import { addDays, format, isWeekend, parseISO } from "date-fns";
import { addBusinessDaysWithHolidays, businessDaysBetween, dayNumber, fromDayNumber, subtractBusinessDays } from "@/lib/calendar/deadline";

/** The obvious day-by-day count, as the reference the fast arithmetic must agree with. */
function naiveBetween(from: string, to: string, holidays: ReadonlySet<string>): number {
  if (to < from) return -naiveBetween(to, from, holidays);
  let n = 0;
  for (let d = addDays(parseISO(from), 1); format(d, "yyyy-MM-dd") <= to; d = addDays(d, 1)) {
    const s = format(d, "yyyy-MM-dd");
    if (!isWeekend(d) && !holidays.has(s)) n++;
  }
  return n;
}

function naiveAdd(from: string, k: number, holidays: ReadonlySet<string>, step: 1 | -1): string {
  let d = parseISO(from);
  let left = k;
  while (left > 0) {
    d = addDays(d, step);
    if (!isWeekend(d) && !holidays.has(format(d, "yyyy-MM-dd"))) left--;
  }
  return format(d, "yyyy-MM-dd");
}

/** A small seeded generator (mulberry32, common practice, no source) so the cases are the same on every run. */
function rng(seed: number): () => number {
  let a = seed;
  return () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

describe("business-day arithmetic on day numbers", () => {
  it("round-trips day numbers and refuses dates that do not exist", () => {
    expect(dayNumber("1970-01-01")).toBe(0);
    expect(fromDayNumber(dayNumber("2026-11-30"))).toBe("2026-11-30");
    expect(fromDayNumber(dayNumber("0001-01-01"))).toBe("0001-01-01");
    for (const bad of ["2026-02-30", "9999-99-99", "0000-00-00", "2026-1-1", "", "2026-11-30T00:00"]) {
      expect(() => dayNumber(bad), bad).toThrow(RangeError);
    }
  });

  it("agrees with a day-by-day count on 300 seeded ranges with holidays", () => {
    const next = rng(16);
    const base = dayNumber("2020-01-01");
    const holidays = new Set<string>();
    for (let i = 0; i < 120; i++) holidays.add(fromDayNumber(base + Math.floor(next() * 3000)));
    for (let i = 0; i < 300; i++) {
      const a = fromDayNumber(base + Math.floor(next() * 2500));
      const b = fromDayNumber(base + Math.floor(next() * 2500));
      expect(businessDaysBetween(a, b, holidays), `${a}..${b}`).toBe(naiveBetween(a, b, holidays));
      const k = 1 + Math.floor(next() * 40);
      expect(addBusinessDaysWithHolidays(a, k, holidays), `${a}+${k}`).toBe(naiveAdd(a, k, holidays, 1));
      expect(subtractBusinessDays(a, k, holidays), `${a}-${k}`).toBe(naiveAdd(a, k, holidays, -1));
    }
  });

  it("counts a century-wide range without walking it day by day", () => {
    // 1 Jan 1926 to 1 Jan 2026: 36,525 days (100 × 365 + 25 leap days, Gregorian rule). The count of weekdays
    // comes from the closed form; the check is the naive walk (36,525 steps, kept once here as the reference).
    const holidays = new Set(["2025-12-25", "1990-01-01", "1926-01-02" /* a Saturday: changes nothing */]);
    const fast = businessDaysBetween("1926-01-01", "2026-01-01", holidays);
    expect(fast).toBe(naiveBetween("1926-01-01", "2026-01-01", holidays));
    // Any 400 Gregorian years hold 146,097 days, exactly 20,871 weeks (the Gregorian cycle), so 104,355 weekdays.
    expect(businessDaysBetween("1999-12-31", "2399-12-31", new Set())).toBe(104_355);
    expect(businessDaysBetween("2399-12-31", "1999-12-31", new Set())).toBe(-104_355);
    expect(addBusinessDaysWithHolidays("1999-12-31", 104_355, new Set())).toBe("2399-12-31");
  });
});
