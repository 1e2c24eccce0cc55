/** What a position is for the blocks: which underlying a derivative has, and its maturities resolved from dates. */
import { yearsBetween } from "./dates";
import type { StandardisedPosition } from "./types";

/** The kind of risk behind a position or a derivative's underlying. */
export type UnderlyingKind = "debt" | "equity" | "commodity" | "fx" | "gold";

const BY_ASSET_CLASS: Record<string, UnderlyingKind> = {
  government_bond: "debt",
  corporate_bond: "debt",
  bond: "debt",
  equity: "equity",
  etf: "equity",
  commodity_future: "commodity",
  commodity: "commodity",
  fx: "fx",
  gold: "gold",
};

/**
 * The underlying kind of a future, forward or option, read from its asset class (undefined when it says nothing).
 * @example derivativeUnderlying({ assetClass: "government_bond" } as StandardisedPosition) // → "debt"
 */
export function derivativeUnderlying(p: Pick<StandardisedPosition, "assetClass">): UnderlyingKind | undefined {
  return p.assetClass ? BY_ASSET_CLASS[p.assetClass.trim().toLowerCase()] : undefined;
}

/**
 * The risk kind of a cash position by its instrument type (undefined for derivatives).
 * @example cashKind("bill") // → "debt"
 */
export function cashKind(type: StandardisedPosition["instrumentType"]): UnderlyingKind | undefined {
  switch (type) {
    case "bond":
    case "bill":
      return "debt";
    case "equity":
    case "fund":
      return "equity";
    case "commodity":
      return "commodity";
    case "currency":
      return "fx";
    case "gold":
      return "gold";
    default:
      return undefined;
  }
}

/**
 * Residual maturity in years: the given years, else from the maturity date and the as-of date (undefined if neither).
 * @example residualYears({ maturityDate: "2027-05-31" } as StandardisedPosition, "2026-11-30") // → 0.5
 */
export function residualYears(p: Pick<StandardisedPosition, "residualMaturityYears" | "maturityDate">, asOf: string | undefined): number | undefined {
  if (p.residualMaturityYears !== undefined) return p.residualMaturityYears;
  if (p.maturityDate && asOf) return yearsBetween(asOf, p.maturityDate);
  return undefined;
}

/**
 * Years to the next rate reset: the given years, else from the reset date and the as-of date (undefined if neither).
 * @example resetYears({ nextResetYears: 0.25 } as StandardisedPosition, undefined) // → 0.25
 */
export function resetYears(p: Pick<StandardisedPosition, "nextResetYears" | "nextResetDate">, asOf: string | undefined): number | undefined {
  if (p.nextResetYears !== undefined) return p.nextResetYears;
  if (p.nextResetDate && asOf) return yearsBetween(asOf, p.nextResetDate);
  return undefined;
}
