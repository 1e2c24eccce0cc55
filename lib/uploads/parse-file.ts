/**
 * A whole uploaded file, bytes to checked rows: read its tables, choose the one with the kind's columns, and parse
 * it. Pure (no database, no I/O): the caller gathers what the checks need from the firm (ParseFileContext), and it
 * runs either inline or in a thread of its own (parse-thread.ts) so that a worker's event loop keeps answering.
 */
import { readTables } from "./read-table";
import { chooseTable, parsePositions, POSITION_FIELDS, type PositionsParse } from "./parse-positions";
import { parsePrices, PRICE_FIELDS, type PricesParse } from "./parse-prices";
import type { StandardisedProfile } from "../risk/standardised";
import { FileRejected, type ParseProgress, type Problem, type ReadOptions } from "./types";

export type UploadKind = "positions" | "prices";

/** What a file became: checked positions, checked prices, or a file refused as a whole. */
export type ParsedUpload = ({ kind: "positions" } & PositionsParse) | ({ kind: "prices" } & PricesParse) | { kind: "rejected"; message: string; problems: Problem[] };

/** What the checks need to know about the firm and the period, gathered before parsing. */
export interface ParseFileContext {
  /** yyyy-mm-dd: the business today */
  today: string;
  reportingCurrency: string;
  periodEnd?: string;
  /** positions: units of reporting currency per unit of a currency, and the date of each rate */
  fxToReporting?: Record<string, number>;
  fxDates?: Record<string, string>;
  /** positions: the standardised rates when the firm files that figure */
  filedStandardisedProfile?: StandardisedProfile | null;
}

/** A file refused as a whole, as a parse result. */
export function rejected(message: string): ParsedUpload {
  return { kind: "rejected", message, problems: [{ row: null, field: null, severity: "error", message }] };
}

/** Parse the bytes of an uploaded file as `kind`, told of progress every PROGRESS_EVERY rows. */
export async function parseFile(bytes: Uint8Array, kind: UploadKind, options: ReadOptions, context: ParseFileContext, onProgress?: ParseProgress): Promise<ParsedUpload> {
  try {
    const tables = await readTables(bytes);
    const fields = kind === "positions" ? POSITION_FIELDS : PRICE_FIELDS;
    const table = chooseTable(tables, fields, options.mapping) ?? (tables.length === 1 && tables[0].source === "csv" ? tables[0] : null);
    if (!table) {
      const names = tables.map((t) => t.source).join(", ") || "none";
      return rejected(`No sheet of the workbook has the ${kind === "positions" ? "positions" : "price"} columns (sheets: ${names}).`);
    }
    if (kind === "positions") {
      return {
        kind,
        ...parsePositions(table, options, {
          today: context.today,
          reportingCurrency: context.reportingCurrency,
          periodEnd: context.periodEnd,
          fxToReporting: context.fxToReporting ?? {},
          fxDates: context.fxDates ?? {},
          filedStandardisedProfile: context.filedStandardisedProfile ?? null,
          onProgress,
        }),
      };
    }
    return { kind, ...parsePrices(table, options, { today: context.today, onProgress }) };
  } catch (error) {
    if (error instanceof FileRejected) return rejected(error.message);
    throw error;
  }
}
