/**
 * The capital rule profile form: which regimes a run computes, which one is filed, the internal-models parameters and
 * every rate of the standardised building blocks. One zod schema for the Settings form and the server. Rates are
 * entered in percent (8 = 8 %) and stored as the engine reads them (decimals); `engineStandardisedProfile` and
 * `standardisedFormOf` convert both ways.
 */
import { z } from "zod";
import { STANDARDISED_1996_PROFILE, type StandardisedProfile } from "@/lib/risk/standardised";

export const CAPITAL_REGIMES = ["internal_models", "standardised"] as const;
export type CapitalRegime = (typeof CAPITAL_REGIMES)[number];
export const REGIME_CHOICES = ["internal_models", "standardised", "both"] as const;
export type RegimeChoice = (typeof REGIME_CHOICES)[number];

export const REGIME_LABELS: Record<CapitalRegime, string> = {
  internal_models: "Internal models (value-at-risk based)",
  standardised: "Standardised 1996 building blocks",
};
export const REGIME_CHOICE_LABELS: Record<RegimeChoice, string> = {
  internal_models: "Internal models only",
  standardised: "Standardised building blocks only",
  both: "Both, one of them filed",
};

/** Whether a regime choice computes a regime. */
export function computesRegime(regimes: RegimeChoice, regime: CapitalRegime): boolean {
  return regimes === "both" || regimes === regime;
}

const percent = (label: string, max = 100) =>
  z.coerce.number({ message: `Enter ${label.charAt(0).toLowerCase()}${label.slice(1)} in percent.` }).refine(Number.isFinite, `Enter ${label} in percent.`).min(0, `${label} cannot be below 0 %.`).max(max, `${label} is at most ${max} %.`);

const plusFactorSchema = z.object({
  exceptions: z.coerce.number({ message: "Enter a count of exceptions." }).int("A whole number of exceptions.").min(0, "At least 0.").max(1000, "At most 1,000."),
  addOn: z.coerce.number({ message: "Enter the plus factor." }).min(0, "The plus factor cannot be below 0.").max(5, "The plus factor is at most 5."),
});

export const internalModelsSchema = z.object({
  confidencePercent: z.coerce.number({ message: "Enter the confidence in percent." }).gt(50, "The confidence is above 50 %.").lt(100, "The confidence is below 100 %."),
  horizonDays: z.coerce.number({ message: "Enter the horizon in days." }).int("Whole days.").min(1, "At least 1 day.").max(250, "At most 250 days."),
  averagingDays: z.coerce.number({ message: "Enter the averaging days." }).int("Whole days.").min(1, "At least 1 day.").max(250, "At most 250 days."),
  baseMultiplier: z.coerce.number({ message: "Enter the multiplier." }).min(1, "The multiplier is at least 1.").max(10, "The multiplier is at most 10."),
  stressedMultiplier: z.coerce.number({ message: "Enter the multiplier." }).min(0, "The multiplier cannot be below 0.").max(10, "The multiplier is at most 10."),
  backtestDays: z.coerce.number({ message: "Enter the backtest days." }).int("Whole days.").min(20, "At least 20 days.").max(1000, "At most 1,000 days."),
  plusFactors: z
    .array(plusFactorSchema)
    .max(50, "At most 50 rows.")
    .superRefine((rows, ctx) => {
      const seen = new Map<number, number>();
      rows.forEach((r, i) => {
        const first = seen.get(r.exceptions);
        if (first !== undefined) ctx.addIssue({ code: "custom", path: [i, "exceptions"], message: `${r.exceptions} exceptions already has a row (row ${first + 1}).` });
        else seen.set(r.exceptions, i);
      });
    }),
});
export type InternalModelsInput = z.infer<typeof internalModelsSchema>;

const bandSchema = z.object({
  band: z.string().min(1).max(60),
  zone: z.union([z.literal(1), z.literal(2), z.literal(3)]),
  weightPercent: percent("The band's risk weight"),
  /** years; null = open-ended; undefined = not in the high-coupon column */
  highCouponUpToYears: z.number().positive().nullable().optional(),
  lowCouponUpToYears: z.number().positive().nullable(),
  yieldChangePercent: z.coerce.number({ message: "Enter the yield change in percentage points." }).min(0, "The yield change cannot be below 0.").max(10, "The yield change is at most 10 points."),
});

const tierSchema = z.object({
  /** months; null = open-ended (the last tier) */
  upToMonths: z.number().positive().nullable(),
  ratePercent: percent("The qualifying weight"),
});

export const standardisedFormSchema = z.object({
  name: z.string().trim().min(2, "Name the rule set (at least 2 characters).").max(80, "At most 80 characters."),
  interestRateMethod: z.enum(["maturity", "duration"], { message: "Choose the maturity or the duration method." }),
  governmentPercent: percent("The government weight"),
  qualifying: z.array(tierSchema).min(1, "At least one qualifying tier.").max(10),
  otherPercent: percent("The other issuers' weight"),
  couponThresholdPercent: percent("The coupon threshold", 50),
  bands: z.array(bandSchema).min(1).max(30),
  verticalMaturityPercent: percent("The vertical disallowance"),
  verticalDurationPercent: percent("The vertical disallowance"),
  withinZone1Percent: percent("Zone 1's horizontal disallowance"),
  withinZone2Percent: percent("Zone 2's horizontal disallowance"),
  withinZone3Percent: percent("Zone 3's horizontal disallowance"),
  betweenZones12Percent: percent("The zone 1–2 disallowance", 300),
  betweenZones23Percent: percent("The zone 2–3 disallowance", 300),
  betweenZones13Percent: percent("The zone 1–3 disallowance", 300),
  residualPercent: percent("The residual rate", 300),
  equitySpecificPercent: percent("The equity specific rate"),
  equityLiquidDiversifiedPercent: percent("The liquid and diversified rate"),
  equityLiquidAndDiversified: z.boolean(),
  equityGeneralPercent: percent("The equity general rate"),
  fxPercent: percent("The foreign-exchange rate"),
  fxApplyDeMinimis: z.boolean(),
  fxDeMinimisGrossPercent: percent("The de minimis gross limit", 1000),
  fxDeMinimisNetPercent: percent("The de minimis net limit"),
  fxEligibleCapital: z.union([z.literal("").transform(() => null), z.null(), z.coerce.number({ message: "Enter an amount, or leave it empty." }).positive("Eligible capital is above zero.")]),
  commodityMethod: z.enum(["simplified", "maturity"], { message: "Choose the simplified or the maturity ladder approach." }),
  commodityNetPercent: percent("The commodity net rate"),
  commodityGrossPercent: percent("The commodity gross rate"),
  commoditySpreadPercent: percent("The spread rate"),
  commodityCarryPercent: percent("The carry rate"),
  commodityOutrightPercent: percent("The outright rate"),
  optionsFxPercent: percent("The options rate for a currency or gold underlying"),
  optionsCommodityPercent: percent("The options rate for a commodity underlying"),
}).superRefine((v, ctx) => {
  v.qualifying.forEach((t, i) => {
    const last = i === v.qualifying.length - 1;
    if (last && t.upToMonths !== null) ctx.addIssue({ code: "custom", path: ["qualifying", i, "upToMonths"], message: "The last qualifying tier is open-ended." });
    if (!last && t.upToMonths === null) ctx.addIssue({ code: "custom", path: ["qualifying", i, "upToMonths"], message: "Only the last qualifying tier is open-ended." });
    const prev = v.qualifying[i - 1]?.upToMonths;
    if (i > 0 && prev != null && t.upToMonths != null && t.upToMonths <= prev) ctx.addIssue({ code: "custom", path: ["qualifying", i, "upToMonths"], message: "Each tier ends after the one before it." });
  });
  if (v.fxApplyDeMinimis && v.fxEligibleCapital === null) {
    ctx.addIssue({ code: "custom", path: ["fxEligibleCapital"], message: "The de minimis exemption needs the eligible capital to test against." });
  }
});
export type StandardisedFormInput = z.input<typeof standardisedFormSchema>;
export type StandardisedFormValues = z.output<typeof standardisedFormSchema>;

export const capitalProfileSchema = z
  .object({
    name: z.string().trim().min(2, "Name the profile (at least 2 characters).").max(120, "At most 120 characters."),
    reason: z.string().trim().min(5, "Say why this version is made (at least 5 characters).").max(1000, "At most 1,000 characters."),
    regimes: z.enum(REGIME_CHOICES, { message: "Choose which figures a run computes." }),
    filedRegime: z.enum(CAPITAL_REGIMES, { message: "Choose which figure is filed." }),
    showRwa: z.boolean(),
    internal: internalModelsSchema,
    standardised: standardisedFormSchema,
  })
  .superRefine((v, ctx) => {
    if (!computesRegime(v.regimes, v.filedRegime)) {
      ctx.addIssue({ code: "custom", path: ["filedRegime"], message: "The filed figure must be one the run computes." });
    }
  });
export type CapitalProfileInput = z.input<typeof capitalProfileSchema>;
export type CapitalProfileValues = z.output<typeof capitalProfileSchema>;

/** A percent as entered, from a decimal rate (0.0175 → 1.75), without binary noise. */
export function toPercent(rate: number): number {
  return Number((rate * 100).toPrecision(12));
}

/** A decimal rate from a percent as entered (1.75 → 0.0175), without binary noise. */
export function fromPercent(percentValue: number): number {
  return Number((percentValue / 100).toPrecision(12));
}

/** A maturity band's label, zone and edges, the same in the form and the engine (the high-coupon edge only where the row has one). */
function bandRow(b: Pick<StandardisedProfile["interestRate"]["bands"][number], "band" | "zone" | "highCouponUpToYears" | "lowCouponUpToYears">) {
  return { band: b.band, zone: b.zone, ...(b.highCouponUpToYears !== undefined ? { highCouponUpToYears: b.highCouponUpToYears } : {}), lowCouponUpToYears: b.lowCouponUpToYears };
}

/** The form's standardised section for an engine profile (decimals → percent). */
export function standardisedFormOf(p: StandardisedProfile): StandardisedFormValues {
  const ir = p.interestRate;
  return {
    name: p.name,
    interestRateMethod: ir.method,
    governmentPercent: toPercent(ir.specific.government),
    qualifying: ir.specific.qualifying.map((t) => ({ upToMonths: t.upToYears === null ? null : Number((t.upToYears * 12).toPrecision(12)), ratePercent: toPercent(t.rate) })),
    otherPercent: toPercent(ir.specific.other),
    couponThresholdPercent: ir.couponThresholdPercent,
    bands: ir.bands.map((b) => ({ ...bandRow(b), weightPercent: toPercent(b.weight), yieldChangePercent: b.yieldChange })),
    verticalMaturityPercent: toPercent(ir.verticalMaturity),
    verticalDurationPercent: toPercent(ir.verticalDuration),
    withinZone1Percent: toPercent(ir.withinZone.zone1),
    withinZone2Percent: toPercent(ir.withinZone.zone2),
    withinZone3Percent: toPercent(ir.withinZone.zone3),
    betweenZones12Percent: toPercent(ir.betweenZones.zone12),
    betweenZones23Percent: toPercent(ir.betweenZones.zone23),
    betweenZones13Percent: toPercent(ir.betweenZones.zone13),
    residualPercent: toPercent(ir.residual),
    equitySpecificPercent: toPercent(p.equity.specificRate),
    equityLiquidDiversifiedPercent: toPercent(p.equity.liquidDiversifiedRate),
    equityLiquidAndDiversified: p.equity.liquidAndDiversified,
    equityGeneralPercent: toPercent(p.equity.generalRate),
    fxPercent: toPercent(p.fx.rate),
    fxApplyDeMinimis: p.fx.applyDeMinimis,
    fxDeMinimisGrossPercent: toPercent(p.fx.deMinimisGrossLimit),
    fxDeMinimisNetPercent: toPercent(p.fx.deMinimisNetLimit),
    fxEligibleCapital: p.fx.eligibleCapital,
    commodityMethod: p.commodities.method,
    commodityNetPercent: toPercent(p.commodities.netRate),
    commodityGrossPercent: toPercent(p.commodities.grossRate),
    commoditySpreadPercent: toPercent(p.commodities.ladder.spreadRate),
    commodityCarryPercent: toPercent(p.commodities.ladder.carryRate),
    commodityOutrightPercent: toPercent(p.commodities.ladder.outrightRate),
    optionsFxPercent: toPercent(p.options.fxRate),
    optionsCommodityPercent: toPercent(p.options.commodityRate),
  };
}

/** The engine profile for the form's standardised section (percent → decimals); the ladder edges of commodities keep the defaults. */
export function engineStandardisedProfile(v: StandardisedFormValues, showRwa: boolean): StandardisedProfile {
  const d = STANDARDISED_1996_PROFILE;
  return {
    name: v.name,
    interestRate: {
      method: v.interestRateMethod,
      specific: {
        government: fromPercent(v.governmentPercent),
        qualifying: v.qualifying.map((t) => ({ upToYears: t.upToMonths === null ? null : Number((t.upToMonths / 12).toPrecision(12)), rate: fromPercent(t.ratePercent) })),
        other: fromPercent(v.otherPercent),
      },
      couponThresholdPercent: v.couponThresholdPercent,
      bands: v.bands.map((b) => ({ ...bandRow(b), weight: fromPercent(b.weightPercent), yieldChange: b.yieldChangePercent })),
      verticalMaturity: fromPercent(v.verticalMaturityPercent),
      verticalDuration: fromPercent(v.verticalDurationPercent),
      withinZone: { zone1: fromPercent(v.withinZone1Percent), zone2: fromPercent(v.withinZone2Percent), zone3: fromPercent(v.withinZone3Percent) },
      betweenZones: { zone12: fromPercent(v.betweenZones12Percent), zone23: fromPercent(v.betweenZones23Percent), zone13: fromPercent(v.betweenZones13Percent) },
      residual: fromPercent(v.residualPercent),
    },
    equity: {
      specificRate: fromPercent(v.equitySpecificPercent),
      liquidDiversifiedRate: fromPercent(v.equityLiquidDiversifiedPercent),
      liquidAndDiversified: v.equityLiquidAndDiversified,
      generalRate: fromPercent(v.equityGeneralPercent),
    },
    fx: {
      rate: fromPercent(v.fxPercent),
      applyDeMinimis: v.fxApplyDeMinimis,
      deMinimisGrossLimit: fromPercent(v.fxDeMinimisGrossPercent),
      deMinimisNetLimit: fromPercent(v.fxDeMinimisNetPercent),
      eligibleCapital: v.fxEligibleCapital,
    },
    commodities: {
      method: v.commodityMethod,
      netRate: fromPercent(v.commodityNetPercent),
      grossRate: fromPercent(v.commodityGrossPercent),
      ladder: {
        upToYears: [...d.commodities.ladder.upToYears],
        spreadRate: fromPercent(v.commoditySpreadPercent),
        carryRate: fromPercent(v.commodityCarryPercent),
        outrightRate: fromPercent(v.commodityOutrightPercent),
      },
    },
    options: { fxRate: fromPercent(v.optionsFxPercent), commodityRate: fromPercent(v.optionsCommodityPercent) },
    showRwa,
    rwaMultiplier: d.rwaMultiplier,
  };
}

/** Plus factors by exception count of the 1996 backtesting framework (Basel Committee, January 1996, Table 2). */
export const DEFAULT_PLUS_FACTORS: Record<string, number> = { "5": 0.4, "6": 0.5, "7": 0.65, "8": 0.75, "9": 0.85, "10": 1 };

/** The default profile as the form shows it: internal models filed, the 1996 building blocks' defaults ready. */
export function defaultCapitalProfileForm(): CapitalProfileValues {
  return {
    name: "Default (Basel market-risk framework)",
    reason: "",
    regimes: "internal_models",
    filedRegime: "internal_models",
    showRwa: false,
    internal: {
      confidencePercent: 99,
      horizonDays: 10,
      averagingDays: 60,
      baseMultiplier: 3,
      stressedMultiplier: 3,
      backtestDays: 250,
      plusFactors: Object.entries(DEFAULT_PLUS_FACTORS).map(([k, v]) => ({ exceptions: Number(k), addOn: v })),
    },
    standardised: standardisedFormOf(STANDARDISED_1996_PROFILE),
  };
}
