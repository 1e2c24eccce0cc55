/**
 * From a completed run as lib/runs stores it (RunRecord with RunResults) and the filing's own data to the packs'
 * input. Pure. The filing workflow calls `filingInputFromRun(...)` and then `buildFilingViewModel(...)`.
 *
 * The correlation matrix and the day-by-day backtest are the ones the run stored with its figures
 * (`monthEnd.correlation`, `monthEnd.backtestSeries`). Runs stored before the engine returned the correlation pass
 * it when the caller has it (`correlationFromRunInputs` recomputes it from the run's stored inputs: cheap for the
 * EWMA and equal-weight covariances, a GARCH fit per factor for garch-ccc); without it the packs say that the run
 * stored none.
 */
import { prepareRun, type PreparedRun } from "@/lib/risk/portfolio/run-month-end";
import { engineInputOf } from "@/lib/runs/compute";
import type { RunInputs, RunRecord } from "@/lib/runs/types";
import { storedCorrelationOf } from "@/lib/runs/stored-state";
import { ESTIMATOR_LABELS } from "@/lib/validation/method";
import type { CorrelationView, FilingPackInput, SignOffBlock, SupersededSignature } from "./view-model";
import { regulatoryCapitalOfResults } from "./regulatory-capital";

export interface FilingFromRun {
  run: Pick<RunRecord, "id" | "startedByName" | "inputHashes" | "results">;
  /** the method statement version's own text (the run stores its content) */
  method: { rationale: string; limitations: string[] };
  firm: FilingPackInput["firm"];
  period: FilingPackInput["period"];
  filing: FilingPackInput["filing"];
  /** the correlation to show; absent: the one the run stored (null when it stored none) */
  correlation?: CorrelationView | null;
  signature?: SignOffBlock | null;
  supersededSignatures?: SupersededSignature[];
}

/**
 * The packs' input for a completed run.
 * @throws {RangeError} when the run has no results (not completed)
 */
export function filingInputFromRun(x: FilingFromRun): FilingPackInput {
  const results = x.run.results;
  if (!results) throw new RangeError(`Run ${x.run.id} has no results: only a completed run can be filed.`);
  const hashes: Record<string, string> = {};
  if (x.run.inputHashes) for (const [k, v] of Object.entries(x.run.inputHashes)) hashes[k] = v;
  const used = new Set(results.monthEnd.factors.used);
  // the series the engine returned with the figures; runs stored before it did keep the one lib/runs derived
  const series = results.monthEnd.backtestSeries ?? results.backtestSeries;
  return {
    results: results.monthEnd,
    run: { id: x.run.id, startedBy: x.run.startedByName, inputHashes: hashes },
    riskFactors: results.factorVolatility.factors
      .filter((f) => f.excluded === null && used.has(f.factor))
      .map((f) => {
        const chosen = f.estimates.find((e) => e.estimator === f.chosen.kind);
        return {
          factor: f.factor,
          // one column per family in the packs; the row's chosen label carries its settings
          estimates: f.estimates.map((e) => ({ estimator: e.estimator, label: ESTIMATOR_LABELS[e.estimator], volatility: e.currentVolatility })),
          chosen: f.chosen.kind,
          chosenLabel: f.chosenLabel ?? chosen?.label,
        };
      }),
    riskFactorStatement: results.factorVolatility.statement,
    correlation: x.correlation !== undefined ? x.correlation : storedCorrelationOf(results),
    backtestSeries: {
      dates: [...series.dates],
      pnl: [...series.pnl],
      var: [...series.var],
      exception: [...series.exception],
    },
    runNotes: [...results.notes],
    regulatoryCapital: regulatoryCapitalOfResults(results),
    dataQuality: results.dataQuality.report,
    method: { version: results.method.version, approvedAt: results.method.approvedAt, content: results.method.content, rationale: x.method.rationale, limitations: [...x.method.limitations] },
    firm: x.firm,
    period: x.period,
    filing: x.filing,
    signature: x.signature ?? null,
    supersededSignatures: x.supersededSignatures ?? [],
  };
}

/** The correlation behind a prepared run's parametric figures (the covariance scaled to unit diagonal). */
export function correlationOfPrepared(prepared: PreparedRun): CorrelationView {
  const m = prepared.correlation ?? prepared.covariance;
  const n = m.size;
  const v = m.values;
  const matrix = Array.from({ length: n }, (_, i) =>
    Array.from({ length: n }, (_, j) => {
      const d = Math.sqrt(v[i * n + i] * v[j * n + j]);
      return i === j ? 1 : d > 0 ? v[i * n + j] / d : 0;
    }),
  );
  const method = prepared.method;
  const basis =
    method.covariance === "garch-ccc"
      ? "Constant correlation of the GARCH(1,1)-standardised returns"
      : method.covariance === "ewma"
        ? `EWMA covariance (λ = ${method.lambda}, zero mean) scaled to correlations`
        : `Equal-weight covariance over ${Math.min(method.covarianceWindow, prepared.dates.length)} days (zero mean) scaled to correlations`;
  return { factors: [...prepared.factorIds], matrix, basis };
}

/** Recompute a run's correlation matrix from its stored inputs. */
export function correlationFromRunInputs(inputs: RunInputs): CorrelationView {
  return correlationOfPrepared(prepareRun(engineInputOf(inputs)));
}
