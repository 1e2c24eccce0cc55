/**
 * The method statement in readable words: estimator descriptions, parameter labels, the engine's limitations for the
 * chosen estimators, and a flat field list used by the read-only page and the version diff. Pure; shared by server
 * and client code.
 */
import { LIMITATIONS } from "@/lib/risk/limitations";
import { ASSET_CLASS_LABELS, ASSET_CLASSES, type AssetClass } from "@/lib/uploads/asset-classes";
import { ESTIMATOR_LABELS, type EstimatorChoice, type MethodContent } from "@/lib/validation/method";
import type { EstimatorKind } from "@/lib/risk/types";

export const COVARIANCE_LABELS: Record<MethodContent["covariance"], string> = {
  equal: "Equal-weight sample covariance",
  ewma: "EWMA covariance",
  "garch-ccc": "GARCH(1,1) volatilities with constant correlation",
};

export const PORTFOLIO_VOLATILITY_LABELS: Record<MethodContent["portfolioVolatility"], string> = {
  "asset-class": "Each factor's estimator, by its asset class",
  covariance: "One covariance model for every factor",
};

export const CORRELATION_LABELS: Record<MethodContent["correlation"]["kind"], string> = {
  equal: "Equal weights over a window",
  ewma: "EWMA correlation",
  ccc: "Constant correlation of standardised returns",
};

/** The correlation choice in words. */
export function describeCorrelation(c: MethodContent["correlation"]): string {
  return c.kind === "equal" ? `Equal weights over ${c.window} days` : c.kind === "ewma" ? `EWMA, λ ${c.lambda}` : CORRELATION_LABELS.ccc;
}

/** The backtest refit choice in words. */
export function describeRefit(r: MethodContent["backtestRefit"]): string {
  return r.mode === "every" ? `Re-estimated every ${r.days} business days; each day's forecast uses only earlier data` : "Fitted once on the whole sample (the backtest is in sample)";
}

export const VAR_METHOD_LABELS: Record<MethodContent["varMethod"], string> = {
  parametric: "Parametric (variance–covariance)",
  historical: "Historical simulation",
  filtered: "Filtered historical simulation",
};

export const SCALING_LABELS: Record<MethodContent["scaling"], string> = {
  sqrt: "Square root of time from one day",
  term: "Each factor's variance term structure summed over the horizon",
  overlap: "Overlapping multi-day returns",
};

export const DISTRIBUTION_LABELS: Record<MethodContent["distribution"], string> = { normal: "Normal", t: "Student-t" };

export function formatConfidence(c: number): string {
  return `${Number((c * 100).toFixed(3))} %`;
}

/** One line describing an estimator choice, e.g. "EWMA, λ 0.94 (fixed)". */
export function describeEstimator(e: EstimatorChoice): string {
  switch (e.kind) {
    case "ma":
      return `${ESTIMATOR_LABELS.ma}, ${e.window} days, divisor ${e.divisor === "m" ? "M" : "M−1"}, ${e.mean === "zero" ? "zero mean" : "sample mean"}`;
    case "ewma":
      return e.lambdaMode === "fit" ? `EWMA, λ fitted (starting from ${e.lambda})` : `EWMA, λ ${e.lambda} (fixed)`;
    case "arch":
      return `ARCH(${e.order})`;
    case "garch":
      return `GARCH(1,1), ${e.distribution === "t" ? "Student-t" : "normal"} errors, ${e.mean === "zero" ? "zero mean" : "fitted mean"}${e.targeting ? ", variance targeting" : ""}${e.fallback === "ewma" ? ", falls back to EWMA when the fit fails" : ", no fallback"}`;
  }
}

/** The estimator kinds a method uses, in first-use order; a GARCH choice with an EWMA fallback uses EWMA too. */
export function estimatorKinds(content: MethodContent): EstimatorKind[] {
  const kinds: EstimatorKind[] = [];
  const add = (k: EstimatorKind) => {
    if (!kinds.includes(k)) kinds.push(k);
  };
  const all = [content.defaultEstimator, ...ASSET_CLASSES.map((c) => content.byAssetClass[c]).filter((e): e is EstimatorChoice => !!e)];
  for (const e of all) {
    add(e.kind);
    if (e.kind === "garch" && e.fallback === "ewma") add("ewma");
  }
  return kinds;
}

/** The limitation a backtest with parameters fitted once on the whole sample carries (Ballast's own wording). */
export const IN_SAMPLE_BACKTEST_LIMITATION =
  "The backtest reuses model parameters fitted once on the whole sample, so every past forecast was made with parameters that had seen the day it forecasts: the backtest is in sample and can flatter the model.";

/** The engine's limitations for every estimator the method uses (these cannot be removed from a version). */
export function engineLimitations(content: MethodContent): string[] {
  const out: string[] = [];
  for (const kind of estimatorKinds(content)) for (const text of LIMITATIONS[kind]) if (!out.includes(text)) out.push(text);
  if (content.backtestRefit?.mode === "once") out.push(IN_SAMPLE_BACKTEST_LIMITATION);
  return out;
}

/** A stored limitations list split into the engine's (for the chosen estimators) and the analyst's own. */
export function splitLimitations(content: MethodContent, stored: readonly string[]): { engine: string[]; analyst: string[] } {
  const engine = engineLimitations(content);
  const catalogue = new Set([...Object.values(LIMITATIONS).flat(), IN_SAMPLE_BACKTEST_LIMITATION]);
  return { engine: stored.filter((t) => engine.includes(t) || catalogue.has(t)), analyst: stored.filter((t) => !engine.includes(t) && !catalogue.has(t)) };
}

/** The limitations a version stores: the engine's catalogue first, then the analyst's own (duplicates dropped). */
export function combineLimitations(content: MethodContent, analyst: readonly string[]): string[] {
  const out = engineLimitations(content);
  for (const text of analyst.map((t) => t.trim()).filter(Boolean)) if (!out.includes(text)) out.push(text);
  return out;
}

/** One readable field of the content. */
export interface MethodField {
  path: string;
  label: string;
  value: string;
}

function estimatorFields(prefix: string, label: string, e: EstimatorChoice): MethodField[] {
  const f = (key: string, name: string, value: string): MethodField => ({ path: `${prefix}.${key}`, label: `${label} · ${name}`, value });
  const out: MethodField[] = [f("kind", "estimator", ESTIMATOR_LABELS[e.kind])];
  switch (e.kind) {
    case "ma":
      out.push(f("window", "window", `${e.window} days`), f("divisor", "divisor", e.divisor === "m" ? "M" : "M−1"), f("mean", "mean", e.mean === "zero" ? "zero" : "sample"));
      break;
    case "ewma":
      out.push(f("lambdaMode", "λ", e.lambdaMode === "fit" ? "fitted" : "fixed"), f("lambda", e.lambdaMode === "fit" ? "λ starting value" : "λ value", String(e.lambda)));
      break;
    case "arch":
      out.push(f("order", "order m", String(e.order)));
      break;
    case "garch":
      out.push(
        f("distribution", "errors", e.distribution === "t" ? "Student-t" : "normal"),
        f("mean", "mean", e.mean === "zero" ? "zero" : "fitted"),
        f("targeting", "variance targeting", e.targeting ? "yes" : "no"),
        f("fallback", "fallback", e.fallback === "ewma" ? "EWMA" : "none"),
      );
      break;
  }
  return out;
}

/** Every field of the content, in reading order, with its label and its value in words. */
export function methodFields(content: MethodContent): MethodField[] {
  const out: MethodField[] = [...estimatorFields("defaultEstimator", "Firm-wide default", content.defaultEstimator)];
  for (const c of ASSET_CLASSES) {
    const e = content.byAssetClass[c];
    if (e) out.push(...estimatorFields(`byAssetClass.${c}`, ASSET_CLASS_LABELS[c as AssetClass], e));
  }
  out.push(
    { path: "portfolioVolatility", label: "Portfolio volatilities", value: PORTFOLIO_VOLATILITY_LABELS[content.portfolioVolatility] },
    ...(content.portfolioVolatility === "asset-class"
      ? [{ path: "correlation", label: "Correlation", value: describeCorrelation(content.correlation) }]
      : [
          { path: "covariance", label: "Covariance", value: COVARIANCE_LABELS[content.covariance] },
          { path: "covarianceLambda", label: "Covariance λ", value: String(content.covarianceLambda) },
          { path: "covarianceWindow", label: "Covariance window", value: `${content.covarianceWindow} days` },
        ]),
    { path: "backtestRefit", label: "Backtest parameters", value: describeRefit(content.backtestRefit) },
    { path: "varMethod", label: "VaR method", value: VAR_METHOD_LABELS[content.varMethod] },
    { path: "distribution", label: "Return distribution", value: DISTRIBUTION_LABELS[content.distribution] },
    { path: "confidences", label: "Confidence levels", value: content.confidences.map(formatConfidence).join(", ") },
    { path: "horizonDays", label: "Horizon", value: `${content.horizonDays} ${content.horizonDays === 1 ? "day" : "days"}` },
    { path: "scaling", label: "Horizon scaling", value: SCALING_LABELS[content.scaling] },
    { path: "historicalWindow", label: "Historical window", value: `${content.historicalWindow} days` },
    {
      path: "stressWindow",
      label: "Stress window",
      value: content.stressWindow.mode === "search" ? "Searched: the worst window in the stored history" : `Chosen: ${content.stressWindow.start} to ${content.stressWindow.end}`,
    },
    { path: "minHistory", label: "Minimum history", value: `${content.minHistory} returns` },
  );
  return out;
}

/** One difference between two versions. */
export interface FieldChange {
  path: string;
  label: string;
  from: string | null;
  to: string | null;
}

/** Field-by-field differences of two contents (a field only one side has shows null on the other). */
export function diffContent(from: MethodContent, to: MethodContent): FieldChange[] {
  const a = methodFields(from);
  const b = methodFields(to);
  const byPathA = new Map(a.map((f) => [f.path, f]));
  const byPathB = new Map(b.map((f) => [f.path, f]));
  const paths: string[] = [];
  for (const f of [...a, ...b]) if (!paths.includes(f.path)) paths.push(f.path);
  const changes: FieldChange[] = [];
  for (const path of paths) {
    const fa = byPathA.get(path);
    const fb = byPathB.get(path);
    if (fa?.value === fb?.value) continue;
    changes.push({ path, label: (fb ?? fa)!.label, from: fa?.value ?? null, to: fb?.value ?? null });
  }
  return changes;
}
