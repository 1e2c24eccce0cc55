/**
 * The method statement's content: how Ballast estimates risk for this firm. One zod schema for the form and the
 * server. Impossible combinations are refused field by field (λ outside (0, 1), a window shorter than the order,
 * a confidence outside (0, 1), a stress window that ends before it starts).
 */
import { z } from "zod";
import { ASSET_CLASSES } from "@/lib/uploads/asset-classes";
import { realDate } from "./dates";

// A real day, from 1970 (early market stresses) to 2099.
const isoDate = realDate(1970, 2099);

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


/** How the correlation between factors is estimated when each factor's volatility comes from its asset class's estimator. */
export const correlationSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("equal"), window: z.coerce.number().int("Whole days.").min(20, "At least 20 days.").max(2000, "At most 2,000 days.") }),
  z.object({ kind: z.literal("ewma"), lambda: z.coerce.number({ message: "Enter λ." }).gt(0, "λ must be above 0.").lt(1, "λ must be below 1.") }),
  z.object({ kind: z.literal("ccc") }),
]);
export type CorrelationChoice = z.infer<typeof correlationSchema>;

/** How often the backtest re-estimates the model's parameters: every so many business days, or once on the whole sample. */
export const backtestRefitSchema = z.discriminatedUnion("mode", [
  z.object({ mode: z.literal("every"), days: z.coerce.number().int("Whole days.").min(1, "At least every day.").max(250, "At most every 250 days.") }),
  z.object({ mode: z.literal("once") }),
]);
export type BacktestRefitChoice = z.infer<typeof backtestRefitSchema>;

/** The backtest refits every 21 business days (about a month) unless the method statement says otherwise. */
export const DEFAULT_BACKTEST_REFIT: BacktestRefitChoice = { mode: "every", days: 21 };

/**
 * Content stored before the per-asset-class portfolio choices existed, read as what it computed: the one covariance
 * model for every factor, the correlation implied by that model, and the backtest as it was: parameters fitted once
 * on the whole sample for the GARCH-CCC covariance, refits every 21 days otherwise (the EWMA and equal-weight
 * covariances fit nothing, so their figures are unchanged). Stored rows are never rewritten: they are read
 * through this. Content that already has the fields passes unchanged.
 */
export function upgradeMethodContent(raw: unknown): unknown {
  if (raw === null || typeof raw !== "object" || Array.isArray(raw)) return raw;
  const c = raw as Record<string, unknown>;
  const out: Record<string, unknown> = { ...c };
  if (out.portfolioVolatility === undefined) out.portfolioVolatility = "covariance";
  if (out.correlation === undefined) {
    out.correlation =
      c.covariance === "equal"
        ? { kind: "equal", window: c.covarianceWindow ?? 250 }
        : c.covariance === "garch-ccc"
          ? { kind: "ccc" }
          : { kind: "ewma", lambda: c.covarianceLambda ?? 0.94 };
  }
  // the GARCH-CCC covariance fitted its parameters once on the whole sample; the others fit nothing
  if (out.backtestRefit === undefined) out.backtestRefit = c.covariance === "garch-ccc" ? { mode: "once" } : { ...DEFAULT_BACKTEST_REFIT };
  return out;
}

const methodContentObject = z
  .object({
    /** the firm-wide default estimator */
    defaultEstimator: estimatorSchema,
    /** per asset class, where it differs from the default */
    byAssetClass: z.partialRecord(z.enum(ASSET_CLASSES), estimatorSchema).default({}),
    /**
     * Where each factor's volatility in the portfolio figures comes from: "asset-class", the estimator its asset class
     * is assigned (the firm-wide default where none), with the correlation below; "covariance", one covariance model
     * for every factor (`covariance`, `covarianceLambda`, `covarianceWindow`), as versions written before this choice
     * existed computed.
     */
    portfolioVolatility: z.enum(["asset-class", "covariance"], { message: "Choose where the portfolio volatilities come from." }),
    /** the correlation between factors when the volatilities come from the asset classes */
    correlation: correlationSchema,
    /** how often the backtest's forecasts re-estimate the model's parameters (only data up to the day before each forecast) */
    backtestRefit: backtestRefitSchema,
    /** the one covariance model, when `portfolioVolatility` is "covariance" */
    covariance: z.enum(["equal", "ewma", "garch-ccc"], { message: "Choose a covariance." }),
    /** EWMA decay of the one covariance model */
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
    if (value.scaling === "term" && value.varMethod !== "parametric") {
      ctx.addIssue({ code: "custom", path: ["scaling"], message: "The term structure of each factor's variance applies to parametric VaR; historical and filtered simulation scale by the square root of time or use overlapping returns." });
    } else if (value.scaling === "term" && value.portfolioVolatility === "covariance" && value.covariance !== "garch-ccc") {
      ctx.addIssue({ code: "custom", path: ["scaling"], message: "With one covariance model, the term structure needs GARCH volatilities (garch-ccc); or take the volatilities from the asset classes." });
    }
    if (value.portfolioVolatility === "asset-class" && value.correlation.kind === "equal" && value.correlation.window > value.minHistory) {
      ctx.addIssue({ code: "custom", path: ["correlation", "window"], message: `The correlation window (${value.correlation.window}) is longer than the minimum history (${value.minHistory}).` });
    }
    if (value.portfolioVolatility === "covariance" && value.covariance === "garch-ccc" && value.backtestRefit.mode === "every") {
      ctx.addIssue({ code: "custom", path: ["backtestRefit", "mode"], message: "The one GARCH-CCC covariance is fitted once on the whole sample; for refits, take the volatilities from the asset classes." });
    }
    if (value.scaling === "overlap" && value.varMethod === "parametric") {
      ctx.addIssue({ code: "custom", path: ["scaling"], message: "Overlapping multi-day returns apply to historical or filtered simulation, not parametric VaR." });
    }
    if (value.stressWindow.mode === "chosen" && value.stressWindow.end <= value.stressWindow.start) {
      ctx.addIssue({ code: "custom", path: ["stressWindow", "end"], message: "The stress window must end after it starts." });
    }
    if (new Set(value.confidences).size !== value.confidences.length) {
      ctx.addIssue({ code: "custom", path: ["confidences"], message: "Each confidence level once." });
    }
  });

/** The method statement's content; older stored content is read through `upgradeMethodContent`. */
export const methodContentSchema = z.preprocess(upgradeMethodContent, methodContentObject);
export type MethodContent = z.infer<typeof methodContentSchema>;

export const DEFAULT_METHOD_CONTENT: MethodContent = {
  defaultEstimator: DEFAULT_ESTIMATOR,
  byAssetClass: {},
  portfolioVolatility: "asset-class",
  correlation: { kind: "ewma", lambda: 0.94 },
  backtestRefit: DEFAULT_BACKTEST_REFIT,
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

/** A stored content as the current schema reads it (older content upgraded); content that no longer parses is returned upgraded as stored. */
export function readMethodContent(raw: unknown): MethodContent {
  const parsed = methodContentSchema.safeParse(raw);
  return parsed.success ? parsed.data : (upgradeMethodContent(raw) as MethodContent);
}
