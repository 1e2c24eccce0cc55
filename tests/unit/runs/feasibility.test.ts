/** A method statement whose choices cannot be computed for a factor is refused naming the asset class, the factor and why. Pure. */
import { describe, expect, it } from "vitest";
import { DEFAULT_METHOD_CONTENT, type MethodContent } from "@/lib/validation/method";
import { infeasibilityMessage, methodInfeasibilities } from "@/lib/runs/feasibility";
import type { RunInputs } from "@/lib/runs/types";
import { mulberry32 } from "@/lib/risk/random";

/** Closes of a random walk (fixed seed), `n` returns long. */
function walk(n: number, seed: number, vol = 0.01): number[] {
  const rand = mulberry32(seed);
  const out = [100];
  for (let i = 0; i < n; i++) out.push(out[i] * Math.exp(vol * (rand() * 2 - 1) * Math.sqrt(3)));
  return out;
}

function inputs(factors: Record<string, { assetClass: string; closes: (number | null)[] }>, days: number): RunInputs {
  const dates = Array.from({ length: days }, (_, i) => new Date(Date.UTC(2025, 0, 1) + i * 86_400_000).toISOString().slice(0, 10));
  return {
    positions: Object.keys(factors).map((f, i) => ({ row: i + 1, book: "B", instrument: f, name: f, assetClass: factors[f].assetClass, currency: "EUR", quantity: 1, price: 1, marketValue: 1000, deltaExposure: null, asOf: dates[days - 1] })),
    prices: { dates, factors: Object.fromEntries(Object.entries(factors).map(([k, v]) => [k, { assetClass: v.assetClass, currency: "EUR", closes: v.closes }])) },
    method: { id: "m", version: 2, approvedAt: null, content: DEFAULT_METHOD_CONTENT },
    periodEnd: dates[days - 1],
    reportingCurrency: "EUR",
  } as unknown as RunInputs;
}

const content = (patch: Partial<MethodContent>): MethodContent => ({ ...DEFAULT_METHOD_CONTENT, portfolioVolatility: "asset-class", ...patch });

describe("method feasibility on a book", () => {
  it("names the asset class, the factor and the history a window needs", () => {
    const x = inputs({ AAA: { assetClass: "equity", closes: walk(299, 1) }, BBB: { assetClass: "government_bond", closes: walk(299, 2) } }, 300);
    const items = methodInfeasibilities(x, content({ minHistory: 250, byAssetClass: { equity: { kind: "ma", window: 400, divisor: "m", mean: "zero" } } }));
    expect(items).toHaveLength(1);
    expect(items[0]).toMatchObject({ assetClass: "equity", factor: "AAA" });
    expect(items[0].reason).toMatch(/^299 returns .* needs at least 400$/);
    expect(infeasibilityMessage(items, "A run cannot start")).toMatch(/^A run cannot start: .* 1 factor\(s\) — Equities? · AAA: 299 returns/);
  });

  it("refuses what a run's own fit refuses: a GARCH(1,1) fit on a series that never moves, with or without the EWMA fallback", () => {
    // a series that never moves: the likelihood has no maximum (every variance parameter collapses to zero); the
    // engine refuses all-equal returns before any fallback, so a run refuses it either way
    const flat = new Array(300).fill(100);
    const x = inputs({ FLAT: { assetClass: "equity", closes: flat } }, 300);
    const garch = { kind: "garch", distribution: "normal", mean: "zero", targeting: false } as const;
    for (const fallback of ["none", "ewma"] as const) {
      const refused = methodInfeasibilities(x, content({ byAssetClass: { equity: { ...garch, fallback } } }));
      expect(refused.map((i) => [i.assetClass, i.factor])).toEqual([["equity", "FLAT"]]);
      expect(refused[0].reason).toMatch(/^GARCH\(1,1\), .* cannot be fitted: .*not all equal/);
    }
    // a moving average fits anything but gives no positive variance on it, and a run refuses that too
    const ma = methodInfeasibilities(x, content({ byAssetClass: { equity: { kind: "ma", window: 20, divisor: "m", mean: "zero" } } }));
    expect(ma.map((i) => i.factor)).toEqual(["FLAT"]);
    expect(ma[0].reason).toMatch(/gives no positive variance/);
    // a series that moves is accepted with the fallback
    const moving = inputs({ AAA: { assetClass: "equity", closes: walk(299, 4) } }, 300);
    expect(methodInfeasibilities(moving, content({ byAssetClass: { equity: { ...garch, fallback: "ewma" } } }))).toEqual([]);
  });

  it("refuses nothing for a statement with one covariance model for every factor", () => {
    const x = inputs({ AAA: { assetClass: "equity", closes: walk(299, 3) } }, 300);
    expect(methodInfeasibilities(x, content({ portfolioVolatility: "covariance", byAssetClass: { equity: { kind: "ma", window: 400, divisor: "m", mean: "zero" } } }))).toEqual([]);
  });
});
