/**
 * Price history: long (date, instrument, close) or wide (date, then one column per instrument) tables to typed
 * points and every problem found. Exchange rates are instruments named by currency pair (e.g. USDEUR).
 * Pure: no database, no clock (today is passed in).
 */
import { z } from "zod";
import { aliasesOf, matchColumns, normaliseHeader, readDate, readNumber, readText } from "./cells";
import { figureOutOfBounds } from "./limits";
import { PROGRESS_EVERY, type ParseProgress, type Problem, type RawTable, type ReadOptions } from "./types";

export const PRICE_FIELDS = {
  date: { label: "date", required: true, aliases: ["date", "pricedate", "asof", "asofdate", "day"] },
  instrument: { label: "instrument", required: true, aliases: ["instrument", "instrumentid", "instrumentcode", "isin", "ticker", "code", "id", "pair"] },
  close: { label: "close", required: true, aliases: ["close", "price", "closeprice", "last", "rate", "value"] },
} as const;
export type PriceField = keyof typeof PRICE_FIELDS;

/** The most price points one file may hold. */
export const MAX_PRICE_POINTS = 2_000_000;

export const pricePointSchema = z.object({
  row: z.number().int(),
  date: z.string().regex(/^\d{4}-\d{2}-\d{2}$/),
  instrument: z.string().min(1, "is empty").max(64, "is longer than 64 characters"),
  close: z.number().finite().positive("must be above zero"),
});
export type PricePoint = z.infer<typeof pricePointSchema>;

export interface PricesParse {
  source: string;
  layout: "long" | "wide" | null;
  header: string[];
  missingColumns: PriceField[];
  points: PricePoint[];
  problems: Problem[];
  summary: { points: number; instruments: number; firstDate: string | null; lastDate: string | null; byInstrument: { instrument: string; points: number; first: string; last: string }[] };
}

function summarise(points: readonly PricePoint[]): PricesParse["summary"] {
  const by = new Map<string, { instrument: string; points: number; first: string; last: string }>();
  let first: string | null = null;
  let last: string | null = null;
  for (const p of points) {
    const s = by.get(p.instrument) ?? { instrument: p.instrument, points: 0, first: p.date, last: p.date };
    s.points++;
    if (p.date < s.first) s.first = p.date;
    if (p.date > s.last) s.last = p.date;
    by.set(p.instrument, s);
    if (first === null || p.date < first) first = p.date;
    if (last === null || p.date > last) last = p.date;
  }
  return { points: points.length, instruments: by.size, firstDate: first, lastDate: last, byInstrument: [...by.values()].sort((a, b) => a.instrument.localeCompare(b.instrument)) };
}

/** Long when the header names an instrument column and a close column; wide when it starts with a date column. */
export function detectPriceLayout(header: readonly string[], mapping?: Record<string, string>): "long" | "wide" | null {
  const aliases = aliasesOf<PriceField>(PRICE_FIELDS);
  const { index } = matchColumns(header, aliases, mapping);
  if (index.date !== undefined && index.instrument !== undefined && index.close !== undefined) return "long";
  if (index.date !== undefined && header.length >= 2) return "wide";
  return null;
}

/** Parse and validate a price table (long or wide). */
export function parsePrices(table: RawTable, options: ReadOptions, context: { today: string; onProgress?: ParseProgress }): PricesParse {
  const problems: Problem[] = [];
  const points: PricePoint[] = [];
  const layout = detectPriceLayout(table.header, options.mapping);
  const base = { source: table.source, layout, header: table.header, problems, points };
  if (!layout) {
    problems.push({ row: 1, field: null, severity: "error", message: "Missing required columns: a date column, then either instrument and close (long layout) or one column per instrument (wide layout)." });
    return { ...base, missingColumns: ["date"], summary: summarise([]) };
  }
  if (table.rows.length === 0) {
    problems.push({ row: null, field: null, severity: "error", message: "The file has a header but no price rows." });
    return { ...base, missingColumns: [], summary: summarise([]) };
  }
  const aliases = aliasesOf<PriceField>(PRICE_FIELDS);
  const { index } = matchColumns(table.header, aliases, options.mapping);
  const dateIndex = index.date!;
  const seen = new Map<string, number>();

  // Dates repeat on every row of a long file: read each distinct date cell once.
  const dateCache = new Map<unknown, ReturnType<typeof readDate>>();
  const dateOf = (cell: unknown) => {
    let value = dateCache.get(cell);
    if (!value) dateCache.set(cell, (value = readDate(cell, options.dateFormat)));
    return value;
  };
  const accept = (row: number, dateCell: unknown, instrument: string, closeCell: unknown, field: string) => {
    if ((closeCell === undefined || closeCell === null || String(closeCell).trim() === "") && layout === "wide") return; // no price that day
    const date = dateOf(dateCell);
    const close = readNumber(closeCell, options.numberFormat);
    let bad = false;
    if ("error" in date) {
      problems.push({ row, field: "date", severity: "error", message: `date ${date.error}` });
      bad = true;
    } else if (date.value > context.today) {
      problems.push({ row, field: "date", severity: "error", message: `date ${date.value} is in the future` });
      bad = true;
    }
    if ("error" in close) {
      problems.push({ row, field, severity: "error", message: `close ${close.error}` });
      bad = true;
    } else if (figureOutOfBounds("close", close.value)) {
      problems.push({ row, field, severity: "error", message: figureOutOfBounds("close", close.value)! });
      bad = true;
    }
    if (bad || "error" in date || "error" in close) return;
    const checked = pricePointSchema.safeParse({ row, date: date.value, instrument, close: close.value });
    if (!checked.success) {
      for (const issue of checked.error.issues) {
        const name = String(issue.path[0]);
        problems.push({ row, field: name === "close" ? field : name, severity: "error", message: `${name} ${name === "close" ? close.value + " " : ""}${issue.message}` });
      }
      return;
    }
    const key = `${instrument}\u0000${date.value}`;
    const first = seen.get(key);
    if (first !== undefined) {
      problems.push({ row, field: "date", severity: "error", message: `duplicate date: ${instrument} on ${date.value} already appears on row ${first}` });
      return;
    }
    seen.set(key, row);
    points.push(checked.data);
  };

  let total = 0;
  if (layout === "long") {
    total = table.rows.length;
    if (total > MAX_PRICE_POINTS) {
      problems.push({ row: null, field: null, severity: "error", message: `The file has ${total.toLocaleString("en")} rows; a price file may hold at most ${MAX_PRICE_POINTS.toLocaleString("en")}.` });
      return { ...base, missingColumns: [], summary: summarise([]) };
    }
    table.rows.forEach((raw, i) => {
      accept(i + 2, raw[dateIndex], readText(raw[index.instrument!]).toUpperCase(), raw[index.close!], "close");
      if ((i + 1) % PROGRESS_EVERY === 0) context.onProgress?.(i + 1, total);
    });
  } else {
    const columns = table.header.map((h, i) => ({ name: h.trim(), i })).filter((c) => c.i !== dateIndex && c.name !== "");
    total = columns.length * table.rows.length;
    if (total > MAX_PRICE_POINTS) {
      problems.push({ row: null, field: null, severity: "error", message: `The file holds ${total.toLocaleString("en")} prices; a price file may hold at most ${MAX_PRICE_POINTS.toLocaleString("en")}.` });
      return { ...base, missingColumns: [], summary: summarise([]) };
    }
    const dupHeaders = columns.filter((c, k) => columns.findIndex((d) => normaliseHeader(d.name) === normaliseHeader(c.name)) !== k);
    for (const c of dupHeaders) problems.push({ row: 1, field: c.name, severity: "error", message: `instrument column "${c.name}" appears twice` });
    const rowsPerReport = Math.max(1, Math.ceil(PROGRESS_EVERY / Math.max(1, columns.length)));
    table.rows.forEach((raw, i) => {
      for (const c of columns) accept(i + 2, raw[dateIndex], c.name.toUpperCase(), raw[c.i], c.name);
      if ((i + 1) % rowsPerReport === 0) context.onProgress?.((i + 1) * columns.length, total);
    });
  }
  context.onProgress?.(total, total);
  return { ...base, missingColumns: [], summary: summarise(points) };
}
