/**
 * What an upload row keeps about its file (`uploads.summary`): what the reading found (totals and rates of a
 * positions file, coverage and layout of a price file, the header and the columns it lacks), or why it was refused
 * or a duplicate, and what its confirmation stored or why that failed. Each state writes its own fields, so all
 * are optional.
 */
import type { PositionTotals, RateUsed } from "./parse-positions";
import type { PricesParse } from "./parse-prices";

/** One close a price confirmation changed. */
export interface PriceCorrection {
  instrument: string;
  date: string;
  from: number;
  to: number;
}

/** What a price confirmation counted. */
export interface PricesConfirmed {
  added: number;
  corrected: number;
  unchanged: number;
  /** the first 200 corrections */
  corrections: PriceCorrection[];
}

/** What a confirmation stored: the positions and the earlier uploads they superseded, or the price counts. */
export type ConfirmedSummary = { stored: number; superseded: string[] } | PricesConfirmed;

export interface UploadSummary extends Partial<PricesParse["summary"]>, Partial<PricesConfirmed> {
  /** the sheet or CSV the rows came from */
  source?: string;
  header?: string[];
  missingColumns?: string[];
  /** positions: totals by asset class and currency, and the exchange rates used */
  totals?: PositionTotals;
  rates?: RateUsed[];
  /** prices: the layout read (long or wide) */
  layout?: PricesParse["layout"];
  /** refused as a whole: why */
  rejected?: string;
  /** the same bytes as this earlier upload */
  duplicateOf?: string;
  /** the confirmation gave up: why */
  confirmError?: string;
  /** what the confirmation stored (a retry after the last step returns it) */
  confirmed?: ConfirmedSummary;
}
