import { describe, expect, it } from "vitest";
import ICAL from "ical.js";
import { buildIcs, escapeText, foldLine } from "@/lib/calendar/ics";

const stamp = new Date("2026-12-01T09:00:00Z");
const events = [
  {
    uid: "deadline-firm-1-2026-11-30@ballast",
    date: "2026-12-21",
    summary: "Filing deadline: November 2026 (Northmoor Brokerage Ltd)",
    description: "Reporting period ending 2026-11-30. Next step: Upload and confirm month-end positions; then the run, sign-off, and filing.\nSecond line with a back\\slash.",
    url: "http://localhost:3000/periods/abc",
  },
  { uid: "deadline-firm-1-2026-12-31@ballast", date: "2027-01-22", summary: "Filing deadline: December 2026 — Ünïcödé, long enough to need folding across several content lines of the file ✓✓✓✓✓" },
];

describe("iCalendar output", () => {
  const text = buildIcs({ name: "Northmoor Brokerage Ltd: filing deadlines", events, stamp });

  it("keeps RFC 5545's line rules: CRLF only, at most 75 octets a line, folds start with one space", () => {
    expect(text.endsWith("\r\n")).toBe(true);
    expect(text.replace(/\r\n/g, "")).not.toMatch(/[\r\n]/);
    const lines = text.split("\r\n").slice(0, -1);
    for (const line of lines) expect(Buffer.byteLength(line, "utf8"), line).toBeLessThanOrEqual(75);
    // Unfolding (§3.1) gives back each content line whole; no character was cut in two.
    const unfolded = text.replace(/\r\n /g, "");
    expect(unfolded).not.toContain("\uFFFD");
    expect(unfolded).toContain("SUMMARY:Filing deadline: December 2026 — Ünïcödé\\, long enough to need folding across several content lines of the file ✓✓✓✓✓");
    expect(lines[0]).toBe("BEGIN:VCALENDAR");
    expect(lines.at(-1)).toBe("END:VCALENDAR");
    expect(lines).toContain("VERSION:2.0");
    expect(lines.filter((l) => l === "BEGIN:VEVENT")).toHaveLength(2);
  });

  it("escapes TEXT values", () => {
    expect(escapeText("a;b,c\\d\ne")).toBe("a\\;b\\,c\\\\d\\ne");
    expect(foldLine("x".repeat(75))).toBe("x".repeat(75));
    expect(foldLine("x".repeat(76))).toBe(`${"x".repeat(75)}\r\n x`);
  });

  it("parses back with an independent iCalendar parser to the same deadlines", () => {
    const calendar = new ICAL.Component(ICAL.parse(text));
    expect(calendar.getFirstPropertyValue("version")).toBe("2.0");
    expect(calendar.getFirstPropertyValue("x-wr-calname")).toBe("Northmoor Brokerage Ltd: filing deadlines");
    const parsed = calendar.getAllSubcomponents("vevent").map((c) => new ICAL.Event(c));
    expect(parsed.map((e) => e.uid)).toEqual(events.map((e) => e.uid));
    expect(parsed.map((e) => e.startDate.toString())).toEqual(["2026-12-21", "2027-01-22"]);
    expect(parsed.every((e) => e.startDate.isDate)).toBe(true);
    expect(parsed.map((e) => e.endDate.toString())).toEqual(["2026-12-22", "2027-01-23"]);
    expect(parsed[0].summary).toBe(events[0].summary);
    expect(parsed[0].description).toBe(events[0].description);
    expect(parsed[1].summary).toBe(events[1].summary);
    const first = calendar.getAllSubcomponents("vevent")[0];
    expect(String(first.getFirstPropertyValue("dtstamp"))).toBe("2026-12-01T09:00:00Z");
    expect(first.getFirstPropertyValue("url")).toBe("http://localhost:3000/periods/abc");
  });
});
