/**
 * Positions to factor exposures. Every position is treated linearly through its exposure (a stated
 * limitation): P&L ≈ exposure × factor return. A position's exposure to its own price factor is its
 * delta-equivalent exposure when given, its market value otherwise; a position in a currency other than the
 * reporting currency also carries its market value as exposure to that currency's exchange-rate factor.
 */
import type { EngineWarning } from "../types";
import type { PositionLoadings } from "./decomposition";
import { countOf, isAre, listSome } from "../../text/count";

/** One position of the book, values in the reporting currency. */
export interface Position {
  instrument: string;
  /** market value in the reporting currency, signed (short negative) */
  marketValue: number;
  assetClass?: string;
  /** ISO currency of the instrument; the reporting currency when absent */
  currency?: string;
  /** delta-equivalent exposure for instruments that are not linear (reporting currency) */
  deltaExposure?: number;
  /** the price factor's id when it differs from the instrument id */
  factor?: string;
}

export interface ExposureOptions {
  reportingCurrency: string;
  /** id of a currency's exchange-rate factor; default `${currency}${reportingCurrency}` (e.g. "EURUSD") */
  fxFactorId?: (currency: string, reportingCurrency: string) => string;
}

export interface ExcludedPosition {
  index: number;
  instrument: string;
  marketValue: number;
  reason: string;
}

export interface Exposures {
  /** the factors the book is exposed to, in first-seen order */
  factors: string[];
  /** summed exposure per factor */
  exposures: Float64Array;
  /** per included position, its loadings on the factors */
  loadings: PositionLoadings[];
  /** index into the positions list for each included position */
  positionIndex: number[];
  excluded: ExcludedPosition[];
  /** positions in another currency whose exchange-rate factor has no history: FX risk left out, listed */
  missingFx: { instrument: string; currency: string; factor: string }[];
  warnings: EngineWarning[];
}

/** The default id of a currency's exchange-rate factor: `${currency}${reportingCurrency}`, e.g. "EURUSD". */
export function defaultFxFactorId(currency: string, reportingCurrency: string): string {
  return `${currency}${reportingCurrency}`;
}

/**
 * Map positions onto the available factors; a position whose price factor has no history is excluded and
 * listed, never silently dropped.
 * @param hasFactor whether a factor has usable history
 * @throws {RangeError} on a position without an instrument or with a non-finite value
 */
export function positionsToExposures(positions: readonly Position[], hasFactor: (id: string) => boolean, options: ExposureOptions): Exposures {
  const fxId = options.fxFactorId ?? defaultFxFactorId;
  const index = new Map<string, number>();
  const factors: string[] = [];
  const amounts: number[] = [];
  const loadings: PositionLoadings[] = [];
  const positionIndex: number[] = [];
  const excluded: ExcludedPosition[] = [];
  const missingFx: Exposures["missingFx"] = [];
  const factorOf = (id: string): number => {
    let i = index.get(id);
    if (i === undefined) {
      i = factors.length;
      index.set(id, i);
      factors.push(id);
      amounts.push(0);
    }
    return i;
  };
  positions.forEach((p, j) => {
    if (!p.instrument) throw new RangeError(`positionsToExposures requires an instrument on every position (position ${j + 1})`);
    if (!Number.isFinite(p.marketValue)) throw new RangeError(`positionsToExposures requires a finite market value (position ${j + 1}, ${p.instrument})`);
    if (p.deltaExposure !== undefined && !Number.isFinite(p.deltaExposure)) throw new RangeError(`positionsToExposures requires a finite delta exposure (position ${j + 1}, ${p.instrument})`);
    const priceFactor = p.factor ?? p.instrument;
    if (!hasFactor(priceFactor)) {
      excluded.push({ index: j, instrument: p.instrument, marketValue: p.marketValue, reason: `no usable price history for factor "${priceFactor}"` });
      return;
    }
    const idx: number[] = [];
    const amt: number[] = [];
    const exposure = p.deltaExposure ?? p.marketValue;
    const fi = factorOf(priceFactor);
    amounts[fi] += exposure;
    idx.push(fi);
    amt.push(exposure);
    const currency = p.currency ?? options.reportingCurrency;
    if (currency !== options.reportingCurrency) {
      const fx = fxId(currency, options.reportingCurrency);
      if (hasFactor(fx)) {
        const xi = factorOf(fx);
        amounts[xi] += p.marketValue;
        idx.push(xi);
        amt.push(p.marketValue);
      } else missingFx.push({ instrument: p.instrument, currency, factor: fx });
    }
    loadings.push({ factorIndices: idx, amounts: amt });
    positionIndex.push(j);
  });
  const warnings: EngineWarning[] = [];
  if (excluded.length) {
    const total = excluded.reduce((s, e) => s + Math.abs(e.marketValue), 0);
    warnings.push({
      code: "position-excluded",
      message: `${countOf(excluded.length, "position")} with gross market value ${total.toFixed(2)} ${excluded.length === 1 ? "has" : "have"} no usable price history and ${isAre(excluded.length)} left out of every figure: ${listSome(excluded.map((e) => e.instrument), 10)}.`,
    });
  }
  if (missingFx.length) {
    const ids = [...new Set(missingFx.map((m) => m.factor))];
    warnings.push({
      code: "fx-factor-missing",
      message: `Exchange-rate risk is left out for ${countOf(missingFx.length, "position")}: no history for ${ids.join(", ")}.`,
    });
  }
  return { factors, exposures: Float64Array.from(amounts), loadings, positionIndex, excluded, missingFx, warnings };
}
