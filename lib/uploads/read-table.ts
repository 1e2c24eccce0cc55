/**
 * Read an uploaded file into a raw table: CSV (UTF-8 with or without BOM, or UTF-16; comma or semicolon, quoted fields) with
 * papaparse, or a workbook with xlsx-populate (formulas read as their stored values). The type is decided from
 * the bytes, not the file name.
 */
import Papa from "papaparse";
import XlsxPopulate from "xlsx-populate";
import { FileRejected, type RawTable } from "./types";
import { checkZipInflation } from "./zip-guard";

export type SniffedType = "csv" | "xlsx";

/** Decide what the bytes are; refuse what is neither a text table nor a workbook. */
export function sniffType(bytes: Uint8Array): SniffedType {
  if (bytes.length === 0) throw new FileRejected("The file is empty.");
  const head = bytes.subarray(0, 8);
  if (head[0] === 0x50 && head[1] === 0x4b && head[2] === 0x03 && head[3] === 0x04) return "xlsx";
  if (head[0] === 0x25 && head[1] === 0x50 && head[2] === 0x44 && head[3] === 0x46) {
    throw new FileRejected("This is a PDF document, not a CSV or XLSX file.");
  }
  if (head[0] === 0xd0 && head[1] === 0xcf && head[2] === 0x11 && head[3] === 0xe0) {
    throw new FileRejected("This is an old-format (.xls) workbook; save it as .xlsx or CSV and upload again.");
  }
  if (utf16Encoding(bytes)) return "csv";
  const sample = bytes.subarray(0, Math.min(bytes.length, 8192));
  if (sample.includes(0)) throw new FileRejected("This file is binary, not a CSV or XLSX file.");
  return "csv";
}

/**
 * Whether the bytes are UTF-16 text (spreadsheet programs save "Unicode text" so): a byte-order mark, or mostly
 * text whose every other byte is zero (the pattern of Latin text in UTF-16 without a mark).
 */
export function utf16Encoding(bytes: Uint8Array): "utf-16le" | "utf-16be" | null {
  if (bytes[0] === 0xff && bytes[1] === 0xfe) return "utf-16le";
  if (bytes[0] === 0xfe && bytes[1] === 0xff) return "utf-16be";
  const pairs = Math.floor(Math.min(bytes.length, 8192) / 2);
  if (pairs < 2) return null;
  let zeroOdd = 0;
  let zeroEven = 0;
  for (let i = 0; i < pairs; i++) {
    if (bytes[2 * i] === 0) zeroEven++;
    if (bytes[2 * i + 1] === 0) zeroOdd++;
  }
  if (zeroOdd / pairs > 0.6 && zeroEven / pairs < 0.05) return "utf-16le";
  if (zeroEven / pairs > 0.6 && zeroOdd / pairs < 0.05) return "utf-16be";
  return null;
}

/** Parse CSV text: delimiter detected among comma and semicolon; blank lines skipped. */
export function readCsvText(text: string): RawTable {
  const clean = text.replace(/^\uFEFF/, "");
  if (clean.trim() === "") throw new FileRejected("The file is empty.");
  const firstLine = clean.slice(0, clean.search(/\r?\n|$/));
  const delimiter = (firstLine.match(/;/g)?.length ?? 0) > (firstLine.match(/,/g)?.length ?? 0) ? ";" : ",";
  const parsed = Papa.parse<string[]>(clean, { delimiter, skipEmptyLines: "greedy" });
  const [header, ...rows] = parsed.data;
  if (!header) throw new FileRejected("The file is empty.");
  return { header: header.map((h) => String(h).trim()), rows, source: "csv" };
}

export { excelSerialToIso } from "./serial-date";

/** Read every sheet of a workbook as raw tables (first row as header), after the zip checks (declared and real sizes). */
export async function readWorkbook(bytes: Uint8Array): Promise<RawTable[]> {
  await checkZipInflation(bytes);
  let workbook: Awaited<ReturnType<typeof XlsxPopulate.fromDataAsync>>;
  try {
    workbook = await XlsxPopulate.fromDataAsync(Buffer.from(bytes));
  } catch {
    throw new FileRejected("The workbook could not be opened; it may be damaged or password-protected.");
  }
  const tables: RawTable[] = [];
  for (const sheet of workbook.sheets()) {
    const used = sheet.usedRange();
    if (!used) continue;
    const values = used.value() as unknown[][];
    const [header, ...rows] = values;
    if (!header) continue;
    tables.push({
      header: header.map((h) => (h === undefined || h === null ? "" : String(h).trim())),
      rows: rows.filter((r) => r.some((c) => c !== undefined && c !== null && String(c).trim() !== "")),
      source: `sheet "${sheet.name()}"`,
    });
  }
  return tables;
}

/** Read the uploaded bytes into candidate tables (one for CSV, one per sheet for a workbook). */
export async function readTables(bytes: Uint8Array): Promise<RawTable[]> {
  const type = sniffType(bytes);
  if (type === "xlsx") return readWorkbook(bytes);
  let text: string;
  const utf16 = utf16Encoding(bytes);
  if (utf16) {
    try {
      text = new TextDecoder(utf16, { fatal: true }).decode(bytes);
    } catch {
      throw new FileRejected("The file is UTF-16 text but part of it cannot be decoded; save it as CSV UTF-8 and upload again.");
    }
    return [readCsvText(text)];
  }
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new FileRejected("The file is not UTF-8 text; save it as CSV UTF-8 and upload again.");
  }
  return [readCsvText(text)];
}
