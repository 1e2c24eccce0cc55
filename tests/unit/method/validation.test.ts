/** Impossible combinations are refused field by field, by the schema the form uses and again by the server; nothing is stored. */
import { beforeAll, describe, expect, it } from "vitest";
import { actorFor, freshDatabase, snapshot } from "../helpers/db";
import { createMethodDraft, updateMethodDraft } from "@/lib/data/method";
import { methodDraftSchema, DEFAULT_METHOD_CONTENT, type MethodDraft } from "@/lib/validation/method";
import { AppError } from "@/lib/errors";
import type { Database } from "@/db/client";
import type { Actor } from "@/lib/auth/actor";

let db: Database;
let analyst: Actor;
let draftId: string;

const valid: MethodDraft = {
  content: DEFAULT_METHOD_CONTENT,
  rationale: "EWMA everywhere: simple, reactive and easy to explain to the board.",
  analystLimitations: [],
  reason: "",
};

function withContent(patch: Record<string, unknown>): unknown {
  return { ...valid, content: { ...valid.content, ...patch } };
}

const cases: { name: string; input: unknown; field: string; message: RegExp }[] = [
  { name: "λ above 1", input: withContent({ defaultEstimator: { kind: "ewma", lambdaMode: "fixed", lambda: 1.2 } }), field: "content.defaultEstimator.lambda", message: /below 1/ },
  { name: "λ of exactly 1", input: withContent({ defaultEstimator: { kind: "ewma", lambdaMode: "fixed", lambda: 1 } }), field: "content.defaultEstimator.lambda", message: /below 1/ },
  { name: "λ of 0", input: withContent({ defaultEstimator: { kind: "ewma", lambdaMode: "fit", lambda: 0 } }), field: "content.defaultEstimator.lambda", message: /above 0/ },
  { name: "covariance λ of 1.5", input: withContent({ covarianceLambda: 1.5 }), field: "content.covarianceLambda", message: /below 1/ },
  {
    name: "a moving-average window longer than the minimum history",
    input: withContent({ byAssetClass: { etf: { kind: "ma", window: 300, divisor: "m", mean: "zero" } }, minHistory: 250 }),
    field: "content.byAssetClass.etf.window",
    message: /longer than the minimum history \(250\)/,
  },
  {
    name: "an ARCH order the minimum history is too short for",
    input: withContent({ byAssetClass: { equity: { kind: "arch", order: 5 } }, minHistory: 40 }),
    field: "content.byAssetClass.equity.order",
    message: /ARCH\(5\) needs a minimum history of at least 50/,
  },
  { name: "a confidence of 1", input: withContent({ confidences: [0.99, 1] }), field: "content.confidences.1", message: /below 1/ },
  { name: "a confidence of 0", input: withContent({ confidences: [0] }), field: "content.confidences.0", message: /above 0/ },
  { name: "a confidence of 99 (a percentage)", input: withContent({ confidences: [99] }), field: "content.confidences.0", message: /below 1/ },
  {
    name: "a stress window that ends before it starts",
    input: withContent({ stressWindow: { mode: "chosen", start: "2024-05-31", end: "2024-03-01" } }),
    field: "content.stressWindow.end",
    message: /end after it starts/,
  },
  { name: "overlapping returns with parametric VaR", input: withContent({ scaling: "overlap" }), field: "content.scaling", message: /not parametric/ },
  { name: "a rationale of a few words", input: { ...valid, rationale: "Because." }, field: "rationale", message: /at least a sentence/ },
];

beforeAll(async () => {
  db = await freshDatabase();
  analyst = await actorFor("priya.castell@northmoor.example");
  draftId = (await createMethodDraft(analyst, {})).id;
});

describe("impossible combinations", () => {
  for (const c of cases) {
    it(`${c.name}: refused on ${c.field}, by the form's schema and by the server, with nothing stored`, async () => {
      const parsed = methodDraftSchema.safeParse(c.input);
      expect(parsed.success).toBe(false);
      const issue = parsed.error!.issues.find((i) => i.path.join(".") === c.field);
      expect(issue?.message).toMatch(c.message);

      const before = await snapshot(db);
      let error: unknown;
      try {
        await updateMethodDraft(analyst, draftId, c.input);
      } catch (e) {
        error = e;
      }
      expect(error).toBeInstanceOf(AppError);
      expect((error as AppError).code).toBe("unprocessable:method");
      expect((error as AppError).fields?.[c.field]).toMatch(c.message);
      expect(await snapshot(db)).toEqual(before);
    });
  }

  it("a valid draft is stored", async () => {
    const saved = await updateMethodDraft(analyst, draftId, valid);
    expect(saved.rationale).toBe(valid.rationale);
  });
});
