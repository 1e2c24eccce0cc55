import { describe, expect, it } from "vitest";
import { mulberry32, normalSampler, studentTSampler } from "@/lib/risk";

describe("seeded random numbers", () => {
  it("the same seed gives the same stream", () => {
    const a = mulberry32(42), b = mulberry32(42);
    for (let i = 0; i < 100; i++) expect(a()).toBe(b());
  });
  it("normal and unit-variance Student-t draws have the right first two moments", () => {
    for (const draw of [normalSampler(mulberry32(1)), studentTSampler(mulberry32(2), 8)]) {
      let s = 0, s2 = 0;
      const n = 200000;
      for (let i = 0; i < n; i++) { const z = draw(); s += z; s2 += z * z; }
      expect(Math.abs(s / n)).toBeLessThan(0.01);
      expect(Math.abs(s2 / n - 1)).toBeLessThan(0.03);
    }
  });
});
