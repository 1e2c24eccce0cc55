/**
 * Foreign exchange by the shorthand method: the net open position per currency other than the reporting currency
 * (from every position's currency exposure plus explicit currency positions), overall net open position =
 * max(sum of net longs, |sum of net shorts|) + |net gold| (gold never nets against currencies), times 8 %.
 * The de minimis test is always reported; it is applied only when the profile says so.
 */
import type { FxCurrencyLine, FxResult, StandardisedProfile } from "./types";

/** One foreign-exchange exposure: a currency (or gold) and a signed amount in the reporting currency. */
export interface FxExposure {
  currency: string;
  amount: number;
  /** an explicit currency position (or forward) rather than the currency of another holding */
  explicit: boolean;
  gold?: boolean;
}

/**
 * The shorthand foreign-exchange charge.
 * @example fxRisk([{ currency: "JPY", amount: 50, explicit: true }, { currency: "XAU", amount: -35, explicit: true, gold: true }], "AED", rules).overallNetOpenPosition // → 85
 */
export function fxRisk(exposures: readonly FxExposure[], reportingCurrency: string, rules: StandardisedProfile["fx"]): FxResult {
  const lines = new Map<string, FxCurrencyLine>();
  let gold = 0;
  for (const e of exposures) {
    if (e.gold) {
      gold += e.amount;
      continue;
    }
    if (e.currency === reportingCurrency) continue;
    let line = lines.get(e.currency);
    if (!line) lines.set(e.currency, (line = { currency: e.currency, fromPositions: 0, fromCurrencyPositions: 0, net: 0 }));
    if (e.explicit) line.fromCurrencyPositions += e.amount;
    else line.fromPositions += e.amount;
    line.net += e.amount;
  }
  const byCurrency = [...lines.values()].sort((a, b) => (a.currency < b.currency ? -1 : 1));
  let netLong = 0;
  let netShort = 0;
  for (const l of byCurrency) {
    if (l.net > 0) netLong += l.net;
    else netShort += l.net;
  }
  const overallNetOpenPosition = Math.max(netLong, -netShort) + Math.abs(gold);
  const chargeBeforeExemption = overallNetOpenPosition * rules.rate;
  const gross = netLong - netShort + Math.abs(gold);
  const capital = rules.eligibleCapital;
  const tested = capital !== null && capital > 0;
  const grossLimit = tested ? capital * rules.deMinimisGrossLimit : null;
  const netLimit = tested ? capital * rules.deMinimisNetLimit : null;
  const met = tested ? gross <= grossLimit! && overallNetOpenPosition <= netLimit! : null;
  const applied = rules.applyDeMinimis && met === true;
  return {
    reportingCurrency,
    byCurrency,
    netLong,
    netShort,
    gold,
    overallNetOpenPosition,
    rate: rules.rate,
    charge: applied ? 0 : chargeBeforeExemption,
    deMinimis: { tested, gross, eligibleCapital: capital, grossLimit, netLimit, met, applied, chargeBeforeExemption },
  };
}
