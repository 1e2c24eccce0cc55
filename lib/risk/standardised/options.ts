/**
 * Bought options by the simplified approach. Long cash with a bought put, or short cash with a bought call
 * (the hedge carve-out): market value of the underlying covered × (its specific + general rate), less the amount
 * the option is in the money, floored at zero; the covered part of the cash position leaves the other blocks.
 * A bought option without such a hedge: the lesser of the underlying's value × (specific + general rate) and
 * the option's market value. A carved-out holding in a foreign currency keeps its currency in the FX block
 * (the carve-out replaces its position risk, not its currency); a carved-out currency or gold holding leaves FX.
 */
import type { OptionKind } from "./types";

/**
 * How far an option is in the money, for `quantity` units of the underlying.
 * @example inTheMoneyAmount("put", 11, 10, 100) // → 100
 */
export function inTheMoneyAmount(kind: OptionKind, strike: number, underlyingPrice: number, quantity: number): number {
  const perUnit = kind === "put" ? strike - underlyingPrice : underlyingPrice - strike;
  return Math.max(0, perUnit) * Math.abs(quantity);
}

/**
 * The carve-out charge of cash hedged by a bought option.
 * @example hedgedOptionCharge(1000, 0.08, 0.08, 100) // → 60
 */
export function hedgedOptionCharge(underlyingValue: number, specificRate: number, generalRate: number, inTheMoney: number): number {
  return Math.max(0, Math.abs(underlyingValue) * (specificRate + generalRate) - inTheMoney);
}

/**
 * The charge of a bought option held without a hedge: the lesser of the underlying's charge and the option's value.
 * @example boughtOptionCharge(1000, 0.08, 0.08, 25) // → 25
 */
export function boughtOptionCharge(underlyingValue: number, specificRate: number, generalRate: number, optionValue: number): number {
  return Math.min(Math.abs(underlyingValue) * (specificRate + generalRate), Math.max(0, optionValue));
}

/**
 * Whether a cash position of this sign is hedged by a bought option of this kind (long + put, short + call).
 * @example isCarveOutHedge(1000, "put") // → true
 */
export function isCarveOutHedge(cashAmount: number, kind: OptionKind): boolean {
  return (cashAmount > 0 && kind === "put") || (cashAmount < 0 && kind === "call");
}
