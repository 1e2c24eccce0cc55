import { describe, expect, it } from "vitest";
import { portfolioVar, prepareRun, type MonthEndInput } from "@/lib/risk/portfolio/run-month-end";
import { ewmaCovariance } from "@/lib/risk/portfolio/covariance";
import { bookInput, syntheticBook } from "@/tests/unit/risk/portfolio/synthetic-book";

// Covariance = D·R·D (issue 13). Σᵢⱼ = σᵢ·σⱼ·ρᵢⱼ is the textbook definition of a covariance from volatilities and a
// correlation (e.g. Hull, "Options, Futures, and Other Derivatives", the chapter on value at risk: the variance of a
// portfolio is Σᵢ Σⱼ ρᵢⱼ αᵢ αⱼ σᵢ σⱼ). The numbers below are worked by hand in the comments.

const relErr = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
const dates = (n: number) => Array.from({ length: n }, (_, i) => `2026-01-${String(i + 2).padStart(2, "0")}`);

describe("D·R·D against the covariance worked by hand", () => {
  it("two assets, equal weights over 4 days: the zero-mean sample covariance", () => {
    // A: 0.01, −0.02, 0.015, −0.005; B: 0.02, −0.01, 0.005, 0
    // σ²_A = (1 + 4 + 2.25 + 0.25)e−4 / 4 = 1.875e−4;  σ²_B = (4 + 1 + 0.25 + 0)e−4 / 4 = 1.3125e−4
    // Σ_AB = (2 + 2 + 0.75 + 0)e−4 / 4 = 1.1875e−4
    // exposures 1,000,000 each: σ²_p = 1e12·(1.875 + 1.3125 + 2·1.1875)e−4 = 5.5625e8, σ_p = 23,584.953...
    const input: MonthEndInput = {
      positions: [{ instrument: "A", marketValue: 1_000_000 }, { instrument: "B", marketValue: 1_000_000 }],
      returns: { dates: dates(4), factors: { A: [0.01, -0.02, 0.015, -0.005], B: [0.02, -0.01, 0.005, 0] } },
      reportingCurrency: "USD",
      method: { methods: ["parametric"], confidences: [0.99], horizonDays: 1, volatility: { default: { kind: "ma", window: 4 } }, correlation: { kind: "equal", window: 4 } },
    };
    const p = prepareRun(input);
    const v = p.covariance.values;
    expect(relErr(v[0], 1.875e-4)).toBeLessThan(1e-12); // by hand, above
    expect(relErr(v[3], 1.3125e-4)).toBeLessThan(1e-12); // by hand, above
    expect(relErr(v[1], 1.1875e-4)).toBeLessThan(1e-12); // by hand, above
    expect(v[2]).toBe(v[1]);
    const r = portfolioVar(input);
    expect(relErr(r.methods[0].portfolioVolatility, Math.sqrt(5.5625e8))).toBeLessThan(1e-12); // by hand, above
    // VaR = z₀.₉₉ · σ_p with z₀.₉₉ = 2.326347874 (the standard normal quantile, standard tables such as Abramowitz & Stegun 1964, ch. 26)
    expect(relErr(r.methods[0].byConfidence[0].oneDay.var, 2.326347874 * Math.sqrt(5.5625e8))).toBeLessThan(1e-8);
    expect(r.model.covariance).toBe("per-factor");
  });

  it("three assets: EWMA volatilities with a fixed start-up, equal-weight correlation over 3 days", () => {
    // returns (3 days): X 0.01, 0.02, −0.01; Y −0.01, 0.01, 0.02; Z 0.03, −0.01, 0.01
    // EWMA λ = 0.9 from σ²₁ = 1e−4 (fixed): σ² after 3 days = 0.9³·1e−4 + 0.1·(0.9²·r₁² + 0.9·r₂² + r₃²)
    //   X: 0.729e−4 + 0.1·(0.81·1 + 0.9·4 + 1)e−4 = 0.729e−4 + 0.541e−4 = 1.270e−4
    //   Y: 0.729e−4 + 0.1·(0.81·1 + 0.9·1 + 4)e−4 = 0.729e−4 + 0.571e−4 = 1.300e−4
    //   Z: 0.729e−4 + 0.1·(0.81·9 + 0.9·1 + 1)e−4 = 0.729e−4 + 0.919e−4 = 1.648e−4
    // correlation (zero mean, 3 days): Σx² = 6, Σy² = 6, Σz² = 11 (×1e−4); Σxy = −1 + 2 − 2 = −1; Σxz = 3 − 2 − 1 = 0;
    //   Σyz = −3 − 1 + 2 = −2  →  ρ_XY = −1/6, ρ_XZ = 0, ρ_YZ = −2/√66
    // Σ_XY = −(1/6)·√(1.270·1.300)e−4;  Σ_YZ = −(2/√66)·√(1.300·1.648)e−4;  Σ_XZ = 0
    const input: MonthEndInput = {
      positions: [{ instrument: "X", marketValue: 1 }, { instrument: "Y", marketValue: 1 }, { instrument: "Z", marketValue: 1 }],
      returns: { dates: dates(3), factors: { X: [0.01, 0.02, -0.01], Y: [-0.01, 0.01, 0.02], Z: [0.03, -0.01, 0.01] } },
      reportingCurrency: "USD",
      method: { methods: ["parametric"], confidences: [0.99], horizonDays: 1, volatility: { default: { kind: "ewma", lambda: 0.9, init: 1e-4 } }, correlation: { kind: "equal", window: 3 } },
    };
    const v = prepareRun(input).covariance.values;
    const hand = [1.27e-4, 1.3e-4, 1.648e-4];
    for (let i = 0; i < 3; i++) expect(relErr(v[i * 3 + i], hand[i])).toBeLessThan(1e-12); // by hand, above
    expect(relErr(v[1], -(1 / 6) * Math.sqrt(1.27 * 1.3) * 1e-4)).toBeLessThan(1e-12); // by hand, above
    expect(relErr(v[5], -(2 / Math.sqrt(66)) * Math.sqrt(1.3 * 1.648) * 1e-4)).toBeLessThan(1e-12); // by hand, above
    expect(Math.abs(v[2])).toBeLessThan(1e-20); // ρ_XZ = 0 by hand
  });
});

describe("the EWMA special case", () => {
  it("EWMA λ volatilities and EWMA λ correlation from the same start-up give ewmaCovariance", () => {
    // D·R·D with D² = diag(Σ) and R = Σ scaled to a unit diagonal is Σ itself (algebra, no source needed)
    const book = syntheticBook(8, 400, 24, 5);
    const lambda = 0.94;
    const p = prepareRun(
      bookInput(book, { methods: ["parametric"], volatility: { default: { kind: "ewma", lambda, init: { firstReturns: 30 } } }, correlation: { kind: "ewma", lambda, startupDays: 30 } }),
    );
    const direct = ewmaCovariance(p.returns, lambda, { startupDays: 30 });
    for (let i = 0; i < direct.values.length; i++) expect(relErr(p.covariance.values[i], direct.values[i])).toBeLessThan(1e-12);
  });
});
