/**
 * The method statement's content in readable sentences, for the packs. Ballast's own wording; published methods keep
 * their names (EWMA, GARCH(1,1), ARCH, value-at-risk, expected shortfall).
 */
import type { EstimatorChoice, MethodContent } from "@/lib/validation/method";
import { ASSET_CLASS_LABELS, type AssetClass } from "@/lib/uploads/asset-classes";
import { formatConfidence } from "./format";

/** One estimator choice as a phrase: "EWMA with λ = 0.94 (fixed)". */
export function describeEstimator(e: EstimatorChoice): string {
  switch (e.kind) {
    case "ma":
      return `an equal-weight moving average over ${e.window} days (divisor ${e.divisor === "m" ? "M" : "M − 1"}, ${e.mean === "zero" ? "zero mean" : "sample mean"})`;
    case "ewma":
      return e.lambdaMode === "fit" ? `EWMA with λ fitted by maximum likelihood (starting from ${e.lambda})` : `EWMA with λ = ${e.lambda} (fixed)`;
    case "arch":
      return `ARCH(${e.order})`;
    case "garch":
      return `GARCH(1,1) with ${e.distribution === "t" ? "Student-t" : "normal"} innovations, ${e.mean === "zero" ? "zero mean" : "a fitted mean"}${e.targeting ? ", variance targeting" : ""}${e.fallback === "ewma" ? ", falling back to EWMA (λ = 0.94) where the fit fails or is near-integrated" : ", without a fallback"}`;
  }
}

function list(items: string[]): string {
  if (items.length <= 1) return items.join("");
  return `${items.slice(0, -1).join(", ")} and ${items[items.length - 1]}`;
}

/** The content as sentences, in a fixed order. */
export function describeMethod(content: MethodContent): string[] {
  const s: string[] = [];
  s.push(`Volatility of each risk factor: ${describeEstimator(content.defaultEstimator)}.`);
  const overrides = Object.entries(content.byAssetClass) as [AssetClass, EstimatorChoice][];
  for (const [cls, e] of overrides) s.push(`${ASSET_CLASS_LABELS[cls] ?? cls}: ${describeEstimator(e)} instead.`);
  s.push(
    content.covariance === "equal"
      ? `Covariance between factors: equal weights over the last ${content.covarianceWindow} days, zero mean.`
      : content.covariance === "ewma"
        ? `Covariance between factors: EWMA with λ = ${content.covarianceLambda}, zero mean.`
        : "Covariance between factors: GARCH(1,1) volatility per factor with a constant correlation of the standardised returns.",
  );
  const method = content.varMethod === "parametric" ? `parametric (${content.distribution === "t" ? "Student-t" : "normal"} distribution)` : content.varMethod === "historical" ? "historical simulation" : "filtered historical simulation (returns rescaled by each factor's current volatility)";
  s.push(`Value-at-risk and expected shortfall: ${method}, at ${list(content.confidences.map(formatConfidence))} confidence, over one day and ${content.horizonDays} days.`);
  s.push(
    content.scaling === "sqrt"
      ? `The ${content.horizonDays}-day figures scale the one-day figures by the square root of ${content.horizonDays}.`
      : content.scaling === "term"
        ? `The ${content.horizonDays}-day figures follow each factor's GARCH(1,1) variance forecast over the horizon.`
        : `The ${content.horizonDays}-day figures come from overlapping ${content.horizonDays}-day returns.`,
  );
  if (content.varMethod !== "parametric") s.push(`Historical window: the last ${content.historicalWindow} days.`);
  s.push(
    content.stressWindow.mode === "search"
      ? "Stressed value-at-risk: the window of the available history with the highest value-at-risk for today's book, found by search."
      : `Stressed value-at-risk: the window from ${content.stressWindow.start} to ${content.stressWindow.end}, chosen by the firm.`,
  );
  s.push(`A risk factor needs at least ${content.minHistory} daily returns; factors with fewer are left out and listed.`);
  return s;
}
