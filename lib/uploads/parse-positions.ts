/**
 * Month-end positions: from a raw table to typed rows and every problem found (never only the first).
 * Pure: no database, no clock (today is passed in).
 */
import { z } from "zod";
import { aliasesOf, isIsoCurrency, matchColumns, readDate, readNumber, readText } from "./cells";
import { figureOutOfBounds } from "./limits";
import { ASSET_CLASSES, parseAssetClass } from "./asset-classes";
import { PROGRESS_EVERY, type ParseProgress, type Problem, type RawTable, type ReadOptions } from "./types";
import type { StandardisedProfile } from "@/lib/risk/standardised";
import { POSITION_ATTRIBUTE_FIELDS, positionAttributesSchema, readPositionAttributes, standardisedRequirementProblems } from "./position-attributes";
import { defaultFxFactorId } from "@/lib/risk/portfolio/exposures";

export const POSITION_FIELDS = {
  asOf: { label: "as-of date", required: true, aliases: ["asof", "asofdate", "date", "positiondate", "valuationdate"] },
  book: { label: "book / account", required: true, aliases: ["book", "account", "bookaccount", "portfolio"] },
  instrument: { label: "instrument id", required: true, aliases: ["instrumentid", "instrument", "instrumentcode", "isin", "ticker", "code", "id"] },
  instrumentName: { label: "instrument name", required: true, aliases: ["instrumentname", "name", "description"] },
  assetClass: { label: "asset class", required: true, aliases: ["assetclass", "class", "assettype"] },
  currency: { label: "currency", required: true, aliases: ["currency", "ccy", "curr"] },
  quantity: { label: "quantity", required: true, aliases: ["quantity", "qty", "units", "nominal", "holding"] },
  price: { label: "price", required: true, aliases: ["price", "close", "lastprice", "unitprice"] },
  marketValue: { label: "market value", required: false, aliases: ["marketvalue", "mv", "value", "marketvaluereporting"] },
  deltaExposure: { label: "delta-equivalent exposure", required: false, aliases: ["deltaequivalentexposure", "deltaexposure", "delta", "deltaequivalent"] },
  marketValueCurrency: { label: "market value currency", required: false, aliases: ["marketvaluecurrency", "mvcurrency", "mvccy", "valuecurrency", "marketvalueccy"] },
  marketValueNote: { label: "market value note", required: false, aliases: ["marketvaluenote", "mvnote", "valuenote", "marketvaluereason", "valuereason"] },
  // optional columns the standardised building blocks read (lib/uploads/position-attributes.ts)
  ...POSITION_ATTRIBUTE_FIELDS,
} as const;
export type PositionField = keyof typeof POSITION_FIELDS;
export const REQUIRED_POSITION_FIELDS = (Object.keys(POSITION_FIELDS) as PositionField[]).filter((f) => POSITION_FIELDS[f].required);

/** The most rows one positions file may hold. */
export const MAX_POSITION_ROWS = 250_000;

/** One position as validated. */
export const positionRowSchema = z.object({
  row: z.number().int(),
  asOf: z.string().regex(/^\d{4}-\d{2}-\d{2}$/),
  book: z.string().min(1, "is empty").max(120, "is longer than 120 characters"),
  instrument: z.string().min(1, "is empty").max(64, "is longer than 64 characters"),
  instrumentName: z.string().min(1, "is empty").max(200, "is longer than 200 characters"),
  assetClass: z.enum(ASSET_CLASSES),
  currency: z.string().refine(isIsoCurrency, "is not an ISO 4217 currency code"),
  quantity: z.number().finite(),
  price: z.number().positive("must be above zero"),
  marketValue: z.number().finite(),
  marketValueGiven: z.boolean(),
  deltaExposure: z.number().finite().nullable(),
  /** the standardised attributes the file gives (absent when it gives none) */
  attributes: positionAttributesSchema.optional(),
});
export type PositionRow = z.infer<typeof positionRowSchema>;

export interface PositionTotals {
  positions: number;
  grossMarketValue: number;
  netMarketValue: number;
  byAssetClass: { key: string; count: number; gross: number; net: number }[];
  byCurrency: { key: string; count: number; gross: number; net: number }[];
}

export interface PositionsParse {
  source: string;
  header: string[];
  /** required fields the header did not supply (a mapping step can fix these) */
  missingColumns: PositionField[];
  unmatchedHeaders: string[];
  rows: PositionRow[];
  problems: Problem[];
  totals: PositionTotals;
  /** the exchange rates the file's rows were converted or checked with */
  rates?: RateUsed[];
}

export interface PositionParseContext {
  /** yyyy-mm-dd: no as-of date may be after it */
  today: string;
  reportingCurrency: string;
  /** the period end the file is for; as-of dates before it in the same month are warned about, outside the month refused */
  periodEnd?: string;
  /** units of reporting currency per unit of the row's currency, for the market value cross-check */
  fxToReporting?: Record<string, number>;
  /** relative tolerance of the quantity × price cross-check */
  tolerance?: number;
  /** the date of each rate in fxToReporting; a rate older than the period's last weekday makes the cross-check indicative */
  fxDates?: Record<string, string>;
  /** set when the firm's capital rule profile files the standardised figure (its rates): a position lacking an attribute its blocks need is an error */
  filedStandardisedProfile?: StandardisedProfile | null;
  /** told how many rows are checked so far (lib/uploads/types.ts ParseProgress) */
  onProgress?: ParseProgress;
}

/** Relative tolerance of the market value cross-check, unless the caller states another: 0.5 % (and at least 1 unit). */
export const MARKET_VALUE_TOLERANCE = 0.005;
/**
 * Against a rate from before the period's last weekday (the series is not loaded to the period end yet), a difference
 * beyond the tolerance is only a warning, up to this much: beyond it the value cannot be a month's currency move.
 */
export const EARLIER_RATE_TOLERANCE = 0.1;

/** An exchange rate a positions file was read with. */
export interface RateUsed {
  currency: string;
  pair: string;
  rate: number;
  /** the date of the close used, when known */
  date: string | null;
  /** false when the rate series stops before the period's last weekday */
  periodEnd: boolean;
}

/** The last Monday-to-Friday day on or before a yyyy-mm-dd date. */
export function lastWeekdayOnOrBefore(date: string): string {
  const d = new Date(`${date}T00:00:00Z`);
  while (d.getUTCDay() === 0 || d.getUTCDay() === 6) d.setUTCDate(d.getUTCDate() - 1);
  return d.toISOString().slice(0, 10);
}

/** The first day of the month a period end closes, yyyy-mm-dd. */
export function periodStartOf(periodEnd: string): string {
  return `${periodEnd.slice(0, 8)}01`;
}

/** The row's attributes when the file gave any (left out otherwise, so a row without them reads as before). */
function attributesOf(attributes: PositionRow["attributes"]): { attributes?: PositionRow["attributes"] } {
  return attributes && Object.keys(attributes).length > 0 ? { attributes } : {};
}

/** Totals by asset class and by currency. */
export function positionTotals(rows: readonly PositionRow[]): PositionTotals {
  const group = (key: (r: PositionRow) => string) => {
    const map = new Map<string, { key: string; count: number; gross: number; net: number }>();
    for (const r of rows) {
      const k = key(r);
      const g = map.get(k) ?? { key: k, count: 0, gross: 0, net: 0 };
      g.count++;
      g.gross += Math.abs(r.marketValue);
      g.net += r.marketValue;
      map.set(k, g);
    }
    return [...map.values()].sort((a, b) => b.gross - a.gross);
  };
  return {
    positions: rows.length,
    grossMarketValue: rows.reduce((s, r) => s + Math.abs(r.marketValue), 0),
    netMarketValue: rows.reduce((s, r) => s + r.marketValue, 0),
    byAssetClass: group((r) => r.assetClass),
    byCurrency: group((r) => r.currency),
  };
}

/** Pick the table (CSV, or the workbook sheet) whose header matches the most required fields. */
export function chooseTable(tables: readonly RawTable[], fields: Record<string, { aliases: readonly string[]; required: boolean }>, mapping?: Record<string, string>): RawTable | null {
  let best: RawTable | null = null;
  let bestScore = -1;
  for (const table of tables) {
    const { index } = matchColumns(table.header, Object.fromEntries(Object.entries(fields).map(([k, v]) => [k, v.aliases])), mapping);
    const score = Object.keys(fields).filter((f) => fields[f].required && index[f as never] !== undefined).length;
    if (score > bestScore) {
      best = table;
      bestScore = score;
    }
  }
  return bestScore > 0 ? best : null;
}

/** Parse and validate a positions table. */
export function parsePositions(table: RawTable, options: ReadOptions, context: PositionParseContext): PositionsParse {
  const aliases = aliasesOf<PositionField>(POSITION_FIELDS);
  const { index, unmatchedHeaders } = matchColumns(table.header, aliases, options.mapping);
  const missingColumns = REQUIRED_POSITION_FIELDS.filter((f) => index[f] === undefined);
  const problems: Problem[] = [];
  const rows: PositionRow[] = [];
  const empty = { source: table.source, header: table.header, unmatchedHeaders, rows, problems, totals: positionTotals([]) };

  if (missingColumns.length > 0) {
    problems.push({
      row: 1,
      field: null,
      severity: "error",
      message: `Missing required column${missingColumns.length > 1 ? "s" : ""}: ${missingColumns.map((f) => POSITION_FIELDS[f].label).join(", ")}. Map them to the file's columns, or fix the header.`,
    });
    return { ...empty, missingColumns };
  }
  if (table.rows.length === 0) {
    problems.push({ row: null, field: null, severity: "error", message: "The file has a header but no position rows." });
    return { ...empty, missingColumns };
  }
  if (table.rows.length > MAX_POSITION_ROWS) {
    problems.push({ row: null, field: null, severity: "error", message: `The file has ${table.rows.length.toLocaleString("en")} rows; a positions file may hold at most ${MAX_POSITION_ROWS.toLocaleString("en")}.` });
    return { ...empty, missingColumns };
  }

  const tolerance = context.tolerance ?? MARKET_VALUE_TOLERANCE;
  const seen = new Map<string, number>();
  const cell = (raw: unknown[], field: PositionField) => (index[field] === undefined ? undefined : raw[index[field]!]);

  table.rows.forEach((raw, i) => {
    const row = i + 2;
    const rowProblems: Problem[] = [];
    const fail = (field: PositionField, message: string) => rowProblems.push({ row, field: POSITION_FIELDS[field].label, message, severity: "error" });

    const asOf = readDate(cell(raw, "asOf"), options.dateFormat);
    if ("error" in asOf) fail("asOf", `as-of date ${asOf.error}${asOf.error.includes("is not a date as") ? " (choose the date format that matches the file)" : ""}`);
    else if (asOf.value > context.today) fail("asOf", `as-of date ${asOf.value} is in the future`);
    else if (context.periodEnd && (asOf.value > context.periodEnd || asOf.value < periodStartOf(context.periodEnd))) {
      fail("asOf", `as-of date ${asOf.value} is outside the period ${periodStartOf(context.periodEnd)} to ${context.periodEnd}: upload it to the period it belongs to`);
    } else if (context.periodEnd && asOf.value !== context.periodEnd) {
      rowProblems.push({ row, field: POSITION_FIELDS.asOf.label, severity: "warning", message: `as-of date ${asOf.value} is not the period end ${context.periodEnd}` });
    }

    const assetText = readText(cell(raw, "assetClass"));
    const assetClass = parseAssetClass(assetText);
    if (!assetClass) fail("assetClass", assetText ? `"${assetText}" is not an asset class Ballast knows (${ASSET_CLASSES.join(", ")}; the Data page lists every accepted spelling)` : "asset class is empty");

    const currency = readText(cell(raw, "currency")).toUpperCase();
    const numbers: Partial<Record<"quantity" | "price" | "marketValue" | "deltaExposure", number | null>> = {};
    for (const field of ["quantity", "price", "marketValue", "deltaExposure"] as const) {
      const value = cell(raw, field);
      const optional = !POSITION_FIELDS[field].required;
      if (optional && (value === undefined || value === null || String(value).trim() === "")) {
        numbers[field] = null;
        continue;
      }
      const parsed = readNumber(value, options.numberFormat);
      if ("error" in parsed) fail(field, `${POSITION_FIELDS[field].label} ${parsed.error}`);
      else if (figureOutOfBounds(POSITION_FIELDS[field].label, parsed.value)) fail(field, figureOutOfBounds(POSITION_FIELDS[field].label, parsed.value)!);
      else numbers[field] = parsed.value;
    }

    const rateOf = (ccy: string) => (ccy === context.reportingCurrency ? 1 : context.fxToReporting?.[ccy]);
    const fx = rateOf(currency);
    const pair = defaultFxFactorId(currency, context.reportingCurrency);
    const note = readText(cell(raw, "marketValueNote")).slice(0, 500);
    const valueCurrency = readText(cell(raw, "marketValueCurrency")).toUpperCase();
    if (fx === undefined && isIsoCurrency(currency)) {
      const load = `load its price history (instrument ${pair}, the price of one ${currency} in ${context.reportingCurrency}) before confirming`;
      const valuedInReporting = numbers.marketValue != null && (valueCurrency === "" || valueCurrency === context.reportingCurrency);
      if (valuedInReporting && note) {
        rowProblems.push({
          row,
          field: POSITION_FIELDS.currency.label,
          severity: "warning",
          message: `currency ${currency} has no ${pair} exchange-rate series up to ${context.periodEnd ?? context.today}: the market value is kept as given in ${context.reportingCurrency} because: ${note}; the run leaves this position's currency risk out until you ${load.replace(" before confirming", "")}`,
        });
      } else {
        fail("currency", `currency ${currency} has no ${pair} exchange-rate series up to ${context.periodEnd ?? context.today}: ${load} (or give the market value in ${context.reportingCurrency} and say where its rate came from in a market_value_note column)`);
      }
    }
    // A market value in another currency than the reporting one is converted at the period-end rate.
    let givenValue = numbers.marketValue ?? null;
    if (givenValue != null && valueCurrency !== "" && valueCurrency !== context.reportingCurrency) {
      const rate = isIsoCurrency(valueCurrency) ? rateOf(valueCurrency) : undefined;
      if (!isIsoCurrency(valueCurrency)) fail("marketValueCurrency", `market value currency "${valueCurrency}" is not an ISO 4217 currency code`);
      else if (rate === undefined) fail("marketValueCurrency", `market value currency ${valueCurrency} has no ${valueCurrency}${context.reportingCurrency} exchange-rate series to convert it with`);
      else givenValue = givenValue * rate;
    }
    // A market value without its currency is read in the reporting currency, and cross-checked below.
    const computed = numbers.quantity != null && numbers.price != null && fx !== undefined ? numbers.quantity * numbers.price * fx : null;
    const candidate = {
      row,
      asOf: "value" in asOf ? asOf.value : "",
      book: readText(cell(raw, "book")),
      instrument: readText(cell(raw, "instrument")),
      instrumentName: readText(cell(raw, "instrumentName")),
      assetClass: assetClass ?? "other",
      currency,
      quantity: numbers.quantity ?? 0,
      price: numbers.price ?? 0,
      marketValue: givenValue ?? computed ?? 0,
      marketValueGiven: numbers.marketValue != null,
      deltaExposure: numbers.deltaExposure ?? null,
      ...attributesOf(readPositionAttributes((f) => cell(raw, f), options, (f, message) => fail(f, message))),
    };

    const checked = positionRowSchema.safeParse(candidate);
    if (!checked.success) {
      for (const issue of checked.error.issues) {
        const field = issue.path[0] as PositionField;
        if (rowProblems.some((p) => p.field === POSITION_FIELDS[field]?.label)) continue; // already explained
        const label = POSITION_FIELDS[field]?.label ?? String(field);
        const shown = field === "currency" ? `"${currency}" ` : "";
        fail(field, `${label} ${shown}${issue.message}`.replace(/\s+/g, " "));
      }
    }

    if (checked.success) {
      const key = `${candidate.book}\u0000${candidate.instrument}`;
      const first = seen.get(key);
      if (first !== undefined) {
        fail("instrument", `duplicate position: book "${candidate.book}" and instrument "${candidate.instrument}" already appear on row ${first}`);
      } else seen.set(key, row);
      if (givenValue != null && computed !== null) {
        const gap = Math.abs(givenValue - computed);
        const usedRates = [currency, valueCurrency].filter((c) => c && c !== context.reportingCurrency);
        const earlier = usedRates.map((c) => context.fxDates?.[c]).find((d) => d && context.periodEnd && d < lastWeekdayOnOrBefore(context.periodEnd));
        // a value equal to quantity × price in the row's own currency was written in that currency (unless the rate is
        // about 1, when it makes no difference): refused whatever the rate's date
        const local = numbers.quantity! * numbers.price!;
        const looksLocal = currency !== context.reportingCurrency && !valueCurrency && fx !== undefined && Math.abs(fx - 1) > tolerance && Math.abs(numbers.marketValue! - local) <= Math.max(1, tolerance * Math.abs(local));
        if (earlier && !looksLocal && gap > Math.max(1, tolerance * Math.abs(computed)) && gap <= EARLIER_RATE_TOLERANCE * Math.abs(computed)) {
          rowProblems.push({
            row,
            field: POSITION_FIELDS.marketValue.label,
            severity: "warning",
            message: `market value ${numbers.marketValue} differs from quantity × price × ${pair} rate ${fx} = ${computed.toFixed(2)} ${context.reportingCurrency} by more than ${(tolerance * 100).toFixed(1)} %, but that rate is of ${earlier}, before the period end: load the exchange rates to ${context.periodEnd} to check it`,
          });
        } else if (gap > Math.max(1, tolerance * Math.abs(computed))) {
          const shown = valueCurrency && valueCurrency !== context.reportingCurrency ? `${numbers.marketValue} ${valueCurrency} (${givenValue.toFixed(2)} ${context.reportingCurrency})` : `${numbers.marketValue}`;
          const against = `quantity × price${fx !== 1 ? ` × ${pair} rate ${fx}` : ""} = ${computed.toFixed(2)} ${context.reportingCurrency}`;
          const fix = looksLocal
            ? `; it looks like a value in ${currency}: add a market_value_currency column saying ${currency}, or leave market value empty to compute it`
            : ". Correct it, leave it empty to compute it, or say why in a market_value_note column";
          rowProblems.push({
            row,
            field: POSITION_FIELDS.marketValue.label,
            severity: note ? "warning" : "error",
            message: note
              ? `market value ${shown} differs from ${against} by more than ${(tolerance * 100).toFixed(1)} %; kept as given because: ${note}`
              : `market value ${shown} differs from ${against} by more than ${(tolerance * 100).toFixed(1)} %${fix}`,
          });
        }
      }
    }

    problems.push(...rowProblems);
    if (checked.success && !rowProblems.some((p) => p.severity === "error")) rows.push(checked.data);
    if ((i + 1) % PROGRESS_EVERY === 0) context.onProgress?.(i + 1, table.rows.length);
  });
  context.onProgress?.(table.rows.length, table.rows.length);

  if (context.filedStandardisedProfile && rows.length > 0) {
    // The filed standardised figure needs each position's attributes: a lacking one refuses its row, before confirmation.
    const needed = standardisedRequirementProblems(rows, { reportingCurrency: context.reportingCurrency, asOf: context.periodEnd ?? context.today, profile: context.filedStandardisedProfile });
    if (needed.length > 0) {
      problems.push(...needed);
      const refused = new Set(needed.map((p) => p.row));
      const kept = rows.filter((r) => !refused.has(r.row));
      return { ...empty, missingColumns, rows: kept, problems, totals: positionTotals(kept) };
    }
  }
  const rates: RateUsed[] = [...new Set(rows.map((r) => r.currency).filter((c) => c !== context.reportingCurrency && context.fxToReporting?.[c] !== undefined))]
    .sort()
    .map((c) => {
      const date = context.fxDates?.[c] ?? null;
      return { currency: c, pair: defaultFxFactorId(c, context.reportingCurrency), rate: context.fxToReporting![c], date, periodEnd: !(date && context.periodEnd && date < lastWeekdayOnOrBefore(context.periodEnd)) };
    });
  return { ...empty, missingColumns, rows, problems, totals: positionTotals(rows), rates };
}
