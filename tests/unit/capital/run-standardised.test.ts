/**
 * A run under a profile that files the standardised figure: it stores the profile version and regimes, computes the
 * building blocks from its own stored inputs (the same figures the engine gives on those inputs), marks the
 * standardised figure as filed with the VaR-based one beside it, and a reproduction from the stored inputs matches.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { actorFor, demoPeriodId, runsDatabase, PEOPLE } from "../runs/setup";
import { seedDemoCapitalProfile } from "@/db/seed-capital";
import { getRun, getRunInputs, reproduceRun, startRun } from "@/lib/data/runs";
import { executeRun } from "@/lib/data/run-execution";
import { computeStandardised } from "@/lib/risk/standardised";
import { filedCapitalOf, RWA_MULTIPLIER } from "@/lib/runs/standardised";
import { standardisedPositionOf } from "@/lib/uploads/position-attributes";
import type { RunInputs, RunRecord } from "@/lib/runs/types";

let run: RunRecord;
let inputs: RunInputs;

beforeAll(async () => {
  const db = await runsDatabase({ withMethod: true });
  await seedDemoCapitalProfile(db);
  const analyst = await actorFor(PEOPLE.analyst);
  const started = await startRun(analyst, await demoPeriodId(db, analyst), { excludeShortHistory: true });
  expect(await executeRun(started.id)).toBe("completed");
  run = await getRun(analyst, started.id);
  inputs = await getRunInputs(analyst, started.id);
}, 240_000);

describe("a run that files the standardised figure", () => {
  it("stores the profile version it used, both regimes and the filed one", () => {
    expect(run.results!.capitalProfile).toMatchObject({ version: 2, regimes: "both", filedRegime: "standardised", showRwa: true });
    expect(inputs.capitalProfile.version).toBe(2);
    expect(inputs.capitalProfile.standardised?.interestRate.method).toBe("maturity");
  });

  it("stores the blocks the engine gives on the run's own stored inputs, every line kept", () => {
    const std = run.results!.standardised!;
    expect(std.error).toBeNull();
    const again = computeStandardised(
      inputs.positions.map((p) => standardisedPositionOf({ instrument: p.instrument, assetClass: p.assetClass, currency: p.currency, quantity: p.quantity, marketValue: p.marketValue, attributes: p.attributes }, "EUR")),
      { reportingCurrency: "EUR", asOf: "2026-11-30", profile: inputs.capitalProfile.standardised! },
    );
    expect(std.result).toEqual(JSON.parse(JSON.stringify(again)));
    const r = std.result!;
    // the total is the sum of the blocks; RWA is 12.5 times it (the 1996 amendment's reciprocal of 8 %)
    expect(r.total).toBeCloseTo(Object.values(r.blocks).reduce((s, x) => s + x, 0), 6);
    expect(r.rwa).toBeCloseTo(r.total * 12.5, 6);
    // the demo book's bills and bonds reach every zone of the EUR ladder; equities sit on several markets
    const eur = r.interestRate.byCurrency.find((c) => c.currency === "EUR")!;
    expect(new Set(eur.bands.filter((b) => b.long !== 0 || b.short !== 0).map((b) => b.zone))).toEqual(new Set([1, 2, 3]));
    expect(r.equity.byMarket.map((m) => m.market)).toEqual(expect.arrayContaining(["DE", "US", "GB", "CH"]));
    // FX shorthand: 8 % of the overall net open position (1996 amendment A.3)
    expect(r.fx.charge).toBeCloseTo(0.08 * r.fx.overallNetOpenPosition, 6);
    expect(r.interestRate.legs.some((l) => l.instrument === "NMB-IRS-EUR-2031")).toBe(true);
    expect(r.interestRate.legs.some((l) => l.instrument === "NMB-BF-AUR10-2027-03")).toBe(true);
  });

  it("files the standardised figure with the VaR-based capital beside it", () => {
    const f = filedCapitalOf(run.results!);
    expect(f.filedRegime).toBe("standardised");
    expect(f.filed?.capital).toBe(run.results!.standardised!.result!.total);
    expect(f.filed?.rwa).toBeCloseTo(f.filed!.capital * RWA_MULTIPLIER, 6);
    expect(f.comparison?.regime).toBe("internal_models");
    expect(f.comparison?.capital).toBe(run.results!.monthEnd.capital.capital);
  });

  it("reproduces the standardised figures exactly from the stored inputs", async () => {
    const analyst = await actorFor(PEOPLE.analyst);
    const again = await reproduceRun(analyst, run.id);
    expect(await executeRun(again.id)).toBe("completed");
    const reproduced = await getRun(analyst, again.id);
    expect(reproduced.results!.standardised).toEqual(run.results!.standardised);
    expect(reproduced.results!.reproduction?.matches).toBe(true);
  }, 240_000);
});
