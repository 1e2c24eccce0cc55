/**
 * Input and output helpers for the engine's command line: CSV files in, JSON out, one-line errors.
 * Not part of lib/risk: this is the I/O edge that hands the engine clean typed arrays.
 */
import { readFileSync, existsSync } from "node:fs";
import Papa from "papaparse";

/** An error the command line reports as one line and a non-zero exit. */
export class CliError extends Error {}

/** A parsed CSV table: trimmed header names and the data rows (1-based data row numbers are index + 2 in the file). */
export interface CsvTable {
  header: string[];
  rows: string[][];
}

/** Read a CSV file with a header row; throws CliError naming the file when it is missing or empty. */
export function readCsv(path: string | undefined, flag = "--input"): CsvTable {
  if (!path) throw new CliError(`missing ${flag} FILE.csv`);
  if (!existsSync(path)) throw new CliError(`${flag}: file not found: ${path}`);
  const text = readFileSync(path, "utf8").replace(/^\uFEFF/, "");
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: "greedy" });
  const [header, ...rows] = parsed.data;
  if (!header || header.length === 0) throw new CliError(`${flag}: ${path} is empty`);
  if (rows.length === 0) throw new CliError(`${flag}: ${path} has a header but no data rows`);
  return { header: header.map((h) => h.trim()), rows };
}

/** Parse a numeric cell, throwing a CliError that names the file row (header = row 1) and the column. */
export function parseNumber(cell: string | undefined, rowIndex: number, column: string): number {
  const value = Number((cell ?? "").trim());
  if ((cell ?? "").trim() === "" || !Number.isFinite(value)) {
    throw new CliError(`row ${rowIndex + 2}, column "${column}": "${cell ?? ""}" is not a number`);
  }
  return value;
}

/** Parsed `--flag value` options and bare `--switch` flags; unknown flags are refused by the caller. */
export type CliOptions = Record<string, string | true>;

/** Split argv into options; every token must be a --flag, optionally followed by a value. */
export function parseOptions(argv: readonly string[], known: readonly string[], switches: readonly string[] = []): CliOptions {
  const options: CliOptions = {};
  for (let i = 0; i < argv.length; i++) {
    const token = argv[i];
    if (!token.startsWith("--")) throw new CliError(`unexpected argument "${token}"`);
    const name = token.slice(2);
    if (switches.includes(name)) {
      options[name] = true;
      continue;
    }
    if (!known.includes(name)) throw new CliError(`unknown option --${name}`);
    const value = argv[i + 1];
    if (value === undefined || value.startsWith("--")) throw new CliError(`option --${name} needs a value`);
    options[name] = value;
    i++;
  }
  return options;
}

/** Print one JSON object on stdout. */
export function printJson(value: unknown): void {
  process.stdout.write(JSON.stringify(value, (_k, v) => (v instanceof Float64Array ? Array.from(v) : v), 2) + "\n");
}

/** One numeric column of a CSV table, with each value's file row number (header = row 1). */
export interface NumericColumn {
  name: string;
  values: number[];
  fileRows: number[];
}

/**
 * Pick a numeric column: the named one, or else the only or the last column whose first data cell is a number.
 * Every cell must parse; the error names the row and the column.
 */
export function readNumericColumn(table: CsvTable, column?: string): NumericColumn {
  let index: number;
  if (column !== undefined) {
    index = table.header.indexOf(column);
    if (index < 0) throw new CliError(`--column: no column "${column}" (columns: ${table.header.join(", ")})`);
  } else {
    const numeric = table.header.map((_, i) => i).filter((i) => {
      const cell = (table.rows[0][i] ?? "").trim();
      return cell !== "" && Number.isFinite(Number(cell));
    });
    if (numeric.length === 0) throw new CliError(`no numeric column (columns: ${table.header.join(", ")}); row 2 has no number`);
    index = numeric[numeric.length - 1];
  }
  const name = table.header[index];
  const values = table.rows.map((row, r) => parseNumber(row[index], r, name));
  return { name, values, fileRows: table.rows.map((_, r) => r + 2) };
}
