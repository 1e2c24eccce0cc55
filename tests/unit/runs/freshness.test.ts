/**
 * Nothing stale reaches a filing: a run whose positions, prices, method statement or capital rule profile are no
 * longer the period's current ones is stale in the run list and the period's steps, cannot be chosen for the
 * filing, and no draft is assembled, submitted or signed from it.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import { randomBytes } from "node:crypto";
import { completedRun, filingWorld, type FilingWorld } from "../filings/setup";
import { storeFileInStandIn } from "@/scripts/upload-standin";
import { priceChanges, runFreshness, type CurrentInputs } from "@/lib/runs/freshness";
import type { Actor } from "@/lib/auth/actor";

describe("runFreshness (pure)", () => {
  const ids = { positionsUploadId: "u1", methodStatementId: "m1", capitalProfileId: "c1" };
  const current: CurrentInputs = { positions: { uploadId: "u1", fileName: "a.csv", confirmedAt: null }, method: { id: "m1", version: 1 }, capitalProfile: { id: "c1", name: "Profile" } };

  it("is fresh when every id matches and no close changed", () => {
    expect(runFreshness(ids, current)).toEqual({ stale: false, changes: [] });
  });

  it("names each input that changed", () => {
    const now: CurrentInputs = { positions: { uploadId: "u2", fileName: "b.csv", confirmedAt: "2026-12-01T10:00:00.000Z" }, method: { id: "m2", version: 2 }, capitalProfile: null };
    const f = runFreshness(ids, now);
    expect(f.stale).toBe(true);
    expect(f.changes.map((c) => c.input)).toEqual(["positions", "method", "capitalProfile"]);
    expect(f.changes[0].message).toBe('The positions were superseded by "b.csv" (confirmed 2026-12-01 10:00 UTC).');
    expect(f.changes[1].message).toBe("Method statement version 2 is now the approved one.");
  });

  it("compares the stored closes with the held ones, factor by factor", () => {
    const stored = { dates: ["2026-11-02", "2026-11-03"], factors: { A: { assetClass: "equity", currency: "EUR", closes: [10, 11] }, B: { assetClass: "equity", currency: "EUR", closes: [null, 5] } } };
    const same = new Map([["A", { dates: ["2026-11-02", "2026-11-03"], closes: [10, 11] }], ["B", { dates: ["2026-11-03"], closes: [5] }]]);
    expect(priceChanges(stored, same, ["A", "B"])).toEqual([]);
    const corrected = new Map([...same, ["A", { dates: ["2026-11-02", "2026-11-03"], closes: [10, 11.5] }]]);
    expect(priceChanges(stored, corrected, ["A", "B"])[0].message).toContain("changed for 1 factor since the run (A)");
    const added = new Map([...same, ["C", { dates: ["2026-11-03"], closes: [1] }]]);
    expect(priceChanges(stored, added, ["A", "B", "C"])[0].message).toContain("now has one (C)");
  });
});

describe("a period's runs against its current inputs", () => {
  let w: FilingWorld;
  let spare: string;
  const runs = () => import("@/lib/data/runs");
  const freshness = () => import("@/lib/data/run-freshness");

  /** A demo file (or its text) loaded and confirmed through the upload path. */
  async function load(actor: Actor, kind: "positions" | "prices", fileName: string, text?: string) {
    const { receiveUploadBytes, confirmUpload } = await import("@/lib/data/uploads");
    const bytes = text ? new TextEncoder().encode(text) : new Uint8Array(readFileSync(path.join("templates", "demo", fileName)));
    const key = randomBytes(12).toString("hex");
    storeFileInStandIn(process.env.UPLOAD_STANDIN_DIR!, key, fileName, bytes);
    const { uploadId } = await receiveUploadBytes(
      { firmId: actor.firmId, userId: actor.userId, userName: actor.name, periodId: kind === "positions" ? w.periodId : null, kind, numberFormat: "plain" },
      { key, name: fileName, ufsUrl: `http://127.0.0.1:4010/f/${key}` },
      bytes,
    );
    await confirmUpload(actor, uploadId, { acknowledgeWarnings: true });
  }

  beforeAll(async () => {
    w = await filingWorld();
    spare = await completedRun(w.analyst, w.periodId, false);
  }, 180_000);

  it("a run on the current inputs is fresh, listed so, and the run step is done", async () => {
    const list = await (await runs()).listRuns(w.analyst, w.periodId);
    expect(list.map((r) => r.freshness?.stale)).toEqual([false, false]);
    const { getPeriod } = await import("@/lib/data/periods");
    const step = (await getPeriod(w.analyst, w.periodId)).steps.find((s) => s.key === "run")!;
    expect(step).toMatchObject({ done: true });
    expect(step.note).toBeUndefined();
  });

  it("after the price history changes up to the period end, both runs are stale and the choice is refused", async () => {
    await load(w.analyst, "prices", "northmoor-prices-extension.csv");
    const f = await (await freshness()).runFreshnessOf(w.analyst, spare);
    expect(f.stale).toBe(true);
    expect(f.changes).toEqual([expect.objectContaining({ input: "prices", message: expect.stringMatching(/^The price history changed for \d+ factors since the run/) })]);
    await expect((await runs()).useForFiling(w.analyst, spare)).rejects.toThrow(/This run is stale, so it cannot be chosen for the filing: The price history changed/);
    const { prepareFiling } = await import("@/lib/data/filings");
    await expect(prepareFiling(w.officer, w.periodId)).rejects.toThrow(/cannot be assembled into the draft filing/);
    const { getPeriod } = await import("@/lib/data/periods");
    const period = await getPeriod(w.analyst, w.periodId);
    expect(period.steps.find((s) => s.key === "run")).toMatchObject({ done: false, note: expect.stringContaining("Every completed run is stale") });
    expect(period.steps.find((s) => s.key === "filing")?.note).toContain("The run chosen for the filing is stale");
    expect(period.nextStep?.key).toBe("run");
  });

  it("a new run on the new prices is fresh and can be chosen; the draft then assembles", async () => {
    const id = await completedRun(w.analyst, w.periodId, true);
    expect((await (await freshness()).runFreshnessOf(w.analyst, id)).stale).toBe(false);
    const { prepareFiling } = await import("@/lib/data/filings");
    const draft = await prepareFiling(w.officer, w.periodId);
    expect(draft.runId).toBe(id);
  });

  it("superseded positions make the draft's run stale; the filing page data says what changed and submission is refused", async () => {
    const file = readFileSync(path.join("templates", "demo", "northmoor-positions-2026-11.csv"), "utf8").split("\n");
    const cells = file[1].split(",");
    cells[6] = String(Number(cells[6]) + 100);
    cells[8] = ""; // market value computed from the new quantity
    await load(w.officer, "positions", "northmoor-positions-2026-11-restated.csv", [file[0], cells.join(","), ...file.slice(2)].join("\n"));
    const { periodFiling, submitFiling } = await import("@/lib/data/filings");
    const page = await periodFiling(w.officer, w.periodId);
    expect(page.markedRun?.freshness).toMatchObject({ stale: true, changes: [expect.objectContaining({ input: "positions", message: expect.stringContaining('superseded by "northmoor-positions-2026-11-restated.csv"') })] });
    await expect(submitFiling(w.officer, page.current!.id)).rejects.toThrow(/This run is stale, so it cannot be submitted for review: The positions were superseded/);
  });

  it("another firm's run is not found", async () => {
    const { actorFor } = await import("../helpers/db");
    const pellam = await actorFor("june.okafor@pellam.example");
    await expect((await freshness()).runFreshnessOf(pellam, spare)).rejects.toThrow("No such run.");
  });

  it("keeps each run's price comparison for the price history's state, for every process to read, one state per run", async () => {
    const { runPriceChecks } = await import("@/db/schema");
    const { eq } = await import("drizzle-orm");
    const kept = await w.db.select().from(runPriceChecks).where(eq(runPriceChecks.runId, spare));
    expect(kept).toHaveLength(1);
    expect(kept[0].changes).toEqual([expect.objectContaining({ input: "prices" })]);
    // a later price upload is a new state of the history (here a new instrument no run holds): the next comparison
    // replaces the row
    await load(w.analyst, "prices", "later.csv", "date,instrument,close\n2026-11-26,NMB-EQ-NEWCO,10\n2026-11-27,NMB-EQ-NEWCO,10.5\n");
    await (await freshness()).runFreshnessOf(w.analyst, spare);
    const next = await w.db.select().from(runPriceChecks).where(eq(runPriceChecks.runId, spare));
    expect(next).toHaveLength(1);
    expect(next[0].priceState).not.toBe(kept[0].priceState);
  });
});
