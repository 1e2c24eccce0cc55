/**
 * The method statement's content: how Ballast estimates risk for this firm. One zod schema for the form and the
 * server. Impossible combinations are refused field by field (λ outside (0, 1), a window shorter than the order,
 * a confidence outside (0, 1), a stress window that ends before it starts).
 */
import { z } from "zod";
import { ASSET_CLASSES } from "@/lib/uploads/asset-classes";

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date as yyyy-mm-dd.");

export const estimatorSchema = z.discriminatedUnion("kind", [
  z.object({
    kind: z.literal("ma"),
    window: z.coerce.number().int("Whole days.").min(5, "At least 5 days.").max(1000, "At most 1,000 days."),
    divisor: z.enum(["m", "m-1"], { message: "Choose M or M−1." }),
    mean: z.enum(["zero", "sample"], { message: "Choose zero or sample mean." }),
  }),
  z.object({
    kind: z.literal("ewma"),
    lambdaMode: z.enum(["fixed", "fit"], { message: "Fixed or fitted." }),
    lambda: z.coerce.number({ message: "Enter λ." }).gt(0, "λ must be above 0.").lt(1, "λ must be below 1."),
  }),
  z.object({
    kind: z.literal("arch"),
    order: z.coerce.number().int("A whole number.").min(1, "At least 1.").max(10, "At most 10."),
  }),
  z.object({
    kind: z.literal("garch"),
    distribution: z.enum(["normal", "t"], { message: "Normal or Student-t." }),
    mean: z.enum(["zero", "fit"], { message: "Zero or fitted mean." }),
    targeting: z.boolean(),
    fallback: z.enum(["ewma", "none"], { message: "Choose a fallback." }),
  }),
]);
export type EstimatorChoice = z.infer<typeof estimatorSchema>;

export const ESTIMATOR_LABELS: Record<EstimatorChoice["kind"], string> = {
  ma: "Equal-weight moving average",
  ewma: "EWMA",
  arch: "ARCH(m)",
  garch: "GARCH(1,1)",
};

/** Sensible defaults: EWMA λ 0.94 (J.P. Morgan/Reuters 1996) everywhere, parametric 99 % and 97.5 %, ten days. */
export const DEFAULT_ESTIMATOR: EstimatorChoice = { kind: "ewma", lambdaMode: "fixed", lambda: 0.94 };

export const methodContentSchema = z
  .object({
    /** the firm-wide default estimator */
    defaultEstimator: estimatorSchema,
    /** per asset class, where it differs from the default */
    byAssetClass: z.partialRecord(z.enum(ASSET_CLASSES), estimatorSchema).default({}),
    covariance: z.enum(["equal", "ewma", "garch-ccc"], { message: "Choose a covariance." }),
    /** EWMA decay of the covariance (shared with an EWMA volatility choice) */
    covarianceLambda: z.coerce.number().gt(0, "λ must be above 0.").lt(1, "λ must be below 1."),
    covarianceWindow: z.coerce.number().int().min(20, "At least 20 days.").max(2000, "At most 2,000 days."),
    varMethod: z.enum(["parametric", "historical", "filtered"], { message: "Choose a VaR method." }),
    distribution: z.enum(["normal", "t"]),
    confidences: z
      .array(z.coerce.number().gt(0, "A confidence is above 0.").lt(1, "A confidence is below 1."))
      .min(1, "Give at least one confidence level.")
      .max(4, "At most four confidence levels."),
    horizonDays: z.coerce.number().int().min(1, "At least 1 day.").max(20, "At most 20 days."),
    scaling: z.enum(["sqrt", "term", "overlap"], { message: "Choose a horizon scaling." }),
    historicalWindow: z.coerce.number().int().min(100, "At least 100 days.").max(2000, "At most 2,000 days."),
    stressWindow: z.discriminatedUnion("mode", [
      z.object({ mode: z.literal("search") }),
      z.object({ mode: z.literal("chosen"), start: isoDate, end: isoDate }),
    ]),
    /** returns a factor needs to be used; factors with fewer are excluded and listed */
    minHistory: z.coerce.number().int().min(20, "At least 20 returns.").max(2000, "At most 2,000 returns."),
  })
  .superRefine((value, ctx) => {
    const estimators: [string, EstimatorChoice][] = [["defaultEstimator", value.defaultEstimator], ...Object.entries(value.byAssetClass).map(([k, v]) => [`byAssetClass.${k}`, v!] as [string, EstimatorChoice])];
    for (const [path, e] of estimators) {
      if (e.kind === "ma" && e.window > value.minHistory) {
        ctx.addIssue({ code: "custom", path: [...path.split("."), "window"], message: `The window (${e.window}) is longer than the minimum history (${value.minHistory}).` });
      }
      if (e.kind === "arch" && value.minHistory < e.order * 10) {
        ctx.addIssue({ code: "custom", path: [...path.split("."), "order"], message: `ARCH(${e.order}) needs a minimum history of at least ${e.order * 10} returns.` });
      }
    }
    if (value.scaling === "term" && !(value.varMethod === "parametric" && value.covariance === "garch-ccc")) {
      ctx.addIssue({ code: "custom", path: ["scaling"], message: "The GARCH term structure needs parametric VaR with GARCH volatilities (garch-ccc)." });
    }
    if (value.scaling === "overlap" && value.varMethod === "parametric") {
      ctx.addIssue({ code: "custom", path: ["scaling"], message: "Overlapping ten-day returns apply to historical or filtered simulation, not parametric VaR." });
    }
    if (value.stressWindow.mode === "chosen" && value.stressWindow.end <= value.stressWindow.start) {
      ctx.addIssue({ code: "custom", path: ["stressWindow", "end"], message: "The stress window must end after it starts." });
    }
    if (new Set(value.confidences).size !== value.confidences.length) {
      ctx.addIssue({ code: "custom", path: ["confidences"], message: "Each confidence level once." });
    }
  });
export type MethodContent = z.infer<typeof methodContentSchema>;

export const DEFAULT_METHOD_CONTENT: MethodContent = {
  defaultEstimator: DEFAULT_ESTIMATOR,
  byAssetClass: {},
  covariance: "ewma",
  covarianceLambda: 0.94,
  covarianceWindow: 250,
  varMethod: "parametric",
  distribution: "normal",
  confidences: [0.99, 0.975],
  horizonDays: 10,
  scaling: "sqrt",
  historicalWindow: 500,
  stressWindow: { mode: "search" },
  minHistory: 250,
};

/** A draft version as the form sends it. */
export const methodDraftSchema = z.object({
  content: methodContentSchema,
  rationale: z.string().trim().min(20, "Explain the choice in at least a sentence (20 characters).").max(20_000, "At most 20,000 characters."),
  /** the analyst's own limitations, beyond the engine's catalogue (which cannot be removed) */
  analystLimitations: z.array(z.string().trim().min(3, "Too short.").max(1000, "At most 1,000 characters.")).max(30, "At most 30."),
  /** why this version changes the previous one (required from the second version on) */
  reason: z.string().trim().max(2000, "At most 2,000 characters.").default(""),
});
export type MethodDraft = z.infer<typeof methodDraftSchema>;

/** POST /api/method: open a new draft (the reason is required once an approved version exists). */
export const newMethodDraftSchema = z.object({
  reason: z.string({ message: "The reason is text." }).trim().max(2000, "At most 2,000 characters.").default(""),
});

/** POST /api/method/[methodId]/approve: approve or co-approve, with an optional note for the audit trail. */
export const approveMethodSchema = z.object({
  note: z.string({ message: "The note is text." }).trim().max(2000, "At most 2,000 characters.").default(""),
});

/** POST /api/method/[methodId]/evidence: recompute the evidence, for the latest period or a chosen one. */
export const methodEvidenceSchema = z.object({
  periodId: z.string({ message: "A period id." }).uuid("A period id.").optional(),
});

/** POST /api/method/[methodId]/discard */
export const discardMethodSchema = z.object({
  reason: z.string({ message: "The reason is text." }).trim().max(2000, "At most 2,000 characters.").default(""),
});

/** GET /api/method/diff?from=&to= (both optional: the newest version against the one it was drawn from) */
export const methodDiffQuerySchema = z.object({
  from: z.string().uuid("A version id.").optional(),
  to: z.string().uuid("A version id.").optional(),
});
