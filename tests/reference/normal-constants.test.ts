import { describe, expect, it } from "vitest";
import { normalCdf, normalPdf, normalQuantile } from "@/lib/risk/var/distributions";
import { esMultiplier, parametricEs, parametricVar, varMultiplier } from "@/lib/risk/var/parametric";
import { sqrtTimeScale } from "@/lib/risk/var/scaling";

describe("normal constants", () => {
  // Source: standard normal tables (e.g. Abramowitz & Stegun 1964, Handbook of Mathematical Functions, ch. 26;
  // chapter from memory): p, z(p) = Φ⁻¹(p), φ(z); normal ES/σ = φ(z)/(1−p) worked from those
  it.each([
    [0.95, 1.644854, 0.103136, 2.062713],
    [0.975, 1.959964, 0.058445, 2.337803],
    [0.99, 2.326348, 0.026652, 2.665214],
  ])("p = %f: z %f, φ %f, ES/σ %f", (p, z, phi, es) => {
    expect(normalQuantile(p)).toBeCloseTo(z, 6);
    expect(normalPdf(normalQuantile(p))).toBeCloseTo(phi, 6);
    expect(esMultiplier(p)).toBeCloseTo(es, 6);
    expect(varMultiplier(p)).toBeCloseTo(z, 6);
    expect(normalCdf(normalQuantile(p))).toBeCloseTo(p, 14);
  });

  it("97.5 % ES = 2.337803σ is close to 99 % VaR = 2.326348σ (same tables)", () => {
    expect(parametricEs(1, 0.975)).toBeCloseTo(2.337803, 6);
    expect(parametricVar(1, 0.99)).toBeCloseTo(2.326348, 6);
  });

  it("√10 = 3.162278 (square-root-of-time scaling, Basel Committee 1996 amendment B.4)", () => {
    expect(sqrtTimeScale(1, 10)).toBeCloseTo(3.162278, 6);
  });
});

describe("Hull's normal VaR and ES example", () => {
  // Source: J. C. Hull, Risk Management and Financial Institutions: 10-day σ = 20 (million), 99 % → VaR 46.5, ES 53.3
  it("VaR 46.5 and ES 53.3", () => {
    expect(parametricVar(20, 0.99)).toBeCloseTo(46.5, 1);
    expect(parametricEs(20, 0.99)).toBeCloseTo(53.3, 1);
  });
});
