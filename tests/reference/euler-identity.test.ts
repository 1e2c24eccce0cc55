import { describe, expect, it } from "vitest";
import { eulerDecomposition } from "@/lib/risk/portfolio/decomposition";
import { equalWeightCovariance } from "@/lib/risk/portfolio/covariance";
import { historicalTail } from "@/lib/risk/var/historical";

function lcg(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296);
}
function normals(rand: () => number, n: number): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
  return out;
}

describe("Euler identity: component VaR sums to the total (Euler's theorem for a function homogeneous of degree one, a fact of the trade)", () => {
  const rand = lcg(20260401);
  const factors = Array.from({ length: 6 }, (_, i) => normals(rand, 300).map((x) => x * 0.01 * (1 + i / 3)));
  const cov = equalWeightCovariance(factors);
  const exposures = [1e6, -4e5, 2.5e5, 7e5, -1e5, 3e5];

  it("parametric: Σ component = total VaR, and component = exposure × marginal", () => {
    for (const confidence of [0.99, 0.975]) {
      const d = eulerDecomposition(exposures, cov, confidence);
      const sum = Array.from(d.component).reduce((a, b) => a + b, 0);
      expect(sum).toBeCloseTo(d.var, 6);
      d.component.forEach((c, i) => expect(c).toBeCloseTo(exposures[i] * d.marginal[i], 8));
    }
  });

  it("marginal VaR is the derivative of VaR in the exposure (checked by central differences)", () => {
    const d = eulerDecomposition(exposures, cov, 0.99);
    for (let i = 0; i < exposures.length; i++) {
      const h = 1;
      const up = exposures.slice(); up[i] += h;
      const dn = exposures.slice(); dn[i] -= h;
      const numeric = (eulerDecomposition(up, cov, 0.99).var - eulerDecomposition(dn, cov, 0.99).var) / (2 * h);
      expect(d.marginal[i]).toBeCloseTo(numeric, 6);
    }
  });

  it("historical: scenario-weight allocation sums to the historical VaR and ES", () => {
    const pnl = new Float64Array(300);
    for (let t = 0; t < 300; t++) for (let i = 0; i < 6; i++) pnl[t] += exposures[i] * factors[i][t];
    const tail = historicalTail(pnl, 0.99);
    let sumVar = 0;
    let sumEs = 0;
    for (let i = 0; i < 6; i++) {
      for (let j = 0; j < tail.varWeights.indices.length; j++) sumVar -= tail.varWeights.weights[j] * exposures[i] * factors[i][tail.varWeights.indices[j]];
      for (let j = 0; j < tail.esWeights.indices.length; j++) sumEs -= tail.esWeights.weights[j] * exposures[i] * factors[i][tail.esWeights.indices[j]];
    }
    expect(sumVar).toBeCloseTo(tail.var, 6);
    expect(sumEs).toBeCloseTo(tail.es, 6);
  });
});
