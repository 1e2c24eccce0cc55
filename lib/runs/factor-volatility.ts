/**
 * Each factor's volatility under every estimator (moving average, EWMA, ARCH(m), GARCH(1,1)) and the one the method
 * statement chooses for the factor's asset class. The chosen estimator's settings are used for its own family; the
 * other families use the settings stated in `otherSettings`. Pure.
 */
import { fitProcess, specLabel } from "@/lib/risk/process/registry";
import type { EstimatorKind, VolatilityFit } from "@/lib/risk/types";
import type { EstimatorChoice, MethodContent } from "@/lib/validation/method";
import { estimatorDefault, OTHER_FAMILIES_STATEMENT } from "@/lib/method/defaults";
import { estimatorFor, volatilitySpecOf } from "./method-map";
import type { FactorEstimate, FactorVolatility } from "./types";

const ANNUAL = Math.sqrt(252);

/** The settings of a family the factor's asset class does not choose: the one table of defaults (lib/method/defaults.ts). */
export function otherSettings(): Record<EstimatorKind, EstimatorChoice> {
  return { ma: estimatorDefault("ma"), ewma: estimatorDefault("ewma"), arch: estimatorDefault("arch"), garch: estimatorDefault("garch") };
}

export const OTHER_SETTINGS_STATEMENT = OTHER_FAMILIES_STATEMENT;

/** Plain label of a choice as the engine states it (lib/risk/process/registry.ts), with the fitted parameters where given. */
export function labelOf(choice: EstimatorChoice, fit?: VolatilityFit | null): string {
  return specLabel(volatilitySpecOf(choice), fit?.params);
}

/**
 * Fit one estimator choice through the process registry, exactly as a run fits it for the portfolio figures; null
 * fit and the reason when it cannot be fitted on these returns.
 */
export function fitChoice(returns: Float64Array, choice: EstimatorChoice): { fit: VolatilityFit | null; error: string | null } {
  try {
    return { fit: fitProcess(returns, volatilitySpecOf(choice)).fit, error: null };
  } catch (error) {
    return { fit: null, error: error instanceof Error ? error.message : String(error) };
  }
}

/** The choices fitted for a factor, in family order, and which family is the chosen one. */
export function choicesFor(content: MethodContent, assetClass: string): { choices: EstimatorChoice[]; chosen: EstimatorChoice; from: "asset-class" | "default" } {
  const { choice, from } = estimatorFor(content, assetClass);
  const others = otherSettings();
  const choices = (["ma", "ewma", "arch", "garch"] as const).map((k) => (k === choice.kind ? choice : others[k]));
  return { choices, chosen: choice, from };
}

function finite(x: number | null | undefined): number | null {
  return x !== null && x !== undefined && Number.isFinite(x) ? x : null;
}

export function estimateOf(choice: EstimatorChoice, fit: VolatilityFit | null, error: string | null): FactorEstimate {
  const vol = fit ? finite(Math.sqrt(fit.currentVariance)) : null;
  return {
    estimator: choice.kind,
    label: labelOf(choice, fit),
    params: fit ? Object.fromEntries(Object.entries(fit.params).filter(([, v]) => Number.isFinite(v))) : {},
    currentVolatility: vol,
    annualisedVolatility: vol === null ? null : vol * ANNUAL,
    longRunVolatility: fit && fit.longRunVariance !== null ? finite(Math.sqrt(fit.longRunVariance)) : null,
    logLikelihood: fit ? finite(fit.logLikelihood) : null,
    warnings: fit ? fit.warnings : [],
    error,
    fallbackFrom: fit?.fallbackFrom ? { kind: fit.fallbackFrom.kind, reason: fit.fallbackFrom.reason } : null,
  };
}

/** Every estimator's view of one factor. */
export function factorVolatility(
  factor: string,
  meta: { assetClass: string; currency: string },
  series: { dates: string[]; returns: Float64Array },
  content: MethodContent,
  excluded: string | null,
): FactorVolatility {
  const { choices, chosen, from } = choicesFor(content, meta.assetClass);
  const estimates = choices.map((c) => {
    const { fit, error } = series.returns.length > 1 ? fitChoice(series.returns, c) : { fit: null, error: "no returns" };
    return estimateOf(c, fit, error);
  });
  const mine = estimates[choices.indexOf(chosen)];
  const warnings = [...mine.warnings];
  if (mine.error) warnings.push({ code: "fit-failed", message: `The chosen estimator (${mine.label}) could not be fitted: ${mine.error}.` });
  return {
    factor,
    assetClass: meta.assetClass,
    currency: meta.currency,
    returns: series.returns.length,
    firstDate: series.dates[0] ?? null,
    lastDate: series.dates[series.dates.length - 1] ?? null,
    estimates,
    chosen,
    chosenFrom: from,
    chosenVolatility: mine.currentVolatility,
    chosenAnnualisedVolatility: mine.annualisedVolatility,
    chosenParams: mine.params,
    warnings,
    excluded,
  };
}
