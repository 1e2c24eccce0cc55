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

/**
 * Every problem that stops the blocks from using the positions (empty when usable).
 * @example validateStandardisedPositions([{ instrument: "B1", instrumentType: "bond", marketValue: 100, currency: "EUR" }], { reportingCurrency: "EUR" })
 *   // → issues for issuer_category, residual_maturity_years and coupon of row 0
 */
export function validateStandardisedPositions(positions: readonly StandardisedPosition[], options: StandardisedOptions): PositionIssue[] {
  const profile = options.profile ?? STANDARDISED_1996_PROFILE;
  const duration = profile.interestRate.method === "duration";
  const ladder = profile.commodities.method === "maturity";
  const asOf = options.asOf;
  const issues: PositionIssue[] = [];
  const cash = new Set<string>();
  for (const p of positions) if (cashKind(p.instrumentType)) cash.add(p.instrument);

  positions.forEach((p, row) => {
    const add = (field: keyof StandardisedPosition, message: string) => issues.push({ row, field, column: POSITION_COLUMNS[field], message });
    const isNum = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);
    const checkNumber = (field: keyof StandardisedPosition, rule: (v: number) => boolean, text: string) => {
      const v = p[field];
      if (v === undefined) return;
      if (!isNum(v) || !rule(v)) add(field, `${String(v)} ${text}`);
    };
    const needNumber = (field: keyof StandardisedPosition, what: string) => {
      if (p[field] === undefined) add(field, `${what} is missing`);
    };
    const checkDate = (field: "maturityDate" | "nextResetDate") => {
      const v = p[field];
      if (v === undefined) return;
      if (!parseIsoDate(v)) add(field, `"${v}" is not a yyyy-mm-dd date`);
      else if (!asOf) add(field, `a date needs the as-of date (or give ${field === "maturityDate" ? "residual_maturity_years" : "next_reset_years"})`);
      else if (v < asOf) add(field, `${v} is before the as-of date ${asOf}`);
    };
    const needMaturity = (what: string) => {
      if (p.residualMaturityYears === undefined && p.maturityDate === undefined) add("residualMaturityYears", `${what} needs a residual maturity (residual_maturity_years or maturity_date)`);
    };
    const needReset = (what: string) => {
      if (p.nextResetYears === undefined && p.nextResetDate === undefined) add("nextResetYears", `${what} needs the next reset (next_reset_years or next_reset_date)`);
    };

    if (typeof p.instrument !== "string" || p.instrument.trim() === "") add("instrument", "the instrument is empty");
    if (!(INSTRUMENT_TYPES as readonly string[]).includes(p.instrumentType)) {
      add("instrumentType", `"${String(p.instrumentType ?? "")}" is not an instrument type (one of ${INSTRUMENT_TYPES.join(", ")})`);
      return;
    }
    if (!isNum(p.marketValue)) add("marketValue", `"${String(p.marketValue)}" is not a number`);
    if (typeof p.currency !== "string" || !CCY.test(p.currency)) add("currency", `"${String(p.currency ?? "")}" is not a three-letter currency code`);
    if (p.issuerCategory !== undefined && !(ISSUER_CATEGORIES as readonly string[]).includes(p.issuerCategory)) {
      add("issuerCategory", `"${String(p.issuerCategory)}" is not an issuer category (one of ${ISSUER_CATEGORIES.join(", ")})`);
    }
    checkNumber("residualMaturityYears", (v) => v >= 0, "is not a residual maturity in years (0 or more)");
    checkNumber("nextResetYears", (v) => v >= 0, "is not a time to next reset in years (0 or more)");
    checkNumber("underlyingMaturityYears", (v) => v >= 0, "is not a residual maturity in years (0 or more)");
    checkNumber("coupon", (v) => v >= 0 && v < 100, "is not a coupon in percent (0 up to 100)");
    checkNumber("modifiedDuration", (v) => v >= 0 && v <= 100, "is not a modified duration in years (0 up to 100)");
    checkNumber("notional", () => true, "is not a number");
    checkNumber("strike", (v) => v >= 0, "is not a strike (0 or more)");
    checkNumber("quantity", (v) => v > 0, "is not a quantity bought (more than 0; written options are outside the simplified approach)");
    checkNumber("underlyingPrice", (v) => v > 0, "is not a price (more than 0)");
    checkDate("maturityDate");
    checkDate("nextResetDate");
    const kind = p.instrumentType;
    const debtNeeds = (what: string, withDuration: boolean) => {
      if (p.issuerCategory === undefined) add("issuerCategory", `${what} needs its issuer category (government, qualifying or other)`);
      if (withDuration && duration && p.modifiedDuration === undefined) add("modifiedDuration", `${what} needs its modified duration (the profile uses the duration method)`);
    };

    switch (kind) {
      case "bond":
      case "bill":
        debtNeeds(`a ${kind}`, true);
        needMaturity(`a ${kind}`);
        if (kind === "bond" && p.coupon === undefined) add("coupon", "a bond needs its coupon in percent (0 for a zero-coupon bond)");
        break;
      case "equity":
      case "fund":
        if (!p.nationalMarket?.trim()) add("nationalMarket", `an ${kind === "fund" ? "fund" : "equity"} needs its national market`);
        break;
      case "commodity":
        if (!p.commodity?.trim()) add("commodity", "a commodity position needs the commodity it is in");
        if (ladder) needMaturity("a commodity position (the profile uses the commodity maturity ladder)");
        break;
      case "currency":
      case "gold":
        break;
      case "future":
      case "forward": {
        const u = derivativeUnderlying(p);
        needNumber("notional", `a ${kind}'s notional`);
        if (!u) {
          add("assetClass", `a ${kind} needs its asset class to say what it is on (government_bond, corporate_bond, equity, etf, commodity_future or fx)`);
          break;
        }
        if (u === "debt") {
          debtNeeds(`a bond ${kind} (its deliverable)`, true);
          needMaturity(`a bond ${kind} (time to delivery)`);
          needNumber("underlyingMaturityYears", "the deliverable bond's residual maturity");
          needNumber("coupon", "the deliverable bond's coupon");
        } else if (u === "equity") {
          if (!p.nationalMarket?.trim()) add("nationalMarket", `an equity ${kind} needs its national market`);
        } else if (u === "commodity") {
          if (!p.commodity?.trim()) add("commodity", `a commodity ${kind} needs the commodity it is on`);
          if (ladder) needMaturity(`a commodity ${kind} (the profile uses the commodity maturity ladder)`);
        }
        break;
      }
      case "swap":
        needNumber("notional", "a swap's notional (+ receive fixed, − pay fixed)");
        needMaturity("a swap");
        needNumber("coupon", "a swap's fixed rate (coupon)");
        needReset("a swap's floating leg");
        if (duration && p.modifiedDuration === undefined) add("modifiedDuration", "a swap needs its fixed leg's modified duration (the profile uses the duration method)");
        break;
      case "option": {
        if (isNum(p.marketValue) && p.marketValue < 0) add("marketValue", "a written (sold) option: the simplified approach covers bought options only");
        if (!p.underlying?.trim()) add("underlying", "an option needs its underlying instrument");
        if (p.optionKind !== "call" && p.optionKind !== "put") add("optionKind", `"${String(p.optionKind ?? "")}" is not call or put`);
        needNumber("strike", "an option's strike");
        needNumber("quantity", "an option's quantity of the underlying");
        needNumber("underlyingPrice", "an option's underlying price");
        if (p.underlying && !cash.has(p.underlying)) {
          const u = derivativeUnderlying(p);
          if (!u) add("assetClass", "an option whose underlying is not in the book needs its asset class to say what the underlying is");
          else if (u === "debt") {
            debtNeeds("an option on a bond that is not in the book", false);
            needNumber("underlyingMaturityYears", "the underlying bond's residual maturity");
            needNumber("coupon", "the underlying bond's coupon");
            if (duration) needNumber("modifiedDuration", "the underlying bond's modified duration");
          }
        }
        break;
      }
    }
  });
  return issues;
}
