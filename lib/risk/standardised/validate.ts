/**
 * Validation of a position set for the standardised blocks: every attribute a position's block needs, with the
 * row (0-based input index), the field, the positions file's column and what is wrong. Usable for an upload's
 * data-quality report as well as by the engine, which refuses a set with any issue.
 */
import { parseIsoDate } from "./dates";
import { cashKind, derivativeUnderlying } from "./classify";
import { POSITION_COLUMNS, STANDARDISED_1996_PROFILE } from "./profile";
import { INSTRUMENT_TYPES, ISSUER_CATEGORIES, type PositionIssue, type StandardisedOptions, type StandardisedPosition } from "./types";

/** Raised by computeStandardised when the positions cannot be used; `issues` lists every problem. */
export class StandardisedInputError extends Error {
  constructor(readonly issues: PositionIssue[]) {
    super(issues.length ? describeIssue(issues[0]) + (issues.length > 1 ? ` (and ${issues.length - 1} more)` : "") : "invalid positions");
    this.name = "StandardisedInputError";
  }
}

/**
 * One issue as a sentence naming the position (1-based) and the column.
 * @example describeIssue({ row: 0, field: "coupon", column: "coupon", message: "a bond needs its coupon" }) // → 'position 1, column "coupon": a bond needs its coupon'
 */
export function describeIssue(issue: PositionIssue): string {
  return `position ${issue.row + 1}, column "${issue.column}": ${issue.message}`;
}

const CCY = /^[A-Z]{3}$/;

interface Context {
  duration: boolean;
  ladder: boolean;
  asOf: string | undefined;
  cash: Set<string>;
  issues: PositionIssue[];
}

function add(ctx: Context, row: number, field: keyof StandardisedPosition, message: string): void {
  ctx.issues.push({ row, field, column: POSITION_COLUMNS[field], message });
}

function isNum(v: unknown): v is number {
  return typeof v === "number" && Number.isFinite(v);
}

function checkNumber(ctx: Context, p: StandardisedPosition, row: number, field: keyof StandardisedPosition, min: number, minInclusive: boolean, max: number, text: string): void {
  const v = p[field];
  if (v === undefined) return;
  if (!isNum(v) || (minInclusive ? v < min : v <= min) || v > max) add(ctx, row, field, `${String(v)} ${text}`);
}

function needNumber(ctx: Context, p: StandardisedPosition, row: number, field: keyof StandardisedPosition, what: string): void {
  if (p[field] === undefined) add(ctx, row, field, `${what} is missing`);
}

function checkDate(ctx: Context, p: StandardisedPosition, row: number, field: "maturityDate" | "nextResetDate"): void {
  const v = p[field];
  if (v === undefined) return;
  if (typeof v !== "string" || !parseIsoDate(v)) add(ctx, row, field, `"${String(v)}" is not a yyyy-mm-dd date`);
  else if (!ctx.asOf) add(ctx, row, field, `a date needs the as-of date (or give ${field === "maturityDate" ? "residual_maturity_years" : "next_reset_years"})`);
  else if (v < ctx.asOf) add(ctx, row, field, `${v} is before the as-of date ${ctx.asOf}`);
}

function needMaturity(ctx: Context, p: StandardisedPosition, row: number, what: string): void {
  if (p.residualMaturityYears === undefined && p.maturityDate === undefined) add(ctx, row, "residualMaturityYears", `${what} needs a residual maturity (residual_maturity_years or maturity_date)`);
}

function debtNeeds(ctx: Context, p: StandardisedPosition, row: number, what: string, withDuration: boolean): void {
  if (p.issuerCategory === undefined) add(ctx, row, "issuerCategory", `${what} needs its issuer category (government, qualifying or other)`);
  if (withDuration && ctx.duration && p.modifiedDuration === undefined) add(ctx, row, "modifiedDuration", `${what} needs its modified duration (the profile uses the duration method)`);
}

const INF = Number.POSITIVE_INFINITY;

function checkPosition(ctx: Context, p: StandardisedPosition, row: number): void {
  if (typeof p.instrument !== "string" || p.instrument.trim() === "") add(ctx, row, "instrument", "the instrument is empty");
  if (!(INSTRUMENT_TYPES as readonly string[]).includes(p.instrumentType)) {
    add(ctx, row, "instrumentType", `"${String(p.instrumentType ?? "")}" is not an instrument type (one of ${INSTRUMENT_TYPES.join(", ")})`);
    return;
  }
  if (!isNum(p.marketValue)) add(ctx, row, "marketValue", `"${String(p.marketValue)}" is not a number`);
  if (typeof p.currency !== "string" || !CCY.test(p.currency)) add(ctx, row, "currency", `"${String(p.currency ?? "")}" is not a three-letter currency code`);
  if (p.issuerCategory !== undefined && !(ISSUER_CATEGORIES as readonly string[]).includes(p.issuerCategory)) {
    add(ctx, row, "issuerCategory", `"${String(p.issuerCategory)}" is not an issuer category (one of ${ISSUER_CATEGORIES.join(", ")})`);
  }
  checkNumber(ctx, p, row, "residualMaturityYears", 0, true, INF, "is not a residual maturity in years (0 or more)");
  checkNumber(ctx, p, row, "nextResetYears", 0, true, INF, "is not a time to next reset in years (0 or more)");
  checkNumber(ctx, p, row, "underlyingMaturityYears", 0, true, INF, "is not a residual maturity in years (0 or more)");
  checkNumber(ctx, p, row, "coupon", 0, true, 99.999999, "is not a coupon in percent (0 up to 100)");
  checkNumber(ctx, p, row, "modifiedDuration", 0, true, 100, "is not a modified duration in years (0 up to 100)");
  checkNumber(ctx, p, row, "notional", -INF, true, INF, "is not a number");
  checkNumber(ctx, p, row, "strike", 0, true, INF, "is not a strike (0 or more)");
  checkNumber(ctx, p, row, "quantity", 0, false, INF, "is not a quantity bought (more than 0; written options are outside the simplified approach)");
  checkNumber(ctx, p, row, "underlyingPrice", 0, false, INF, "is not a price (more than 0)");
  checkDate(ctx, p, row, "maturityDate");
  checkDate(ctx, p, row, "nextResetDate");
  const kind = p.instrumentType;
  switch (kind) {
    case "bond":
    case "bill":
      debtNeeds(ctx, p, row, `a ${kind}`, true);
      needMaturity(ctx, p, row, `a ${kind}`);
      if (kind === "bond" && p.coupon === undefined) add(ctx, row, "coupon", "a bond needs its coupon in percent (0 for a zero-coupon bond)");
      break;
    case "equity":
    case "fund":
      if (!p.nationalMarket?.trim()) add(ctx, row, "nationalMarket", `${kind === "fund" ? "a fund" : "an equity"} needs its national market`);
      break;
    case "commodity":
      if (!p.commodity?.trim()) add(ctx, row, "commodity", "a commodity position needs the commodity it is in");
      if (ctx.ladder) needMaturity(ctx, p, row, "a commodity position (the profile uses the commodity maturity ladder)");
      break;
    case "currency":
    case "gold":
      break;
    case "future":
    case "forward": {
      const u = derivativeUnderlying(p);
      needNumber(ctx, p, row, "notional", `a ${kind}'s notional`);
      if (!u) {
        add(ctx, row, "assetClass", `a ${kind} needs its asset class to say what it is on (government_bond, corporate_bond, equity, etf, commodity_future or fx)`);
        break;
      }
      if (u === "debt") {
        debtNeeds(ctx, p, row, `a bond ${kind} (its deliverable)`, true);
        needMaturity(ctx, p, row, `a bond ${kind} (time to delivery)`);
        needNumber(ctx, p, row, "underlyingMaturityYears", "the deliverable bond's residual maturity");
        needNumber(ctx, p, row, "coupon", "the deliverable bond's coupon");
      } else if (u === "equity") {
        if (!p.nationalMarket?.trim()) add(ctx, row, "nationalMarket", `an equity ${kind} needs its national market`);
      } else if (u === "commodity") {
        if (!p.commodity?.trim()) add(ctx, row, "commodity", `a commodity ${kind} needs the commodity it is on`);
        if (ctx.ladder) needMaturity(ctx, p, row, `a commodity ${kind} (the profile uses the commodity maturity ladder)`);
      }
      break;
    }
    case "swap":
      needNumber(ctx, p, row, "notional", "a swap's notional (+ receive fixed, − pay fixed)");
      needMaturity(ctx, p, row, "a swap");
      needNumber(ctx, p, row, "coupon", "a swap's fixed rate (coupon)");
      if (p.nextResetYears === undefined && p.nextResetDate === undefined) add(ctx, row, "nextResetYears", "a swap's floating leg needs the next reset (next_reset_years or next_reset_date)");
      if (ctx.duration && p.modifiedDuration === undefined) add(ctx, row, "modifiedDuration", "a swap needs its fixed leg's modified duration (the profile uses the duration method)");
      break;
    case "option": {
      if (isNum(p.marketValue) && p.marketValue < 0) add(ctx, row, "marketValue", "a written (sold) option: the simplified approach covers bought options only");
      if (!p.underlying?.trim()) add(ctx, row, "underlying", "an option needs its underlying instrument");
      if (p.optionKind !== "call" && p.optionKind !== "put") add(ctx, row, "optionKind", `"${String(p.optionKind ?? "")}" is not call or put`);
      needNumber(ctx, p, row, "strike", "an option's strike");
      needNumber(ctx, p, row, "quantity", "an option's quantity of the underlying");
      needNumber(ctx, p, row, "underlyingPrice", "an option's underlying price");
      if (p.underlying && !ctx.cash.has(p.underlying.trim())) {
        const u = derivativeUnderlying(p);
        if (!u) add(ctx, row, "assetClass", "an option whose underlying is not in the book needs its asset class to say what the underlying is");
        else if (u === "debt") {
          debtNeeds(ctx, p, row, "an option on a bond that is not in the book", false);
          needNumber(ctx, p, row, "underlyingMaturityYears", "the underlying bond's residual maturity");
          needNumber(ctx, p, row, "coupon", "the underlying bond's coupon");
          if (ctx.duration) needNumber(ctx, p, row, "modifiedDuration", "the underlying bond's modified duration");
        }
      }
      break;
    }
  }
}

/**
 * Every problem that stops the blocks from using the positions (empty when usable).
 * @example validateStandardisedPositions([{ instrument: "B1", instrumentType: "bond", marketValue: 100, currency: "EUR" }], { reportingCurrency: "EUR" })
 *   // → issues for issuer_category, residual_maturity_years and coupon of row 0
 */
export function validateStandardisedPositions(positions: readonly StandardisedPosition[], options: StandardisedOptions): PositionIssue[] {
  const profile = options.profile ?? STANDARDISED_1996_PROFILE;
  const ctx: Context = {
    duration: profile.interestRate.method === "duration",
    ladder: profile.commodities.method === "maturity",
    asOf: options.asOf,
    cash: new Set<string>(),
    issues: [],
  };
  for (const p of positions) if (cashKind(p.instrumentType) && typeof p.instrument === "string") ctx.cash.add(p.instrument.trim());
  for (let row = 0; row < positions.length; row++) checkPosition(ctx, positions[row], row);
  return ctx.issues;
}
