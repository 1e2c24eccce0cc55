/**
 * An iCalendar (RFC 5545) file of filing deadlines, written by hand: CRLF line ends, content lines folded at 75
 * octets without splitting a UTF-8 character, TEXT values escaped (backslash, semicolon, comma, newline). Each
 * deadline is an all-day event; its UID stays the same for a period end so that calendars update it in place.
 */
import { addDays, format, parseISO } from "date-fns";

export interface DeadlineEvent {
  /** stable unique id, e.g. "deadline-<firm>-<period end>@ballast" */
  uid: string;
  /** the deadline, yyyy-mm-dd (an all-day event) */
  date: string;
  summary: string;
  description?: string;
  url?: string;
}

/** Escape a TEXT value (RFC 5545 §3.3.11). */
export function escapeText(value: string): string {
  return value.replace(/\\/g, "\\\\").replace(/;/g, "\\;").replace(/,/g, "\\,").replace(/\r\n|\r|\n/g, "\\n");
}

/** Fold one content line at 75 octets (RFC 5545 §3.1): CRLF followed by one space, never inside a character. */
export function foldLine(line: string): string {
  const parts: string[] = [];
  let current = "";
  let octets = 0;
  for (const char of line) {
    const size = Buffer.byteLength(char, "utf8");
    // The first line holds 75 octets; continuation lines hold 74 after their leading space.
    const limit = parts.length === 0 ? 75 : 74;
    if (octets + size > limit) {
      parts.push(current);
      current = "";
      octets = 0;
    }
    current += char;
    octets += size;
  }
  parts.push(current);
  return parts.join("\r\n ");
}

const utcStamp = (date: Date) => date.toISOString().replace(/[-:]/g, "").replace(/\.\d{3}/, "");
const dateValue = (date: string) => date.replace(/-/g, "");

/** The whole calendar as text. `stamp` is the DTSTAMP of every event (when the file was made). */
export function buildIcs(input: { name: string; events: readonly DeadlineEvent[]; stamp: Date }): string {
  const lines: string[] = [
    "BEGIN:VCALENDAR",
    "VERSION:2.0",
    "PRODID:-//Ballast//Filing deadlines//EN",
    "CALSCALE:GREGORIAN",
    "METHOD:PUBLISH",
    `X-WR-CALNAME:${escapeText(input.name)}`,
  ];
  for (const event of input.events) {
    lines.push(
      "BEGIN:VEVENT",
      `UID:${event.uid}`,
      `DTSTAMP:${utcStamp(input.stamp)}`,
      `DTSTART;VALUE=DATE:${dateValue(event.date)}`,
      `DTEND;VALUE=DATE:${format(addDays(parseISO(event.date), 1), "yyyyMMdd")}`,
      `SUMMARY:${escapeText(event.summary)}`,
    );
    if (event.description) lines.push(`DESCRIPTION:${escapeText(event.description)}`);
    if (event.url) lines.push(`URL:${event.url}`);
    lines.push("TRANSP:TRANSPARENT", "END:VEVENT");
  }
  lines.push("END:VCALENDAR");
  return lines.map(foldLine).join("\r\n") + "\r\n";
}
