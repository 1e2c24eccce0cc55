import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { actorFor } from "../helpers/db";
import { methodDatabase, NORTHMOOR, PELLAM } from "./setup";
import { computeEvidence } from "@/lib/data/method";
import { equalWeightReturns, buildEvidence, MIN_COMPARE_RETURNS } from "@/lib/method/evidence";
import { instruments, positions, uploads } from "@/db/schema";
import type { Database } from "@/db/client";

describe("equalWeightReturns", () => {
  it("averages the instruments' log returns on the dates all of them have a close (arithmetic from the definition ln(Pₜ/Pₜ₋₁))", () => {
    const series = new Map([
      ["A", { dates: ["d1", "d2", "d3", "d4"], closes: [100, 110, 99, 99] }],
      ["B", { dates: ["d1", "d3", "d4"], closes: [50, 55, 60] }],
      ["C", { dates: ["d1"], closes: [10] }],
    ]);
    const out = equalWeightReturns(series, ["A", "B", "C", "D"], 2);
    expect(out.instruments).toEqual(["A", "B"]);
    expect(out.excluded).toEqual([
      { code: "C", reason: "0 returns, fewer than the 2 needed" },
      { code: "D", reason: "no stored prices" },
    ]);
    // d2 is missing for B: the common dates are d1, d3, d4.
    expect(out.dates).toEqual(["d1", "d3", "d4"]);
    expect(out.returns[0]).toBeCloseTo((Math.log(99 / 100) + Math.log(55 / 50)) / 2, 14);
    expect(out.returns[1]).toBeCloseTo((0 + Math.log(60 / 55)) / 2, 14);
  });

  it("leaves out an instrument with a close at or below zero", () => {
    const out = equalWeightReturns(new Map([["A", { dates: ["d1", "d2"], closes: [1, 0] }]]), ["A"], 1);
    expect(out.excluded).toEqual([{ code: "A", reason: "a stored close at or below zero" }]);
  });

  it("a class without enough history says so instead of failing", () => {
    const evidence = buildEvidence({
      series: new Map([["A", { dates: ["d1", "d2"], closes: [1, 2] }]]),
      classes: new Map([["equity", ["A"]]]),
      minReturns: 20,
      computedAt: "2026-12-01T09:00:00.000Z",
      asOf: "2026-11-30",
      periodId: null,
      periodEnd: null,
      source: "instruments",
    });
    expect(evidence.minReturns).toBe(MIN_COMPARE_RETURNS);
    expect(evidence.classes[0]).toMatchObject({ assetClass: "equity", label: "Equities", comparison: null, error: `No instrument of this class has ${MIN_COMPARE_RETURNS} daily returns of stored history.` });
  });
});

describe("evidence on the seeded demo data", () => {
  let db: Database;
  beforeAll(async () => {
    db = await methodDatabase({ withMethod: false });
  });

  it("Northmoor: one comparison per asset class of the November positions, ranked, read, dated, with its data range", async () => {
    const analyst = await actorFor(NORTHMOOR.analyst);
    const before = Date.now();
    const evidence = await computeEvidence(analyst);
    // computed at the real time of the act; the data as of the business day's period end
    expect(Date.parse(evidence.computedAt)).toBeGreaterThanOrEqual(before);
    expect(evidence).toMatchObject({ asOf: "2026-11-30", periodEnd: "2026-11-30", source: "positions", minReturns: 250, engineVersion: "1.0.0" });
    // templates/demo/northmoor-positions-2026-11.csv: equity, etf, government_bond, corporate_bond, commodity_future,
    // fx (the currency positions held on USDEUR and GBPEUR) and other (the interest-rate swap).
    expect(evidence.classes.map((c) => c.assetClass)).toEqual(["commodity_future", "corporate_bond", "equity", "etf", "fx", "government_bond", "other"]);
    const held = await db.select({ code: positions.instrument, assetClass: positions.assetClass }).from(positions).innerJoin(uploads, eq(uploads.id, positions.uploadId)).where(eq(uploads.status, "confirmed"));
    for (const c of evidence.classes) {
      expect(c.error).toBeNull();
      // templates/demo/README.md: Northmoor's history runs 2023-01-02 to 2026-11-20.
      expect(c.from).toBe("2023-01-02");
      expect(c.to).toBe("2026-11-20");
      const codes = new Set(held.filter((h) => h.assetClass === c.assetClass && (h.code.startsWith("NMB-") || c.assetClass === "fx")).map((h) => h.code));
      expect([...c.instruments, ...c.excluded.map((e) => e.code)].sort()).toEqual([...codes].sort());
      expect(c.comparison!.ranking.length).toBeGreaterThanOrEqual(5);
      const q = c.comparison!.ranking.map((r) => r.qlike);
      expect([...q].sort((a, b) => a - b)).toEqual(q);
      for (const r of c.comparison!.ranking) {
        for (const v of [r.mse, r.qlike, r.outOfSampleLogLikelihood]) expect(Number.isFinite(v)).toBe(true);
        expect(r.varExceptions).toBeGreaterThanOrEqual(0);
      }
      expect(c.comparison!.reading).toMatch(/^Over the \d+-day evaluation window, .+ gave the best one-day variance forecasts by QLIKE/);
      expect(c.returns).toBe(c.comparison!.n);
    }
    // NMB-EQ-WYNCOTE is new in November without stored prices (templates/demo/README.md): listed, not used.
    const equity = evidence.classes.find((c) => c.assetClass === "equity")!;
    expect(equity.excluded).toContainEqual({ code: "NMB-EQ-WYNCOTE", reason: "no stored prices" });
  });

  it("Pellam: its own classes and its own history, to 2026-11-30", async () => {
    const analyst = await actorFor(PELLAM.analyst);
    const evidence = await computeEvidence(analyst);
    expect(evidence.classes.map((c) => c.assetClass)).toEqual(["equity", "etf", "government_bond"]);
    for (const c of evidence.classes) {
      expect(c.from).toBe("2023-01-02");
      expect(c.to).toBe("2026-11-30");
      expect(c.instruments.every((code) => !code.startsWith("NMB-"))).toBe(true);
      expect(c.comparison!.reading.length).toBeGreaterThan(20);
    }
  });

  it("without confirmed positions, the classes come from the firm's instruments", async () => {
    const analyst = await actorFor(NORTHMOOR.analyst);
    await db.update(uploads).set({ status: "superseded" }).where(eq(uploads.kind, "positions"));
    const evidence = await computeEvidence(analyst);
    expect(evidence.source).toBe("instruments");
    const classes = await db.select({ assetClass: instruments.assetClass }).from(instruments).where(eq(instruments.firmId, analyst.firmId));
    expect(evidence.classes.map((c) => c.assetClass)).toEqual([...new Set(classes.map((c) => c.assetClass).filter((c) => c !== "unknown"))].sort());
    expect(evidence.classes.map((c) => c.assetClass)).toContain("fx");
  });
});
