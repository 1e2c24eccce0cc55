import { beforeAll, describe, expect, it } from "vitest";
import { actorFor } from "../helpers/db";
import { methodDatabase, NORTHMOOR } from "./setup";
import { createMethodDraft, currentMethod, diffMethodVersions, updateMethodDraft } from "@/lib/data/method";
import { diffContent } from "@/lib/method/describe";
import { NORTHMOOR_METHOD } from "@/db/seed-method";
import { DEFAULT_METHOD_CONTENT } from "@/lib/validation/method";
import { LIMITATIONS } from "@/lib/risk/limitations";
import type { Actor } from "@/lib/auth/actor";

describe("diffContent", () => {
  it("lists each changed field with its label and both values in words, and nothing else", () => {
    const changes = diffContent(DEFAULT_METHOD_CONTENT, {
      ...DEFAULT_METHOD_CONTENT,
      defaultEstimator: { kind: "ewma", lambdaMode: "fixed", lambda: 0.97 },
      confidences: [0.99],
      stressWindow: { mode: "chosen", start: "2024-03-01", end: "2024-05-31" },
    });
    expect(changes).toEqual([
      { path: "defaultEstimator.lambda", label: "Firm-wide default · λ value", from: "0.94", to: "0.97" },
      { path: "confidences", label: "Confidence levels", from: "99 %, 97.5 %", to: "99 %" },
      { path: "stressWindow", label: "Stress window", from: "Searched: the worst window in the stored history", to: "Chosen: 2024-03-01 to 2024-05-31" },
    ]);
  });

  it("shows an estimator of an asset class that only one side has as added or removed, field by field", () => {
    const changes = diffContent(DEFAULT_METHOD_CONTENT, { ...DEFAULT_METHOD_CONTENT, byAssetClass: { fx: { kind: "arch", order: 2 } } });
    expect(changes).toEqual([
      { path: "byAssetClass.fx.kind", label: "Foreign exchange · estimator", from: null, to: "ARCH(m)" },
      { path: "byAssetClass.fx.order", label: "Foreign exchange · order m", from: null, to: "2" },
    ]);
    expect(diffContent(DEFAULT_METHOD_CONTENT, DEFAULT_METHOD_CONTENT)).toEqual([]);
  });

  it("a change of estimator kind shows the old fields removed and the new ones added", () => {
    const changes = diffContent(DEFAULT_METHOD_CONTENT, { ...DEFAULT_METHOD_CONTENT, defaultEstimator: { kind: "ma", window: 60, divisor: "m-1", mean: "zero" } });
    expect(changes.map((c) => [c.path, c.from, c.to])).toEqual([
      ["defaultEstimator.kind", "EWMA", "Equal-weight moving average"],
      ["defaultEstimator.lambdaMode", "fixed", null],
      ["defaultEstimator.lambda", "0.94", null],
      ["defaultEstimator.window", null, "60 days"],
      ["defaultEstimator.divisor", null, "M−1"],
      ["defaultEstimator.mean", null, "zero"],
    ]);
  });
});

describe("diffMethodVersions", () => {
  let analyst: Actor;
  beforeAll(async () => {
    await methodDatabase({ withMethod: true });
    analyst = await actorFor(NORTHMOOR.analyst);
  });

  it("a first version has nothing to compare with", async () => {
    const diff = await diffMethodVersions(analyst);
    expect(diff).toMatchObject({ from: null, to: { version: 1, status: "approved" }, content: [], rationale: { changed: false } });
  });

  it("a new draft against the approved version: content, rationale, limitations and the reason", async () => {
    const v1 = (await currentMethod(analyst))!;
    const draft = await createMethodDraft(analyst, { reason: "Equities to a moving average." });
    await updateMethodDraft(analyst, draft.id, {
      ...NORTHMOOR_METHOD,
      content: { ...NORTHMOOR_METHOD.content, byAssetClass: { equity: { kind: "ma", window: 120, divisor: "m", mean: "zero" } } },
      rationale: "Equities now use a 120-day moving average, which the board finds easier to follow.",
      analystLimitations: [NORTHMOOR_METHOD.analystLimitations[0]],
      reason: "Equities to a moving average.",
    });
    const diff = (await diffMethodVersions(analyst, v1.id, draft.id))!;
    expect(diff.from).toMatchObject({ version: 1, status: "approved" });
    expect(diff.to).toMatchObject({ version: 2, status: "draft", reason: "Equities to a moving average." });
    expect(diff.content.find((c) => c.path === "byAssetClass.equity.kind")).toEqual({ path: "byAssetClass.equity.kind", label: "Equities · estimator", from: "GARCH(1,1)", to: "Equal-weight moving average" });
    expect(diff.content.find((c) => c.path === "byAssetClass.equity.window")).toMatchObject({ from: null, to: "120 days" });
    expect(diff.content.find((c) => c.path === "covariance")).toBeUndefined();
    expect(diff.rationale).toEqual({ changed: true, from: v1.rationale, to: "Equities now use a 120-day moving average, which the board finds easier to follow." });
    // GARCH is no longer chosen: its catalogue goes; the moving average's comes; the analyst dropped one of their own.
    expect(diff.limitations.removed).toEqual(expect.arrayContaining([...LIMITATIONS.garch, NORTHMOOR_METHOD.analystLimitations[1]]));
    expect(diff.limitations.added).toEqual([...LIMITATIONS.ma]);
    // version 1's evidence was computed in the demo's history, on 15 September
    expect(diff.evidence).toEqual({ from: "2026-09-15T09:20:00.000Z", to: null });
    // Without ids: the newest version against the one it was drawn from.
    expect((await diffMethodVersions(analyst))!.content).toEqual(diff.content);
  });
});
