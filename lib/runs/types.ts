/**
 * What a run is and what a completed run stores. Shared by the run executor (lib/runs), the data layer
 * (lib/data/runs.ts), the API routes, the results pages and the filing packs. Plain JSON-safe shapes.
 */
import type { EngineWarning, EstimatorKind } from "@/lib/risk/types";
import type { MonthEndMethod, MonthEndResult, VarExplanation } from "@/lib/risk";
import type { CapitalProfile } from "@/lib/risk/capital/capital";
import type { QualityReport } from "@/lib/uploads/data-quality";
import type { RunFreshness } from "./freshness";
import type { EstimatorChoice, MethodContent } from "@/lib/validation/method";
import type { CapitalRegime, RegimeChoice } from "@/lib/validation/capital-profile";
import type { StandardisedProfile } from "@/lib/risk/standardised";
import type { RunStandardised } from "./standardised";
import type { PositionAttributes } from "@/lib/uploads/position-attributes";

export type RunStatus = "queued" | "running" | "completed" | "failed";

/** The stages a run passes through, in order, with the share of the progress bar each ends at. */
export const RUN_STAGES = [
  { key: "queued", label: "Waiting to start", endsAt: 0 },
  { key: "inputs", label: "Reading positions, price history and method", endsAt: 0.08 },
  { key: "factor-volatility", label: "Fitting each factor's volatility", endsAt: 0.35 },
  { key: "exposures", label: "Mapping positions to factors", endsAt: 0.38 },
  { key: "volatility", label: "Volatility for the covariance", endsAt: 0.45 },
  { key: "covariance", label: "Covariance and its check", endsAt: 0.5 },
  { key: "var", label: "Value-at-risk and expected shortfall", endsAt: 0.62 },
  { key: "stressed", label: "Stressed value-at-risk", endsAt: 0.72 },
  { key: "history", label: "Value-at-risk history", endsAt: 0.88 },
  { key: "backtest", label: "Backtest", endsAt: 0.92 },
  { key: "capital", label: "Capital", endsAt: 0.95 },
  { key: "storing", label: "Storing the results", endsAt: 0.99 },
  { key: "done", label: "Completed", endsAt: 1 },
] as const;
export type RunStage = (typeof RUN_STAGES)[number]["key"] | "failed";

/** SHA-256 (hex) of the canonical JSON of each input the run used. */
export interface RunInputHashes {
  /** the confirmed positions rows, in row order */
  positions: string;
  /** the aligned closes per factor as of the period end */
  prices: string;
  /** the approved method statement content */
  method: string;
  /** the capital rule profile */
  capitalProfile: string;
  /** all four together: sha256 of {positions, prices, method, capitalProfile} hashes */
  combined: string;
}

/** One volatility estimate of one factor under one estimator. Volatilities are daily, in decimals. */
export interface FactorEstimate {
  estimator: EstimatorKind;
  /** e.g. "EWMA λ = 0.94", "ARCH(2)", "GARCH(1,1) (t)" */
  label: string;
  /** fitted or fixed parameters by name (omega, alpha, beta, lambda, window, alpha1…, nu, mu) */
  params: Record<string, number>;
  /** forecast one-day volatility for the day after the period end; null when the fit failed */
  currentVolatility: number | null;
  /** × √252 */
  annualisedVolatility: number | null;
  /** long-run daily volatility where the model has one */
  longRunVolatility: number | null;
  logLikelihood: number | null;
  warnings: EngineWarning[];
  /** why the fit failed, when it did */
  error: string | null;
  /** set when the estimator's own fallback was used (GARCH → EWMA) */
  fallbackFrom: { kind: EstimatorKind; reason: string } | null;
}

/** Every estimator's view of one factor and the one the method statement chose for its asset class. */
export interface FactorVolatility {
  factor: string;
  /** the asset class whose estimator applies; exchange-rate series are "fx" */
  assetClass: string;
  currency: string;
  /** returns in the factor's usable sample */
  returns: number;
  firstDate: string | null;
  lastDate: string | null;
  estimates: FactorEstimate[];
  /** the method statement's choice for this factor's asset class (or the firm-wide default) */
  chosen: EstimatorChoice;
  /** whether the choice came from the asset class or the default */
  chosenFrom: "asset-class" | "default";
  /** the chosen estimator as the engine fitted it for the portfolio figures, when it did (e.g. "GARCH(1,1), Student-t errors, zero mean") */
  chosenLabel?: string;
  chosenVolatility: number | null;
  chosenAnnualisedVolatility: number | null;
  chosenParams: Record<string, number>;
  warnings: EngineWarning[];
  /** set when the factor was left out of the run for lack of history */
  excluded: string | null;
}

export interface PositionsSummary {
  uploadId: string;
  fileName: string;
  asOf: string | null;
  rows: number;
  grossMarketValue: number;
  netMarketValue: number;
  byAssetClass: { assetClass: string; count: number; marketValue: number }[];
  byCurrency: { currency: string; count: number; marketValue: number }[];
}

export interface RunMethodVersion {
  id: string;
  version: number;
  approvedAt: string | null;
  content: MethodContent;
}

export interface RunCapitalProfile {
  /** the capital_rule_profiles row, or null when the firm has none and the engine default was used */
  id: string | null;
  name: string;
  profile: CapitalProfile;
  /** the firm's plus factor by exception count */
  plusFactors: Record<string, number>;
  backtestDays: number;
  /** the profile version (absent on runs stored before profiles were versioned) */
  version?: number;
  /** which figures the run computes (absent: internal models only) */
  regimes?: RegimeChoice;
  /** which computed figure is filed (absent: internal models) */
  filedRegime?: CapitalRegime;
  /** show the risk-weighted-asset equivalent (capital × 12.5) */
  showRwa?: boolean;
  /** the standardised building blocks' rates, when the run computes them */
  standardised?: StandardisedProfile | null;
}

/** What the run read, in words and counts (the inputs themselves are stored apart, see RunInputs). */
export interface RunInputDescription {
  periodId: string;
  periodEnd: string;
  reportingCurrency: string;
  positions: { uploadId: string; fileName: string; rows: number };
  prices: { factors: number; firstDate: string | null; lastDate: string | null; closes: number; rule: string };
  /** factors left out for lack of the method's minimum history (or any history), with the reason */
  excludedFactors: { factor: string; reason: string }[];
  /** set on a reproduction: the run whose stored inputs were used */
  fromStoredInputsOf: string | null;
}

/** One figure of a reproduction that differs from the original. */
export interface FigureDifference {
  /** JSON path of the figure, e.g. "monthEnd.methods[0].byConfidence[0].oneDay.var" */
  path: string;
  original: number | string | boolean | null;
  reproduced: number | string | boolean | null;
}

/** The result of re-running a past run from its stored inputs. */
export interface Reproduction {
  originalRunId: string;
  matches: boolean;
  /** figures compared (numbers, strings and flags of the results) */
  compared: number;
  differences: FigureDifference[];
  /** true when the differences list was cut */
  truncated: boolean;
  /** plain reasons: engine version changed, an input's hash no longer matches its stored hash, … */
  reasons: string[];
  originalEngineVersion: string | null;
  engineVersion: string;
  inputHashesMatch: boolean;
}

/** What a completed run stores. */
export interface RunResults {
  /** every figure the engine computed */
  monthEnd: MonthEndResult;
  /** the method mapped onto the engine */
  engineMethod: MonthEndMethod;
  /** the backtest day by day: the static book's P&L against the one-day VaR forecast from the day before */
  backtestSeries: { confidence: number; method: string; dates: string[]; pnl: number[]; var: number[]; exception: boolean[] };
  factorVolatility: {
    factors: FactorVolatility[];
    /** which estimator drives what, from what the engine used */
    statement: string;
  };
  dataQuality: { report: QualityReport; items: number; errors: number; warnings: number };
  positions: PositionsSummary;
  method: RunMethodVersion;
  capitalProfile: RunCapitalProfile;
  inputs: RunInputDescription;
  /** statements the run adds beyond the engine's (capital under the firm's plus factors, …) */
  notes: string[];
  /** set on a reproduction */
  reproduction: Reproduction | null;
  /** the standardised building blocks, when the capital rule profile computes them (absent on earlier runs) */
  standardised?: RunStandardised | null;
  /**
   * set when the per-position detail (each method's contributions by position) is stored apart (run_details) and
   * left out here: read the run with `{ detail: true }` for it (lib/runs/detail.ts). Absent on earlier runs, which
   * keep it inline.
   */
  detailApart?: boolean;
}

/** A run as the pages and other modules see it. */
export interface RunRecord {
  id: string;
  periodId: string;
  status: RunStatus;
  stage: string;
  /** 0..1 */
  progress: number;
  inputHashes: RunInputHashes | null;
  engineVersion: string | null;
  results: RunResults | null;
  error: string | null;
  isFilingRun: boolean;
  reproducesRunId: string | null;
  startedBy: string;
  startedByName: string;
  startedAt: string;
  finishedAt: string | null;
  methodVersion: { id: string; version: number } | null;
}

/** A run in a list: everything but the results, plus the headline figures. */
export interface RunListItem extends Omit<RunRecord, "results"> {
  headline: { var1d: number; varHorizon: number; esHorizon: number; confidence: number; capital: number; zone: string } | null;
  /** whether the run's inputs are still the period's current ones (lib/runs/freshness.ts) */
  freshness?: RunFreshness | null;
}

/** The exact inputs of a run, stored compactly beside it so it can be reproduced without today's data. */
export interface RunInputs {
  positions: StoredPosition[];
  /** aligned closes: one date axis, a close per factor per date (null where the factor has no close) */
  prices: { dates: string[]; factors: Record<string, { assetClass: string; currency: string; closes: (number | null)[] }> };
  method: { id: string; version: number; approvedAt: string | null; content: MethodContent };
  capitalProfile: RunCapitalProfile;
  periodEnd: string;
  reportingCurrency: string;
  /** what the run describes but does not compute from: the period, the positions file, the data-quality report at start */
  context: {
    periodId: string;
    upload: { uploadId: string; fileName: string };
    dataQuality: RunResults["dataQuality"];
  };
}

export interface StoredPosition {
  row: number;
  book: string;
  instrument: string;
  name: string;
  assetClass: string;
  currency: string;
  quantity: number;
  price: number;
  marketValue: number;
  deltaExposure: number | null;
  asOf: string;
  /** the standardised attributes the positions file gave (absent when it gave none) */
  attributes?: PositionAttributes;
}

/** The change since last period: the explain against the previous period's filing run. */
export interface RunChange {
  previous: { runId: string; periodId: string; periodEnd: string } | null;
  explanation: VarExplanation | null;
  /** why there is no explanation */
  note: string | null;
}
