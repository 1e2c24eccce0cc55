/**
 * Content stored before the per-asset-class portfolio choices is read as what it computed (stored rows are never
 * rewritten): one covariance model for every factor, its own correlation, the backtest's refits as they were. Mapped
 * onto the engine it asks for exactly what it asked for before, so an approved version's figures do not change.
 * Pure; the values are the fields' own definitions, no outside source needed.
 */
import { describe, expect, it } from "vitest";
import { capitalProfileOf, engineMethodOf } from "@/lib/runs/method-map";
import { DEFAULT_METHOD_CONTENT, methodContentSchema, readMethodContent, upgradeMethodContent } from "@/lib/validation/method";

/** A version 1 as the demo stored it before these fields existed: a frozen copy, kept as data so that a field added to
 * today's defaults cannot slip into the "older" content. */
import stored from "@/tests/fixtures/method/stored-content-v1.json";

const capital = capitalProfileOf({ id: "p1", name: "Profile", confidence: 0.99, horizonDays: 10, averagingDays: 60, baseMultiplier: 3, stressedMultiplier: 3, backtestDays: 250, plusFactors: {} });

describe("older method content", () => {
  it("reads as one covariance model for every factor, its correlation and its refits", () => {
    const c = readMethodContent(stored);
    expect(c.portfolioVolatility).toBe("covariance");
    expect(c.correlation).toEqual({ kind: "ewma", lambda: 0.94 });
    expect(c.backtestRefit).toEqual({ mode: "every", days: 21 });
    expect(readMethodContent({ ...stored, covariance: "equal", covarianceWindow: 300 }).correlation).toEqual({ kind: "equal", window: 300 });
    // the GARCH-CCC covariance was fitted once on the whole sample: so it stays
    expect(readMethodContent({ ...stored, covariance: "garch-ccc" })).toMatchObject({ correlation: { kind: "ccc" }, backtestRefit: { mode: "once" } });
    // the stored object itself is not touched
    expect(stored).not.toHaveProperty("portfolioVolatility");
    // content with the fields passes unchanged
    expect(upgradeMethodContent(DEFAULT_METHOD_CONTENT)).toEqual(DEFAULT_METHOD_CONTENT);
  });

  it("asks the engine for exactly what it asked for before: no per-factor processes, correlation or refit rule", () => {
    const m = engineMethodOf(readMethodContent(stored), capital);
    expect(m).not.toHaveProperty("volatility");
    expect(m).not.toHaveProperty("correlation");
    expect(m).not.toHaveProperty("backtestRefit");
    expect(m).not.toHaveProperty("candidates");
    expect(m).toMatchObject({ covariance: "ewma", lambda: 0.94, covarianceWindow: 250, scaling: "sqrt", confidences: [0.99, 0.975], horizonDays: 10 });
  });

  it("with the volatilities from the asset classes, maps each class's choice with every setting, FX included", () => {
    const c = methodContentSchema.parse({
      ...stored,
      portfolioVolatility: "asset-class",
      correlation: { kind: "ccc" },
      backtestRefit: { mode: "every", days: 10 },
      byAssetClass: { ...stored.byAssetClass, fx: { kind: "ewma", lambdaMode: "fit", lambda: 0.97 } },
    });
    const m = engineMethodOf(c, capital);
    expect(m.volatility).toEqual({
      default: { kind: "ewma", lambda: 0.94 },
      byAssetClass: { equity: { kind: "garch", distribution: "t", mean: "zero", targeting: false, fallback: "ewma" }, fx: { kind: "ewma", lambda: 0.97, fit: true } },
    });
    expect(m.correlation).toEqual({ kind: "ccc" });
    expect(m.backtestRefit).toEqual({ mode: "rolling", everyDays: 10 });
  });

  it("refuses a refit schedule for the one GARCH-CCC covariance, which is fitted once", () => {
    const r = methodContentSchema.safeParse({ ...stored, covariance: "garch-ccc", backtestRefit: { mode: "every", days: 21 } });
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.path.join("."))).toContain("backtestRefit.mode");
  });
});
