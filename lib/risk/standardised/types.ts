/**
 * The contract of the standardised market-risk engine (the 1996 building blocks): the position it reads, the rule
 * profile that carries every rate and band, and the result that keeps every intermediate figure so a person can
 * follow the charge line by line. Pure types; the default profile is in ./profile.ts.
 *
 * Units: money in the reporting currency, signed (long +, short −); maturities, resets and durations in years;
 * rates as decimals (0.08 = 8 %); coupons and yield changes in percent (3.5 = 3.5 %), as they are printed.
 */

/** What an instrument is, for the blocks (the positions file's `instrument_type`). */
export const INSTRUMENT_TYPES = ["bond", "bill", "equity", "fund", "future", "forward", "swap", "option", "commodity", "currency", "gold"] as const;
export type InstrumentType = (typeof INSTRUMENT_TYPES)[number];

/** Debt issuer category for specific risk (the positions file's `issuer_category`). */
export const ISSUER_CATEGORIES = ["government", "qualifying", "other"] as const;
export type IssuerCategory = (typeof ISSUER_CATEGORIES)[number];

/** The method for debt general market risk. */
export const IR_METHODS = ["maturity", "duration"] as const;
export type InterestRateMethod = (typeof IR_METHODS)[number];

/** Call or put, for options. */
export type OptionKind = "call" | "put";

/** One position as the standardised blocks read it. Optional fields are needed by some instrument types only. */
export interface StandardisedPosition {
  /** instrument identifier, unique per issue (net positions per issue are summed by it) */
  instrument: string;
  /** the upload's asset class (equity, etf, government_bond, corporate_bond, commodity_future, fx, other); for
   *  futures, forwards and options it says what the underlying is */
  assetClass?: string;
  instrumentType: InstrumentType;
  /** market value in the reporting currency, signed: long +, short −. For a bought option, its premium value */
  marketValue: number;
  /** ISO currency of the instrument (its interest-rate ladder and its foreign-exchange exposure) */
  currency: string;
  /** bond, bill, and the deliverable of a bond future or forward */
  issuerCategory?: IssuerCategory;
  /** residual maturity in years (bond, bill, swap; time to delivery for a future or forward) */
  residualMaturityYears?: number;
  /** maturity date yyyy-mm-dd, used with the as-of date when residualMaturityYears is absent */
  maturityDate?: string;
  /** annual coupon in percent (3.5 = 3.5 %); a bill or zero-coupon bond has 0. A swap: its fixed rate */
  coupon?: number;
  /** floating-rate instruments: years to the next rate reset (slots general market risk); a swap's floating leg */
  nextResetYears?: number;
  /** next reset date yyyy-mm-dd, used with the as-of date when nextResetYears is absent */
  nextResetDate?: string;
  /** modified duration in years (duration method) */
  modifiedDuration?: number;
  /** national market of an equity (equity blocks are per market) */
  nationalMarket?: string;
  /** commodity name (commodity block is per commodity) */
  commodity?: string;
  /** derivatives: signed notional in the reporting currency (+ long the underlying; a swap: + receive fixed) */
  notional?: number;
  /** bond future or forward: the deliverable bond's residual maturity in years (from delivery date onwards, as of today) */
  underlyingMaturityYears?: number;
  /** options: the underlying's instrument id (a hedge in the book has this instrument id) */
  underlying?: string;
  /** options: call or put */
  optionKind?: OptionKind;
  /** options: strike price (same unit as underlyingPrice) */
  strike?: number;
  /** options: number of units of the underlying the option covers (positive for a bought option) */
  quantity?: number;
  /** options: the underlying's price per unit in the reporting currency */
  underlyingPrice?: number;
}

/** One row of the maturity ladder (the two coupon columns share rows, weights and zones). */
export interface LadderBandSpec {
  /** row label, e.g. "1–3 m" or "1–2 y | 1–1.9 y" */
  band: string;
  zone: 1 | 2 | 3;
  /** risk weight as a decimal (0.0125 = 1.25 %) */
  weight: number;
  /** upper edge in years (inclusive) for coupon ≥ threshold; null = open-ended; undefined = row not in that column */
  highCouponUpToYears?: number | null;
  /** upper edge in years (inclusive) for coupon < threshold, and for modified duration in the duration method; null = open-ended */
  lowCouponUpToYears: number | null;
  /** duration method: assumed change in yield, percent (1.00 = 1 percentage point) */
  yieldChange: number;
}

/** Debt specific-risk weight for qualifying issuers by residual maturity (upper edge inclusive; null = open). */
export interface QualifyingTier {
  upToYears: number | null;
  rate: number;
}

/** The firm's standardised rule profile: every rate, band and switch. Default: STANDARDISED_1996_PROFILE. */
export interface StandardisedProfile {
  /** profile name shown with the result, e.g. "standardised 1996" */
  name: string;
  interestRate: {
    method: InterestRateMethod;
    specific: { government: number; qualifying: QualifyingTier[]; other: number };
    /** coupon threshold in percent: coupon ≥ it uses the high-coupon column (3) */
    couponThresholdPercent: number;
    bands: LadderBandSpec[];
    /** vertical disallowance on each band's matched amount: maturity 0.10, duration 0.05 */
    verticalMaturity: number;
    verticalDuration: number;
    /** horizontal disallowance within zones: zone 1 0.40, zones 2 and 3 0.30 */
    withinZone: { zone1: number; zone2: number; zone3: number };
    /** between zones, applied in this order: 1–2 (0.40), 2–3 (0.40), 1–3 (1.00; 1.50 in some jurisdictions) */
    betweenZones: { zone12: number; zone23: number; zone13: number };
    /** residual net position rate (1.00) */
    residual: number;
  };
  equity: {
    specificRate: number;
    /** specific rate where the portfolio is liquid and well diversified */
    liquidDiversifiedRate: number;
    /** the firm's profile says the portfolio is liquid and well diversified */
    liquidAndDiversified: boolean;
    generalRate: number;
  };
  fx: {
    rate: number;
    /** apply the de minimis exemption (it is always tested and reported; applied only when true) */
    applyDeMinimis: boolean;
    /** gross FX (longs + |shorts| + |gold|) limit as a fraction of eligible capital (1.00) */
    deMinimisGrossLimit: number;
    /** overall net open position limit as a fraction of eligible capital (0.02) */
    deMinimisNetLimit: number;
    /** eligible capital in the reporting currency; without it the de minimis test cannot be made */
    eligibleCapital: number | null;
  };
  commodities: {
    method: "simplified" | "maturity";
    /** simplified: rate on |net| (0.15) and on gross (0.03) */
    netRate: number;
    grossRate: number;
    /** maturity ladder: upper edges in years (inclusive; null = open), spread rate on matched per band (0.015),
     *  carry rate per band moved (0.006), outright rate on the residual net (0.15) */
    ladder: { upToYears: (number | null)[]; spreadRate: number; carryRate: number; outrightRate: number };
  };
  options: {
    /** rate for an FX or gold underlying (0.08) and a commodity underlying (0.15) in the simplified approach */
    fxRate: number;
    commodityRate: number;
  };
  /** show risk-weighted-asset equivalent */
  showRwa: boolean;
  rwaMultiplier: number;
}

/** One band of a ladder, with every figure. weightedShort is ≤ 0. */
export interface LadderBandResult {
  band: string;
  /** 1-based row number in the profile's ladder */
  index: number;
  zone: 1 | 2 | 3;
  /** risk weight (maturity method) or yield change in percent (duration method) */
  weight: number;
  long: number;
  short: number;
  weightedLong: number;
  weightedShort: number;
  /** min(weightedLong, |weightedShort|) */
  matched: number;
  /** weightedLong + weightedShort */
  net: number;
  verticalCharge: number;
}

export interface ZoneResult {
  zone: 1 | 2 | 3;
  /** sums of the bands' positive and negative nets */
  netLong: number;
  netShort: number;
  /** matched within the zone, min(netLong, |netShort|) */
  matched: number;
  rate: number;
  charge: number;
  /** netLong + netShort */
  net: number;
}

/** One between-zone offset. */
export interface BetweenZoneResult {
  /** the amount offset between the two zones */
  matched: number;
  rate: number;
  charge: number;
  /** the two zones' nets after this offset */
  remainingA: number;
  remainingB: number;
}

export interface InterestRateCurrencyResult {
  currency: string;
  method: InterestRateMethod;
  bands: LadderBandResult[];
  /** sum of the vertical charges */
  vertical: number;
  verticalRate: number;
  /** sum of matched amounts over the bands */
  verticalMatched: number;
  zones: ZoneResult[];
  /** the between-zone charges, in the order applied: 1–2, then 2–3, then 1–3 */
  between: { zone12: number; zone23: number; zone13: number };
  /** each between-zone offset with its matched amount, rate and what was left */
  betweenDetail: { zone12: BetweenZoneResult; zone23: BetweenZoneResult; zone13: BetweenZoneResult };
  /** sum of the within-zone charges */
  withinZones: number;
  /** |sum of all band nets| */
  residual: number;
  residualCharge: number;
  /** vertical + within zones + between zones + residual charge */
  charge: number;
}

/** Specific risk of one debt issue. */
export interface DebtSpecificLine {
  instrument: string;
  currency: string;
  issuerCategory: IssuerCategory;
  residualMaturityYears: number;
  net: number;
  rate: number;
  charge: number;
}

/** A notional leg a derivative or a bond became on the ladder (so the ladder can be followed to its inputs). */
export interface LadderLeg {
  instrument: string;
  currency: string;
  /** e.g. "bond", "deliverable bond", "zero-coupon leg to delivery", "swap fixed leg", "swap floating leg" */
  leg: string;
  amount: number;
  /** years used to slot it (maturity, reset, or modified duration) */
  years: number;
  coupon: number;
  band: string;
}

export interface EquityMarketResult {
  market: string;
  /** sum of |net per issue| */
  gross: number;
  /** sum of nets, signed */
  net: number;
  specificRate: number;
  specific: number;
  generalRate: number;
  general: number;
  issues: { instrument: string; net: number }[];
}

export interface FxCurrencyLine {
  currency: string;
  /** from positions held in this currency */
  fromPositions: number;
  /** from explicit currency positions */
  fromCurrencyPositions: number;
  net: number;
}

export interface FxResult {
  reportingCurrency: string;
  byCurrency: FxCurrencyLine[];
  /** sum of net long currency positions */
  netLong: number;
  /** sum of net short currency positions (≤ 0) */
  netShort: number;
  /** net gold position, signed */
  gold: number;
  /** max(netLong, |netShort|) + |gold| */
  overallNetOpenPosition: number;
  rate: number;
  charge: number;
  deMinimis: {
    tested: boolean;
    /** netLong + |netShort| + |gold| */
    gross: number;
    eligibleCapital: number | null;
    grossLimit: number | null;
    netLimit: number | null;
    /** both conditions met (null when no eligible capital was given) */
    met: boolean | null;
    applied: boolean;
    /** the charge before the exemption */
    chargeBeforeExemption: number;
  };
}

export interface CommodityResult {
  commodity: string;
  method: "simplified" | "maturity";
  long: number;
  short: number;
  net: number;
  gross: number;
  netCharge: number;
  grossCharge: number;
  /** maturity ladder detail, when the profile uses it */
  ladder?: { band: string; long: number; short: number; matched: number; spreadCharge: number; carried: number; carryCharge: number }[];
  charge: number;
}

export interface OptionResult {
  instrument: string;
  underlying: string;
  optionKind: OptionKind;
  /** "hedged" (long cash + bought put, short cash + bought call) or "bought" (no hedge in the book) */
  treatment: "hedged" | "bought";
  /** market value of the underlying covered */
  underlyingValue: number;
  specificRate: number;
  generalRate: number;
  inTheMoney: number;
  /** bought without hedge: the option's market value caps the charge */
  optionValue: number;
  charge: number;
}

export interface StandardisedBlocks {
  interestRateSpecific: number;
  interestRateGeneral: number;
  equitySpecific: number;
  equityGeneral: number;
  fx: number;
  commodities: number;
  options: number;
}

export interface StandardisedWarning {
  code: string;
  message: string;
}

/** The whole result: the total, the blocks and every line behind them. */
export interface StandardisedResult {
  total: number;
  blocks: StandardisedBlocks;
  interestRate: { specific: DebtSpecificLine[]; legs: LadderLeg[]; byCurrency: InterestRateCurrencyResult[] };
  equity: { byMarket: EquityMarketResult[] };
  fx: FxResult;
  commodities: { byCommodity: CommodityResult[] };
  options: OptionResult[];
  /** total × rwaMultiplier */
  rwa: number;
  rwaMultiplier: number;
  profileName: string;
  asOf: string | null;
  reportingCurrency: string;
  warnings: StandardisedWarning[];
  /** the method statement: sentences built from the profile used and what the book held */
  statement: string[];
  /** what the engine does not do (STANDARDISED_LIMITATIONS) */
  limitations: string[];
  engineVersion: string;
}

/** What the entry point needs besides the positions. */
export interface StandardisedOptions {
  reportingCurrency: string;
  /** yyyy-mm-dd; needed where a position gives a maturity or reset date instead of years */
  asOf?: string;
  /** defaults to STANDARDISED_1996_PROFILE */
  profile?: StandardisedProfile;
}

/** One problem with one position: the input index (0-based), the field, the upload column and what is wrong. */
export interface PositionIssue {
  row: number;
  field: keyof StandardisedPosition;
  /** the positions file's column name, e.g. "residual_maturity_years" */
  column: string;
  message: string;
}
