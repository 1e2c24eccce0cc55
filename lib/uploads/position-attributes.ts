/**
 * The positions file's optional columns the standardised building blocks read (instrument type, issuer category,
 * maturity, coupon, reset, duration, national market, commodity, derivative legs, option terms): their headers,
 * reading one row's cells, and the check that a firm filing the standardised figure gives every attribute its
 * positions need (an error naming the row and the column, before confirmation). Pure.
 */
import { z } from "zod";
import { readDate, readNumber, readText } from "./cells";
import type { Problem, ReadOptions } from "./types";
import {
  INSTRUMENT_TYPES,
  ISSUER_CATEGORIES,
  POSITION_COLUMNS,
  validateStandardisedPositions,
  type InstrumentType,
  type StandardisedPosition,
  type StandardisedProfile,
} from "@/lib/risk/standardised";

/** The optional attribute columns, with the header spellings accepted (compared like every header). */
export const POSITION_ATTRIBUTE_FIELDS = {
  instrumentType: { label: "instrument type", required: false, aliases: ["instrumenttype", "instrtype", "securitytype", "producttype"] },
  issuerCategory: { label: "issuer category", required: false, aliases: ["issuercategory", "issuertype", "issuer"] },
  maturityDate: { label: "maturity date", required: false, aliases: ["maturitydate", "maturity", "expiry", "expirydate", "deliverydate"] },
  residualMaturityYears: { label: "residual maturity (years)", required: false, aliases: ["residualmaturityyears", "residualmaturity", "yearstomaturity"] },
  coupon: { label: "coupon (%)", required: false, aliases: ["coupon", "couponrate", "couponpercent", "fixedrate"] },
  nextResetDate: { label: "next reset date", required: false, aliases: ["nextresetdate", "resetdate", "nextreset"] },
  nextResetYears: { label: "next reset (years)", required: false, aliases: ["nextresetyears", "yearstoreset"] },
  modifiedDuration: { label: "modified duration", required: false, aliases: ["modifiedduration", "duration", "modduration"] },
  nationalMarket: { label: "national market", required: false, aliases: ["nationalmarket", "market", "exchangecountry", "listingmarket"] },
  commodity: { label: "commodity", required: false, aliases: ["commodity", "commodityname"] },
  notional: { label: "notional", required: false, aliases: ["notional", "notionalamount", "notionalreporting"] },
  underlyingMaturityYears: { label: "underlying maturity (years)", required: false, aliases: ["underlyingmaturityyears", "deliverablematurityyears", "underlyingmaturity"] },
  underlying: { label: "underlying", required: false, aliases: ["underlying", "underlyinginstrument", "underlyingid"] },
  optionKind: { label: "option kind", required: false, aliases: ["optionkind", "optiontype", "callput", "putcall"] },
  strike: { label: "strike", required: false, aliases: ["strike", "strikeprice"] },
  underlyingPrice: { label: "underlying price", required: false, aliases: ["underlyingprice", "underlyingspot"] },
} as const;
export type PositionAttributeField = keyof typeof POSITION_ATTRIBUTE_FIELDS;
export const POSITION_ATTRIBUTE_KEYS = Object.keys(POSITION_ATTRIBUTE_FIELDS) as PositionAttributeField[];

/** A position's attributes as read (only the ones the file gives). */
export const positionAttributesSchema = z
  .object({
    instrumentType: z.enum(INSTRUMENT_TYPES),
    issuerCategory: z.enum(ISSUER_CATEGORIES),
    maturityDate: z.string().regex(/^\d{4}-\d{2}-\d{2}$/),
    residualMaturityYears: z.number().finite().min(0),
    coupon: z.number().finite().min(0).max(100),
    nextResetDate: z.string().regex(/^\d{4}-\d{2}-\d{2}$/),
    nextResetYears: z.number().finite().min(0),
    modifiedDuration: z.number().finite().min(0),
    nationalMarket: z.string().min(1).max(40),
    commodity: z.string().min(1).max(60),
    notional: z.number().finite(),
    underlyingMaturityYears: z.number().finite().min(0),
    underlying: z.string().min(1).max(64),
    optionKind: z.enum(["call", "put"]),
    strike: z.number().finite().positive(),
    underlyingPrice: z.number().finite().positive(),
  })
  .partial();
export type PositionAttributes = z.infer<typeof positionAttributesSchema>;

const TEXT_FIELDS = new Set<PositionAttributeField>(["nationalMarket", "commodity", "underlying"]);
const DATE_FIELDS = new Set<PositionAttributeField>(["maturityDate", "nextResetDate"]);
const NUMBER_LIMITS: Partial<Record<PositionAttributeField, { min?: number; max?: number; positive?: boolean }>> = {
  residualMaturityYears: { min: 0, max: 100 },
  coupon: { min: 0, max: 100 },
  nextResetYears: { min: 0, max: 100 },
  modifiedDuration: { min: 0, max: 100 },
  notional: {},
  underlyingMaturityYears: { min: 0, max: 100 },
  strike: { positive: true },
  underlyingPrice: { positive: true },
};

/** The file's column name (snake case) of an attribute, as the template and the error messages write it. */
export function attributeColumn(field: PositionAttributeField): string {
  return POSITION_COLUMNS[field] ?? field;
}

/**
 * Read one row's attribute cells. `cell` gives the raw cell of a field (undefined when the file has no such column);
 * `fail` records an error naming the field. Empty cells are simply absent.
 */
export function readPositionAttributes(
  cell: (field: PositionAttributeField) => unknown,
  options: Pick<ReadOptions, "numberFormat" | "dateFormat">,
  fail: (field: PositionAttributeField, message: string) => void,
): PositionAttributes {
  const out: PositionAttributes = {};
  const set = <K extends PositionAttributeField>(k: K, v: PositionAttributes[K]) => {
    out[k] = v;
  };
  for (const field of POSITION_ATTRIBUTE_KEYS) {
    const raw = cell(field);
    const text = readText(raw);
    if (raw === undefined || raw === null || text === "") continue;
    const label = POSITION_ATTRIBUTE_FIELDS[field].label;
    if (field === "instrumentType") {
      const value = text.toLowerCase().replace(/[\s_-]+/g, "");
      const known = INSTRUMENT_TYPES.find((t) => t === value || (value === "etf" && t === "fund") || (value === "cash" && t === "currency") || (value === "fxforward" && t === "currency"));
      if (known) set(field, known as InstrumentType);
      else fail(field, `instrument type "${text}" is not one Ballast knows (${INSTRUMENT_TYPES.join(", ")})`);
    } else if (field === "issuerCategory") {
      const value = text.toLowerCase();
      const known = ISSUER_CATEGORIES.find((c) => c === value || (value === "govt" && c === "government") || (value === "sovereign" && c === "government"));
      if (known) set(field, known);
      else fail(field, `issuer category "${text}" is not one of ${ISSUER_CATEGORIES.join(", ")}`);
    } else if (field === "optionKind") {
      const value = text.toLowerCase();
      if (value === "call" || value === "c") set(field, "call");
      else if (value === "put" || value === "p") set(field, "put");
      else fail(field, `option kind "${text}" is not call or put`);
    } else if (DATE_FIELDS.has(field)) {
      const date = readDate(raw, options.dateFormat);
      if ("error" in date) fail(field, `${label} ${date.error}`);
      else set(field as "maturityDate" | "nextResetDate", date.value);
    } else if (TEXT_FIELDS.has(field)) {
      const max = field === "commodity" ? 60 : field === "underlying" ? 64 : 40;
      if (text.length > max) fail(field, `${label} is longer than ${max} characters`);
      else set(field as "nationalMarket" | "commodity" | "underlying", field === "nationalMarket" ? text.toUpperCase() : text);
    } else {
      const parsed = readNumber(raw, options.numberFormat);
      const limits = NUMBER_LIMITS[field] ?? {};
      if ("error" in parsed) fail(field, `${label} ${parsed.error}`);
      else if (limits.positive && !(parsed.value > 0)) fail(field, `${label} must be above zero`);
      else if (limits.min !== undefined && parsed.value < limits.min) fail(field, `${label} cannot be below ${limits.min}`);
      else if (limits.max !== undefined && parsed.value > limits.max) fail(field, `${label} is above ${limits.max}`);
      else set(field as "coupon", parsed.value);
    }
  }
  return out;
}

/** The instrument type a position is read as when its file gives none: from its asset class where that is plain. */
export function defaultInstrumentType(assetClass: string): InstrumentType | null {
  switch (assetClass) {
    case "equity":
      return "equity";
    case "etf":
      return "fund";
    case "government_bond":
    case "corporate_bond":
      return "bond";
    case "commodity_future":
      return "future";
    case "fx":
      return "currency";
    default:
      return null;
  }
}

/** What the blocks need of a position: the stored or parsed row's own fields and its attributes. */
export interface PositionForBlocks {
  instrument: string;
  assetClass: string;
  currency: string;
  quantity: number;
  marketValue: number;
  attributes?: PositionAttributes;
}

/**
 * The standardised engine's position for one row (instrument type from the asset class where the file gave none).
 * A currency position held on its exchange-rate series (instrument USDEUR in a EUR firm, priced in EUR) is a position
 * in the pair's first currency.
 */
export function standardisedPositionOf(p: PositionForBlocks, reportingCurrency?: string): StandardisedPosition {
  const a = p.attributes ?? {};
  const instrumentType = a.instrumentType ?? defaultInstrumentType(p.assetClass);
  const onRateSeries = instrumentType === "currency" && reportingCurrency !== undefined && p.currency === reportingCurrency && new RegExp(`^[A-Z]{3}${reportingCurrency}$`).test(p.instrument);
  const out: StandardisedPosition = {
    instrument: p.instrument,
    assetClass: p.assetClass,
    instrumentType: (instrumentType ?? "") as InstrumentType,
    marketValue: p.marketValue,
    currency: onRateSeries ? p.instrument.slice(0, 3) : p.currency,
  };
  for (const key of POSITION_ATTRIBUTE_KEYS) {
    if (key === "instrumentType") continue;
    const value = a[key];
    if (value !== undefined) Object.assign(out, { [key]: value });
  }
  if (instrumentType === "option" && out.quantity === undefined) out.quantity = p.quantity;
  return out;
}

/** The file's label and column for an engine field, for a problem message. */
function columnLabel(field: string): { label: string; column: string } {
  const f = field as PositionAttributeField;
  if (f in POSITION_ATTRIBUTE_FIELDS) return { label: POSITION_ATTRIBUTE_FIELDS[f].label, column: attributeColumn(f) };
  const column = (POSITION_COLUMNS as Record<string, string>)[field] ?? field;
  return { label: column.replace(/_/g, " "), column };
}

/**
 * The errors of a positions file for a firm that files the standardised figure: each position lacking an attribute
 * its blocks need, naming the file row and the column. `rows` carry the file row number.
 */
export function standardisedRequirementProblems(
  rows: readonly (PositionForBlocks & { row: number })[],
  context: { reportingCurrency: string; asOf: string; profile?: StandardisedProfile },
): Problem[] {
  if (rows.length === 0) return [];
  const positions = rows.map((r) => standardisedPositionOf(r, context.reportingCurrency));
  const issues = validateStandardisedPositions(positions, { reportingCurrency: context.reportingCurrency, asOf: context.asOf, profile: context.profile });
  return issues.map((issue) => {
    const fileRow = rows[issue.row]?.row ?? null;
    const { label, column } = columnLabel(issue.field);
    return {
      row: fileRow,
      field: label,
      severity: "error" as const,
      message: `column ${issue.column || column}: ${issue.message} (the firm files the standardised capital figure, which needs it)`,
    };
  });
}

/**
 * The positions table's column for an attribute (db/schema/data.ts): the file's column name (POSITION_COLUMNS),
 * except the option kind, stored as option_type.
 */
function sqlColumn(field: PositionAttributeField): string {
  return field === "optionKind" ? "option_type" : POSITION_COLUMNS[field];
}
export const ATTRIBUTE_SQL_COLUMNS: readonly string[] = POSITION_ATTRIBUTE_KEYS.map(sqlColumn);

/** A row's attribute values in ATTRIBUTE_SQL_COLUMNS order (null where absent). */
export function attributeSqlValues(attributes: PositionAttributes | undefined): (string | number | null)[] {
  return POSITION_ATTRIBUTE_KEYS.map((k) => (attributes?.[k] ?? null) as string | number | null);
}

/** The attributes of a stored positions row (its columns by the schema's names), only the ones set. */
export function attributesFromStored(row: Partial<Record<PositionAttributeField, string | number | null>>): PositionAttributes | undefined {
  const out: Record<string, string | number> = {};
  for (const k of POSITION_ATTRIBUTE_KEYS) {
    const v = row[k];
    if (v !== null && v !== undefined) out[k] = v;
  }
  return Object.keys(out).length > 0 ? (out as PositionAttributes) : undefined;
}

/** One optional standardised column as the Data page's column guide and the template show it. */
export interface AttributeGuide {
  field: PositionAttributeField;
  column: string;
  meaning: string;
  unit: string;
  allowed: string;
  /** the template's example row (an equity): most columns stay empty */
  example: string;
}

/**
 * The optional standardised columns, in the template's order. Needed only where the firm's capital rule profile files
 * the standardised figure, and then only by the instrument types that use them (the upload names what a row lacks).
 */
export const POSITION_ATTRIBUTE_GUIDE: readonly AttributeGuide[] = [
  { field: "instrumentType", column: "instrument_type", meaning: "What the instrument is for the standardised blocks. Empty: read from the asset class (equity → equity, etf → fund, bonds → bond, commodity_future → future, fx → currency).", unit: "one of the types", allowed: INSTRUMENT_TYPES.join(", "), example: "equity" },
  { field: "issuerCategory", column: "issuer_category", meaning: "Debt issuer category for specific risk (a bond, a bill, a bond future's deliverable).", unit: "one of the categories", allowed: ISSUER_CATEGORIES.join(", "), example: "" },
  { field: "maturityDate", column: "maturity_date", meaning: "Maturity of a bond, bill or swap; delivery date of a future or forward. Or give residual_maturity_years instead.", unit: "date", allowed: "a date on or after the as-of date, in the date format chosen", example: "" },
  { field: "residualMaturityYears", column: "residual_maturity_years", meaning: "Residual maturity in years, when there is no maturity date.", unit: "years", allowed: "0 to 100", example: "" },
  { field: "coupon", column: "coupon", meaning: "Annual coupon of a bond (0 for a bill or zero-coupon bond), a swap's fixed rate, a bond future's notional coupon. Chooses the ladder column.", unit: "percent (3.5 = 3.5 %)", allowed: "0 to 100", example: "" },
  { field: "nextResetDate", column: "next_reset_date", meaning: "Next rate reset of a floating-rate instrument or a swap's floating leg. Or give next_reset_years.", unit: "date", allowed: "a date on or after the as-of date", example: "" },
  { field: "nextResetYears", column: "next_reset_years", meaning: "Years to the next rate reset, when there is no reset date.", unit: "years", allowed: "0 to 100", example: "" },
  { field: "modifiedDuration", column: "modified_duration", meaning: "Modified duration, needed when the profile uses the duration method.", unit: "years", allowed: "0 to 100", example: "" },
  { field: "nationalMarket", column: "national_market", meaning: "The national market an equity or fund is charged in (equity blocks are per market).", unit: "text", allowed: "up to 40 characters, e.g. a country code", example: "US" },
  { field: "commodity", column: "commodity", meaning: "The commodity a commodity position or future is in (the block is per commodity).", unit: "text", allowed: "up to 60 characters", example: "" },
  { field: "notional", column: "notional", meaning: "A future's, forward's or swap's notional: + long the underlying; a swap + receive fixed.", unit: "reporting currency; signed", allowed: "a number", example: "" },
  { field: "underlyingMaturityYears", column: "underlying_maturity_years", meaning: "A bond future's or forward's deliverable bond: its residual maturity.", unit: "years", allowed: "0 to 100", example: "" },
  { field: "underlying", column: "underlying", meaning: "An option's underlying instrument id (its hedge in the book has this id).", unit: "text", allowed: "up to 64 characters", example: "" },
  { field: "optionKind", column: "option_kind", meaning: "Call or put (bought options only).", unit: "call or put", allowed: "call, put", example: "" },
  { field: "strike", column: "strike", meaning: "An option's strike price.", unit: "the underlying's price unit", allowed: "a number above zero", example: "" },
  { field: "underlyingPrice", column: "underlying_price", meaning: "An option's underlying price per unit.", unit: "reporting currency per unit", allowed: "a number above zero", example: "" },
];

export { describeAttributes } from "./attribute-words";

/**
 * The data-quality items of a period's confirmed positions under a profile that files the standardised figure: each
 * position lacking an attribute its block needs (positions confirmed before the profile changed, say), by file row.
 */
export function standardisedQualityItems(
  rows: readonly (PositionForBlocks & { row: number })[],
  context: { reportingCurrency: string; asOf: string; profile?: StandardisedProfile },
): { check: "standardised-attribute"; severity: "error"; instrument: string; message: string }[] {
  const byRow = new Map(rows.map((r) => [r.row, r]));
  return standardisedRequirementProblems(rows, context).map((p) => ({
    check: "standardised-attribute" as const,
    severity: "error" as const,
    instrument: (p.row !== null ? byRow.get(p.row)?.instrument : undefined) ?? "",
    message: `Row ${p.row ?? "?"} (${(p.row !== null ? byRow.get(p.row)?.instrument : undefined) ?? "?"}), ${p.message}. Upload the positions again with the column filled in, or change the filed figure in Settings.`,
  }));
}
