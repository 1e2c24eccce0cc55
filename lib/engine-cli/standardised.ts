/**
 * Command-line command of the standardised building blocks:
 *   standardised --positions P.csv [--profile PROFILE.json] [--method maturity|duration] [--as-of yyyy-mm-dd]
 *                [--reporting-currency CCY] --json
 * Positions in the upload layout (instrument, asset_class, market_value, currency) with the optional columns the
 * blocks need (instrument_type, issuer_category, maturity_date or residual_maturity_years, coupon, next_reset_date
 * or next_reset_years, modified_duration, national_market, commodity, notional, underlying_maturity_years,
 * underlying, option_kind, strike, quantity, underlying_price). Bad input exits 1 with one line naming the row and column.
 */
import { existsSync, readFileSync } from "node:fs";
import { CliError, parseNumber, parseOptions, printJson, readCsv, type CliOptions } from "./io";
import { DRAFT_CAUTION } from "../domain/caution";
import {
  computeStandardised,
  parseIsoDate,
  POSITION_COLUMNS,
  STANDARDISED_1996_PROFILE,
  StandardisedInputError,
  validateStandardisedPositions,
  type InstrumentType,
  type StandardisedPosition,
  type StandardisedProfile,
} from "../risk/standardised";

const FLAG = "--positions";

/** Instrument type inferred from the upload's asset class when the file has no instrument_type for a row. */
const TYPE_FROM_ASSET_CLASS: Record<string, InstrumentType> = {
  equity: "equity",
  etf: "fund",
  government_bond: "bond",
  corporate_bond: "bond",
};

const ALIASES: Record<string, string[]> = { instrument: ["instrument_id"], option_kind: ["option_type"] };

const NUMERIC: (keyof StandardisedPosition)[] = [
  "marketValue",
  "residualMaturityYears",
  "coupon",
  "nextResetYears",
  "modifiedDuration",
  "notional",
  "underlyingMaturityYears",
  "strike",
  "quantity",
  "underlyingPrice",
];
const LOWER: (keyof StandardisedPosition)[] = ["instrumentType", "issuerCategory", "optionKind"];

/** Read a positions CSV in the upload layout into standardised positions (numbers checked here, the rest by the engine). */
export function readStandardisedPositions(path: string | undefined): StandardisedPosition[] {
  const table = readCsv(path, FLAG);
  const lower = table.header.map((h) => h.toLowerCase());
  const index = new Map<keyof StandardisedPosition, number>();
  for (const [field, column] of Object.entries(POSITION_COLUMNS) as [keyof StandardisedPosition, string][]) {
    const i = [column, ...(ALIASES[column] ?? [])].map((c) => lower.indexOf(c)).find((j) => j >= 0);
    if (i !== undefined) index.set(field, i);
  }
  for (const required of ["instrument", "marketValue", "currency"] as const) {
    if (!index.has(required)) throw new CliError(`${FLAG}: missing column "${POSITION_COLUMNS[required]}" (columns: ${table.header.join(", ")})`);
  }
  if (!index.has("instrumentType") && !index.has("assetClass")) {
    throw new CliError(`${FLAG}: missing column "instrument_type" (or "asset_class" to infer it from) (columns: ${table.header.join(", ")})`);
  }
  return table.rows.map((row, r) => {
    const p: Partial<Record<keyof StandardisedPosition, unknown>> = {};
    for (const [field, i] of index) {
      const cell = (row[i] ?? "").trim();
      if (cell === "") continue;
      if (NUMERIC.includes(field)) p[field] = parseNumber(cell, r, POSITION_COLUMNS[field]);
      else if (field === "currency") p[field] = cell.toUpperCase();
      else if (LOWER.includes(field)) p[field] = cell.toLowerCase();
      else p[field] = cell;
    }
    if (p.instrumentType === undefined) {
      const inferred = TYPE_FROM_ASSET_CLASS[String(p.assetClass ?? "").toLowerCase()];
      if (!inferred) {
        throw new CliError(`${FLAG}: row ${r + 2}, column "instrument_type" is empty and asset class "${String(p.assetClass ?? "")}" does not say it (give bond, bill, equity, fund, future, forward, swap, option, commodity, currency or gold)`);
      }
      p.instrumentType = inferred;
    }
    // numbers are checked above; the engine validates every other field by row, field and column
    return p as StandardisedPosition;
  });
}

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

/** Overlay `given` on `base`, refusing unknown keys and values of the wrong type; arrays replace wholesale. */
function overlay(base: Json, given: Json, path: string): Json {
  if (Array.isArray(base)) {
    if (!Array.isArray(given)) throw new CliError(`--profile: ${path} must be a list`);
    return given;
  }
  if (base !== null && typeof base === "object") {
    if (given === null || typeof given !== "object" || Array.isArray(given)) throw new CliError(`--profile: ${path} must be an object`);
    const out: { [k: string]: Json } = { ...base };
    for (const [k, v] of Object.entries(given)) {
      if (!(k in base)) throw new CliError(`--profile: unknown setting ${path}.${k} (known: ${Object.keys(base).join(", ")})`);
      out[k] = overlay(base[k], v, `${path}.${k}`);
    }
    return out;
  }
  if (typeof base === "number" || base === null) {
    if (given === null && base === null) return null;
    if (typeof given !== "number" || !Number.isFinite(given) || given < 0) throw new CliError(`--profile: ${path} must be a number of 0 or more, not ${JSON.stringify(given)}`);
    return given;
  }
  if (typeof given !== typeof base) throw new CliError(`--profile: ${path} must be a ${typeof base}, not ${JSON.stringify(given)}`);
  return given;
}

function checkProfile(value: unknown): asserts value is StandardisedProfile {
  // the overlay kept the defaults' shape and types; the choices and bands are checked here, field by field
  const p = value as StandardisedProfile;
  if (!["maturity", "duration"].includes(p.interestRate.method)) throw new CliError(`--profile: interestRate.method must be maturity or duration`);
  if (!["simplified", "maturity"].includes(p.commodities.method)) throw new CliError(`--profile: commodities.method must be simplified or maturity`);
  const bands = p.interestRate.bands;
  if (bands.length === 0) throw new CliError("--profile: interestRate.bands is empty");
  bands.forEach((b, i) => {
    const at = `interestRate.bands[${i}]`;
    if (typeof b.band !== "string" || ![1, 2, 3].includes(b.zone)) throw new CliError(`--profile: ${at} needs a band label and a zone of 1, 2 or 3`);
    for (const k of ["weight", "yieldChange"] as const) if (typeof b[k] !== "number" || !(b[k] >= 0)) throw new CliError(`--profile: ${at}.${k} must be a number of 0 or more`);
    for (const k of ["lowCouponUpToYears", "highCouponUpToYears"] as const) {
      const v = b[k];
      if (v !== undefined && v !== null && !(typeof v === "number" && v >= 0)) throw new CliError(`--profile: ${at}.${k} must be years, null (open-ended) or absent`);
    }
  });
  for (const [i, t] of p.interestRate.specific.qualifying.entries()) {
    if (!(typeof t.rate === "number" && t.rate >= 0) || !(t.upToYears === null || (typeof t.upToYears === "number" && t.upToYears >= 0))) {
      throw new CliError(`--profile: interestRate.specific.qualifying[${i}] needs upToYears (years or null) and a rate`);
    }
  }
}

/** Read a profile JSON (the whole profile or the settings that differ, optionally under a "standardised" key). */
export function readProfile(path: string | undefined): StandardisedProfile {
  if (!path) return STANDARDISED_1996_PROFILE;
  if (!existsSync(path)) throw new CliError(`--profile: file not found: ${path}`);
  let raw: Json;
  try {
    raw = JSON.parse(readFileSync(path, "utf8")) as Json;
  } catch (error) {
    throw new CliError(`--profile: ${path} is not JSON (${error instanceof Error ? error.message : String(error)})`);
  }
  if (raw && typeof raw === "object" && !Array.isArray(raw) && "standardised" in raw) raw = raw.standardised;
  const profile: unknown = overlay(JSON.parse(JSON.stringify(STANDARDISED_1996_PROFILE)) as Json, raw, "profile");
  checkProfile(profile);
  return profile;
}

function stringOption(options: CliOptions, name: string): string | undefined {
  const v = options[name];
  return typeof v === "string" ? v : undefined;
}

function standardisedCommand(argv: string[]): void {
  const options = parseOptions(argv, ["positions", "profile", "method", "as-of", "reporting-currency"], ["json"]);
  let profile = readProfile(stringOption(options, "profile"));
  const method = stringOption(options, "method");
  if (method !== undefined) {
    if (method !== "maturity" && method !== "duration") throw new CliError(`--method must be one of maturity|duration, not "${method}"`);
    profile = { ...profile, interestRate: { ...profile.interestRate, method } };
  }
  const asOf = stringOption(options, "as-of");
  if (asOf !== undefined && !parseIsoDate(asOf)) throw new CliError(`--as-of must be a yyyy-mm-dd date, not "${asOf}"`);
  const positions = readStandardisedPositions(stringOption(options, "positions"));
  const currencies = [...new Set(positions.map((p) => p.currency).filter((c) => !!c))].sort();
  let reporting = stringOption(options, "reporting-currency")?.toUpperCase();
  if (reporting !== undefined && !/^[A-Z]{3}$/.test(reporting)) throw new CliError(`--reporting-currency must be a three-letter currency code, not "${reporting}"`);
  if (!reporting) {
    if (currencies.length > 1) throw new CliError(`positions are in several currencies (${currencies.join(", ")}): give --reporting-currency`);
    reporting = currencies[0];
  }
  const engineOptions = { reportingCurrency: reporting, asOf, profile };
  const issues = validateStandardisedPositions(positions, engineOptions);
  if (issues.length) {
    const i = issues[0];
    const more = issues.length > 1 ? ` (${issues.length - 1} more problem${issues.length > 2 ? "s" : ""} after this one)` : "";
    throw new CliError(`${FLAG}: row ${i.row + 2}, column "${i.column}": ${i.message}${more}`);
  }
  try {
    const result = computeStandardised(positions, engineOptions);
    printJson({ ...result, method: profile.interestRate.method, caution: DRAFT_CAUTION });
  } catch (error) {
    if (error instanceof StandardisedInputError) throw new CliError(error.message);
    throw error;
  }
}

/** Command-line commands of the standardised building blocks. */
export const commands: Record<string, (argv: string[]) => void | Promise<void>> = {
  standardised: standardisedCommand,
};
