/**
 * Whether a method statement's choices can be computed for every factor of a book before anything is stored: each
 * factor's process (by its asset class; exchange-rate factors by the FX class) needs the history its window or order
 * asks for, and its fit must succeed as the run's own fit (lib/risk/portfolio/per-factor.ts fitFactor) would.
 * Used at approval and at run start. Pure.
 */
import { fitFactor, neededReturns, where, type FactorSpec } from "@/lib/risk/portfolio/per-factor";
import { resolveSpec, specLabel } from "@/lib/risk/process/registry";
import type { VolatilitySpec } from "@/lib/risk/process/types";
import { ASSET_CLASS_LABELS, type AssetClass } from "@/lib/uploads/asset-classes";
import type { MethodContent } from "@/lib/validation/method";
import { alignReturns, usableSeries } from "./align";
import { assessHistory } from "./compute";
import { volatilityChoiceOf } from "./method-map";
import type { RunInputs } from "./types";

/** One factor the method cannot be computed for. */
export interface Infeasibility {
  assetClass: string;
  factor: string;
  reason: string;
}

/** The spec a factor of an asset class follows under a content (its class's own, else the firm-wide default). */
export function specForClass(content: MethodContent, assetClass: string): VolatilitySpec {
  const choice = volatilityChoiceOf(content);
  return choice.byAssetClass?.[assetClass] ?? choice.default;
}

/**
 * Every factor whose chosen process cannot be computed on the stored history, with the reason. Factors short of the
 * method's minimum history are not listed here: runs leave them out and list them. With one covariance model for
 * every factor (older versions) nothing is fitted per factor, so nothing is refused.
 */
export function methodInfeasibilities(inputs: RunInputs, content: MethodContent): Infeasibility[] {
  if (content.portfolioVolatility !== "asset-class") return [];
  const alignment = alignReturns(inputs.prices);
  const short = new Set(assessHistory({ ...inputs, method: { ...inputs.method, content } }, alignment).short.map((s) => s.factor));
  const out: Infeasibility[] = [];
  for (const [factor, meta] of Object.entries(inputs.prices.factors).sort(([a], [b]) => a.localeCompare(b))) {
    if (short.has(factor)) continue;
    const spec = specForClass(content, meta.assetClass);
    const { returns } = usableSeries(alignment, factor);
    const label = specLabel(spec);
    const needs = neededReturns(spec);
    if (returns.length < needs) {
      out.push({ assetClass: meta.assetClass, factor, reason: `${returns.length} returns without a break up to ${inputs.periodEnd}; ${label} needs at least ${needs}` });
      continue;
    }
    // the run's own fit and refusals (no fallback, not converged, no positive variance), so approval refuses what a run refuses
    try {
      const fs: FactorSpec = { factor, assetClass: meta.assetClass, spec: resolveSpec(spec), source: "asset-class" };
      fitFactor(returns, fs);
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      const prefix = `${where(factor, meta.assetClass)}: `;
      out.push({ assetClass: meta.assetClass, factor, reason: message.startsWith(prefix) ? message.slice(prefix.length) : message });
    }
  }
  return out;
}

/** The refusal message: asset class, factor and reason of each factor the method cannot be computed for. */
export function infeasibilityMessage(items: readonly Infeasibility[], what: string): string {
  const shown = items.slice(0, 10).map((i) => `${ASSET_CLASS_LABELS[i.assetClass as AssetClass] ?? i.assetClass} · ${i.factor}: ${i.reason}`);
  return `${what}: the method statement's choices cannot be computed for ${items.length} factor(s) — ${shown.join("; ")}${items.length > 10 ? `; and ${items.length - 10} more` : ""}. Choose another estimator for the asset class, a GARCH fallback, or load more price history.`;
}
