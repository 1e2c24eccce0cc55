/**
 * The method statement's content in readable sentences, for the packs. Ballast's own wording; published methods keep
 * their names (EWMA, GARCH(1,1), ARCH, value-at-risk, expected shortfall).
 */
import type { MonthEndResult } from "@/lib/risk/portfolio/run-month-end";
import type { ResolvedModel } from "@/lib/risk/process/types";
import { readMethodContent, type EstimatorChoice, type MethodContent } from "@/lib/validation/method";
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

/** The content as sentences, in a fixed order: for a run stored before the engine returned its resolved model. */
export function describeMethod(stored: MethodContent): string[] {
  const content = readMethodContent(stored);
  const s: string[] = [];
  const overrides = Object.entries(content.byAssetClass) as [AssetClass, EstimatorChoice][];
  if (content.portfolioVolatility === "asset-class") {
    s.push(`Volatility of each risk factor: ${describeEstimator(content.defaultEstimator)}.`);
    for (const [cls, e] of overrides) s.push(`${ASSET_CLASS_LABELS[cls] ?? cls}: ${describeEstimator(e)} instead.`);
  } else {
    s.push("Every factor's volatility in the portfolio figures comes from the one covariance model below.");
  }
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

/** Factors named in a sentence: all of them up to eight, then the first eight and a count. */
function factorList(factors: string[]): string {
  return factors.length <= 8 ? list(factors) : `${factors.slice(0, 8).join(", ")} and ${factors.length - 8} more (each factor is listed in the method annex)`;
}

/** Each distinct model the run used, with the factors that followed it (fallbacks named). */
export function modelsByFactor(model: ResolvedModel): { label: string; factors: string[] }[] {
  const groups = new Map<string, string[]>();
  for (const f of model.factors) {
    const label = f.fallback ? `${f.label}, the fallback of ${f.fallback.label}` : f.label;
    const g = groups.get(label) ?? [];
    g.push(f.factor);
    groups.set(label, g);
  }
  return [...groups].map(([label, factors]) => ({ label, factors: [...factors].sort() }));
}

/**
 * What the run computed, in sentences, generated from the resolved model configuration it stored (never from the
 * method statement's intent): the volatility model of every factor, the correlation, the VaR method, the horizon
 * rule, the backtest's refits, the stressed window. Runs stored before the engine returned its model fall back to
 * the method statement's content read as what it computed.
 */
export function describeComputedMethod(results: MonthEndResult, content: MethodContent | null): string[] {
  const model = results.model;
  if (!model) return content ? describeMethod(content) : [];
  const s: string[] = [];
  const groups = modelsByFactor(model);
  if (model.covariance === "per-factor") {
    s.push(`Volatility of each risk factor, as fitted for these figures: ${groups.map((g) => `${g.label} for ${factorList(g.factors)}`).join("; ")}.`);
  } else {
    s.push(`Every factor's volatility in these figures comes from one covariance model: ${groups.map((g) => `${g.label} for ${factorList(g.factors)}`).join("; ")}.`);
  }
  for (const f of model.factors) if (f.fallback) s.push(`${f.factor}: ${f.fallback.label} could not be used (${f.fallback.reason}); ${f.label} was used instead.`);
  s.push(model.correlation.statement);
  if (model.correlation.repair) {
    s.push(`The correlation matrix was not positive semi-definite; ${model.correlation.repair.method} moved it by a Frobenius distance of ${model.correlation.repair.frobeniusDistance.toPrecision(3)}.`);
  }
  const parametric = results.methods.find((m) => m.method === "parametric");
  const primary = results.primaryMethod === "parametric" ? "parametric" : results.primaryMethod === "historical" ? "historical simulation" : "filtered historical simulation (each factor's returns rescaled by its own volatility model)";
  s.push(
    `Value-at-risk and expected shortfall: ${primary} at ${list(results.confidences.map(formatConfidence))} confidence, over one day and ${results.horizonDays} ${results.horizonDays === 1 ? "day" : "days"}${parametric && results.primaryMethod !== "parametric" ? "; parametric figures are shown beside them" : ""}.`,
  );
  s.push(model.horizon.statement);
  s.push(model.backtest.statement);
  if (model.backtest.limitation) s.push(model.backtest.limitation);
  const w = results.stressed.window;
  s.push(
    w.chosenBy === "search"
      ? `Stressed value-at-risk: the ${w.days}-day window from ${w.start} to ${w.end}, found by search as the one with the highest value-at-risk for this book.`
      : `Stressed value-at-risk: the window from ${w.start} to ${w.end}, chosen by the firm.`,
  );
  if (content) s.push(`A risk factor needs at least ${readMethodContent(content).minHistory} daily returns; factors with fewer are left out and listed.`);
  return s;
}
