/** Reading single cells: numbers in the chosen format, dates (ISO or Excel serials), header names. */
import { excelSerialToIso } from "./serial-date";
import type { DateFormat, NumberFormat } from "./types";

/** Header names compared without case, spaces, underscores, hyphens, dots or slashes. */
export function normaliseHeader(name: string): string {
  return name.toLowerCase().replace(/[\s_\-./()]+/g, "");
}

/** A numeric cell in the chosen format, or an explanation of why it is not a number. */
export function readNumber(cell: unknown, format: NumberFormat): { value: number } | { error: string } {
  if (typeof cell === "number") return Number.isFinite(cell) ? { value: cell } : { error: "is not a finite number" };
  const text = cell === undefined || cell === null ? "" : String(cell).trim();
  if (text === "") return { error: "is empty" };
  let normalised = text.replace(/\s/g, "");
  if (format === "comma-thousands") {
    if (!/^[-+]?\d{1,3}(,\d{3})*(\.\d+)?$|^[-+]?\d+(\.\d+)?$/.test(normalised)) return { error: `"${text}" is not a number written as 1,234.56` };
    normalised = normalised.replace(/,/g, "");
  } else if (format === "dot-thousands") {
    if (!/^[-+]?\d{1,3}(\.\d{3})*(,\d+)?$|^[-+]?\d+(,\d+)?$/.test(normalised)) return { error: `"${text}" is not a number written as 1.234,56` };
    normalised = normalised.replace(/\./g, "").replace(",", ".");
  } else if (!/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(normalised)) {
    return {
      error: /[,]/.test(normalised)
        ? `"${text}" is not a plain number (it has a comma: choose the number format that matches the file)`
        : `"${text}" is not a number`,
    };
  }
  const value = Number(normalised);
  return Number.isFinite(value) ? { value } : { error: `"${text}" is not a number` };
}

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const DAY_FIRST = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})$/;

/** A date written day/month/year or month/day/year (slashes, dots or hyphens) as yyyy-mm-dd, or why it is not one. */
function readWrittenDate(text: string, format: Exclude<DateFormat, "iso">): { value: string } | { error: string } {
  const match = DAY_FIRST.exec(text);
  const shape = format === "day-month-year" ? "dd/mm/yyyy" : "mm/dd/yyyy";
  if (!match) return { error: `"${text}" is not a date as ${shape}` };
  const [a, b, y] = [Number(match[1]), Number(match[2]), Number(match[3])];
  const [d, m] = format === "day-month-year" ? [a, b] : [b, a];
  const date = new Date(Date.UTC(y, m - 1, d));
  if (m < 1 || m > 12 || date.getUTCFullYear() !== y || date.getUTCMonth() !== m - 1 || date.getUTCDate() !== d) return { error: `"${text}" does not exist as ${shape}` };
  return { value: `${String(y).padStart(4, "0")}-${String(m).padStart(2, "0")}-${String(d).padStart(2, "0")}` };
}

/**
 * A date cell as yyyy-mm-dd: text in the chosen date format (ISO yyyy-mm-dd by default), an Excel serial (number,
 * or digits in a CSV), or a workbook date.
 */
export function readDate(cell: unknown, format: DateFormat = "iso"): { value: string } | { error: string } {
  if (cell instanceof Date) return Number.isNaN(cell.getTime()) ? { error: "is not a date" } : { value: cell.toISOString().slice(0, 10) };
  if (typeof cell === "number") {
    const iso = excelSerialToIso(cell);
    return iso ? { value: iso } : { error: `${cell} is not a date serial` };
  }
  const text = cell === undefined || cell === null ? "" : String(cell).trim();
  if (text === "") return { error: "is empty" };
  if (/^\d{5}(\.\d+)?$/.test(text)) {
    const iso = excelSerialToIso(Number(text));
    if (iso) return { value: iso };
  }
  if (format !== "iso") return readWrittenDate(text, format);
  const match = ISO_DATE.exec(text.slice(0, 10));
  if (!match || (text.length > 10 && !/^[T ]/.test(text.slice(10)))) return { error: `"${text}" is not a date as yyyy-mm-dd` };
  const [, y, m, d] = match.map(Number);
  const date = new Date(Date.UTC(y, m - 1, d));
  if (date.getUTCFullYear() !== y || date.getUTCMonth() !== m - 1 || date.getUTCDate() !== d) return { error: `${text.slice(0, 10)} does not exist` };
  return { value: text.slice(0, 10) };
}

/** A text cell, trimmed; never evaluated, whatever it starts with. */
export function readText(cell: unknown): string {
  if (cell === undefined || cell === null) return "";
  if (cell instanceof Date) return cell.toISOString().slice(0, 10);
  return String(cell).trim();
}

let isoCurrencies: Set<string> | undefined;
/** Whether a code is an ISO 4217 currency the runtime knows (Intl.supportedValuesOf). */
export function isIsoCurrency(code: string): boolean {
  isoCurrencies ??= new Set(Intl.supportedValuesOf("currency"));
  return isoCurrencies.has(code);
}

/** Each field's header aliases, from a field table ({ field: { aliases, … } }). */
export function aliasesOf<F extends string>(fields: Record<F, { aliases: readonly string[] }>): Record<F, readonly string[]> {
  const out = {} as Record<F, readonly string[]>;
  for (const field of Object.keys(fields) as F[]) out[field] = fields[field].aliases;
  return out;
}

/** Match required fields to header columns by their aliases, then by a person's explicit mapping. */
export function matchColumns<F extends string>(
  header: readonly string[],
  aliases: Record<F, readonly string[]>,
  mapping: Record<string, string> | undefined,
): { index: Partial<Record<F, number>>; unmatchedHeaders: string[] } {
  const normalised = header.map(normaliseHeader);
  const index: Partial<Record<F, number>> = {};
  for (const field of Object.keys(aliases) as F[]) {
    const explicit = mapping?.[field];
    if (explicit !== undefined && explicit !== "") {
      const at = header.indexOf(explicit);
      if (at >= 0) index[field] = at;
      continue;
    }
    const at = normalised.findIndex((h) => aliases[field].includes(h));
    if (at >= 0) index[field] = at;
  }
  const used = new Set(Object.values(index) as number[]);
  return { index, unmatchedHeaders: header.filter((h, i) => h !== "" && !used.has(i)) };
}
