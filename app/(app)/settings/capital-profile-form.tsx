"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { useFieldArray, useForm, useWatch, type FieldPath } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import {
  capitalProfileSchema,
  defaultCapitalProfileForm,
  REGIME_CHOICE_LABELS,
  REGIME_CHOICES,
  REGIME_LABELS,
  CAPITAL_REGIMES,
  type CapitalProfileInput,
  type CapitalProfileValues,
} from "@/lib/validation/capital-profile";
import { apiFetch, ApiError } from "@/app/_components/api";
import { Field, inputClass, primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import type { CapitalProfileVersion } from "@/lib/data/capital-profile";

type Path = FieldPath<CapitalProfileInput>;

/** The error message react-hook-form holds at a dotted path. */
function errorAt(errors: unknown, path: string): string | undefined {
  let node = errors as Record<string, unknown> | undefined;
  for (const part of path.split(".")) {
    if (!node) return undefined;
    node = node[part] as Record<string, unknown> | undefined;
  }
  return (node as { message?: string } | undefined)?.message;
}

/** An empty number input is missing (the schema then names it), never read as 0. */
const emptyToUndefined = (v: unknown) => (v === "" || v === null || v === undefined ? undefined : Number(v));
const emptyToNull = (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v));

function years(y: number | null | undefined): string {
  if (y === undefined) return "—";
  if (y === null) return "open";
  return y < 1 ? `${Number((y * 12).toPrecision(6))} m` : `${Number(y.toPrecision(6))} y`;
}

export function CapitalProfileForm({ current, versions, editable }: { current: CapitalProfileVersion | null; versions: CapitalProfileVersion[]; editable: boolean }) {
  const router = useRouter();
  const [status, setStatus] = useState<{ tone: "ok" | "alert"; text: string } | null>(null);
  const initial = current?.form ?? defaultCapitalProfileForm();
  const {
    register,
    handleSubmit,
    control,
    setError,
    reset,
    formState: { errors, isSubmitting, isDirty },
  } = useForm<CapitalProfileInput, unknown, CapitalProfileValues>({
    resolver: zodResolver(capitalProfileSchema),
    defaultValues: initial,
  });
  const plusFactors = useFieldArray({ control, name: "internal.plusFactors" });
  const bands = useWatch({ control, name: "standardised.bands" }) ?? initial.standardised.bands;
  const tiers = useWatch({ control, name: "standardised.qualifying" }) ?? initial.standardised.qualifying;
  const regimes = useWatch({ control, name: "regimes" });
  const irMethod = useWatch({ control, name: "standardised.interestRateMethod" });

  const onSubmit = handleSubmit(async (values) => {
    setStatus(null);
    try {
      const saved = await apiFetch<CapitalProfileVersion>("/api/capital-profile", { method: "POST", body: values });
      reset(saved.form);
      setStatus({ tone: "ok", text: `Saved as version ${saved.version}. Runs started from now use it.` });
      router.refresh();
    } catch (error) {
      if (error instanceof ApiError && error.fields) {
        for (const [field, message] of Object.entries(error.fields)) setError(field as Path, { message });
      }
      setStatus({ tone: "alert", text: error instanceof Error ? error.message : "Could not save." });
    }
  });

  const a11y = (path: string) => {
    const message = errorAt(errors, path);
    const id = path.replace(/\./g, "-");
    return { id, "aria-invalid": Boolean(message), "aria-describedby": message ? `${id}-error` : undefined };
  };
  const num = (path: Path, label: string, hint?: string, step = "any") => {
    const id = path.replace(/\./g, "-");
    return (
      <Field id={id} label={label} hint={hint} error={errorAt(errors, path)}>
        <input type="number" step={step} inputMode="decimal" className={`${inputClass} figure`} {...a11y(path)} {...register(path, { setValueAs: path === "standardised.fxEligibleCapital" ? emptyToNull : emptyToUndefined })} />
      </Field>
    );
  };
  const check = (path: Path, label: string) => (
    <label className="flex items-start gap-2 text-sm">
      <input type="checkbox" className="mt-1" {...register(path)} />
      <span>{label}</span>
    </label>
  );
  const nextVersion = (versions[0]?.version ?? 0) + 1;

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-6 rounded-lg border border-ink-line bg-paper-raised p-5" aria-label="Capital rule profile">
      <p role="note" className="rounded-md border border-ink-line bg-paper px-3 py-2 text-sm text-ink-soft">
        These are the firm&apos;s own rules: every rate below is a setting, filled with the 1996 building blocks&apos; and the internal-models defaults. Your local rules
        and the regulator&apos;s current requirements govern; check each figure against them before you file.
      </p>
      {current ? (
        <p className="text-sm text-ink-soft">
          Version {current.version} in force since {current.createdAt.slice(0, 10)}
          {current.createdBy ? `, saved by ${current.createdBy.name}` : ""}
          {current.reason ? ` — “${current.reason}”` : ""}.
        </p>
      ) : (
        <p className="text-sm text-ink-soft">No profile is stored yet: runs use the defaults shown. Saving makes version 1.</p>
      )}

      <fieldset disabled={!editable} className="flex flex-col gap-6">
        <section aria-labelledby="cp-regime" className="grid gap-4 xl:grid-cols-2">
          <h3 id="cp-regime" className="font-semibold xl:col-span-2">
            Which figure is filed
          </h3>
          <Field id="cp-name" label="Profile name" error={errors.name?.message}>
            <input className={inputClass} {...a11y("name")} id="cp-name" {...register("name")} />
          </Field>
          <Field id="regimes" label="A run computes" error={errors.regimes?.message}>
            <select className={inputClass} {...a11y("regimes")} {...register("regimes")}>
              {REGIME_CHOICES.map((c) => (
                <option key={c} value={c}>
                  {REGIME_CHOICE_LABELS[c]}
                </option>
              ))}
            </select>
          </Field>
          <Field id="filedRegime" label="Filed figure" hint="The draft filing and both packs carry this figure; the other is shown beside it as comparison." error={errors.filedRegime?.message}>
            <select className={inputClass} {...a11y("filedRegime")} {...register("filedRegime")}>
              {CAPITAL_REGIMES.map((r) => (
                <option key={r} value={r}>
                  {REGIME_LABELS[r]}
                </option>
              ))}
            </select>
          </Field>
          <div className="self-end">{check("showRwa", "Show the risk-weighted-asset equivalent (capital × 12.5)")}</div>
        </section>

        <details className="rounded-md border border-ink-line p-4" open={regimes !== "standardised"}>
          <summary className="cursor-pointer font-semibold">Internal models (value-at-risk based)</summary>
          <div className="mt-4 grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
            {num("internal.confidencePercent", "Confidence (%)")}
            {num("internal.horizonDays", "Horizon (days)", undefined, "1")}
            {num("internal.averagingDays", "Averaging days", undefined, "1")}
            {num("internal.baseMultiplier", "VaR multiplier")}
            {num("internal.stressedMultiplier", "Stressed VaR multiplier")}
            {num("internal.backtestDays", "Backtest days", undefined, "1")}
          </div>
          <table className="mt-4 text-sm">
            <caption className="mb-1 text-left font-medium">Plus factor by backtest exceptions</caption>
            <thead>
              <tr className="text-left text-ink-muted">
                <th className="pr-4 font-normal">From exceptions</th>
                <th className="pr-4 font-normal">Plus factor</th>
                <th />
              </tr>
            </thead>
            <tbody>
              {plusFactors.fields.map((f, i) => (
                <tr key={f.id}>
                  <td className="pr-4 py-1">
                    <input type="number" step="1" aria-label={`Exceptions, row ${i + 1}`} className={`${inputClass} figure w-24`} {...a11y(`internal.plusFactors.${i}.exceptions`)} {...register(`internal.plusFactors.${i}.exceptions`)} />
                    {errorAt(errors, `internal.plusFactors.${i}.exceptions`) ? <p className="text-sm text-alert" role="alert">{errorAt(errors, `internal.plusFactors.${i}.exceptions`)}</p> : null}
                  </td>
                  <td className="pr-4 py-1">
                    <input type="number" step="any" aria-label={`Plus factor, row ${i + 1}`} className={`${inputClass} figure w-24`} {...a11y(`internal.plusFactors.${i}.addOn`)} {...register(`internal.plusFactors.${i}.addOn`)} />
                  </td>
                  <td>
                    <button type="button" className="text-sm underline" onClick={() => plusFactors.remove(i)}>
                      Remove
                    </button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <button type="button" className={`${secondaryButtonClass} mt-2`} onClick={() => plusFactors.append({ exceptions: 0, addOn: 0 })}>
            Add a row
          </button>
        </details>

        <details className="rounded-md border border-ink-line p-4" open={regimes !== "internal_models"}>
          <summary className="cursor-pointer font-semibold">Standardised 1996 building blocks</summary>
          <div className="mt-4 flex flex-col gap-6">
            <div className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
              <Field id="standardised-name" label="Rule set name" error={errorAt(errors, "standardised.name")}>
                <input className={inputClass} {...a11y("standardised.name")} {...register("standardised.name")} />
              </Field>
              <Field id="standardised-interestRateMethod" label="Debt general market risk" error={errorAt(errors, "standardised.interestRateMethod")}>
                <select className={inputClass} {...a11y("standardised.interestRateMethod")} {...register("standardised.interestRateMethod")}>
                  <option value="maturity">Maturity method</option>
                  <option value="duration">Duration method</option>
                </select>
              </Field>
              {num("standardised.couponThresholdPercent", "Coupon threshold (%)", "Coupons at or above it use the first ladder column.")}
            </div>

            <fieldset className="grid gap-4 sm:grid-cols-2 xl:grid-cols-4">
              <legend className="mb-2 font-medium">Debt specific risk</legend>
              {num("standardised.governmentPercent", "Government (%)")}
              {num("standardised.otherPercent", "Other issuers (%)")}
              <table className="text-sm sm:col-span-2">
                <caption className="text-left font-medium">Qualifying issuers by residual maturity</caption>
                <thead>
                  <tr className="text-left text-ink-muted">
                    <th className="pr-4 font-normal">Up to</th>
                    <th className="font-normal">Weight (%)</th>
                  </tr>
                </thead>
                <tbody>
                  {tiers.map((t: CapitalProfileInput["standardised"]["qualifying"][number], i: number) => (
                    <tr key={i}>
                      <td className="pr-4 figure">{t.upToMonths === null ? "over the last edge" : `${t.upToMonths} months`}</td>
                      <td>
                        <input type="number" step="any" aria-label={`Qualifying weight up to ${t.upToMonths ?? "open"} months`} className={`${inputClass} figure w-24`} {...a11y(`standardised.qualifying.${i}.ratePercent`)} {...register(`standardised.qualifying.${i}.ratePercent`)} />
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </fieldset>

            <div className="relative overflow-x-auto">
              <table className="min-w-full text-sm">
                <caption className="mb-1 text-left font-medium">
                  Maturity ladder: risk weights ({irMethod === "duration" ? "the duration method uses the yield changes and the second column's edges on modified duration" : "the maturity method uses the weights"})
                </caption>
                <thead>
                  <tr className="text-left text-ink-muted">
                    <th className="pr-3 font-normal">Band</th>
                    <th className="pr-3 font-normal">Zone</th>
                    <th className="pr-3 text-right font-normal">Coupon ≥ threshold, up to</th>
                    <th className="pr-3 text-right font-normal">Coupon below, up to</th>
                    <th className="pr-3 font-normal">Risk weight (%)</th>
                    <th className="font-normal">Yield change (points)</th>
                  </tr>
                </thead>
                <tbody>
                  {bands.map((b: CapitalProfileInput["standardised"]["bands"][number], i: number) => (
                    <tr key={b.band} className="border-t border-ink-line">
                      <th scope="row" className="pr-3 py-1 text-left font-normal">
                        {b.band}
                      </th>
                      <td className="pr-3 figure">{b.zone}</td>
                      <td className="pr-3 text-right figure">{years(b.highCouponUpToYears)}</td>
                      <td className="pr-3 text-right figure">{years(b.lowCouponUpToYears)}</td>
                      <td className="pr-3">
                        <input type="number" step="any" aria-label={`Risk weight, band ${b.band}`} className={`${inputClass} figure w-24`} {...a11y(`standardised.bands.${i}.weightPercent`)} {...register(`standardised.bands.${i}.weightPercent`)} />
                      </td>
                      <td>
                        <input type="number" step="any" aria-label={`Yield change, band ${b.band}`} className={`${inputClass} figure w-24`} {...a11y(`standardised.bands.${i}.yieldChangePercent`)} {...register(`standardised.bands.${i}.yieldChangePercent`)} />
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>

            <fieldset className="grid gap-4 sm:grid-cols-2 xl:grid-cols-4">
              <legend className="mb-2 font-medium">Disallowances (applied in this order)</legend>
              {num("standardised.verticalMaturityPercent", "Vertical, maturity method (%)")}
              {num("standardised.verticalDurationPercent", "Vertical, duration method (%)")}
              {num("standardised.withinZone1Percent", "Within zone 1 (%)")}
              {num("standardised.withinZone2Percent", "Within zone 2 (%)")}
              {num("standardised.withinZone3Percent", "Within zone 3 (%)")}
              {num("standardised.betweenZones12Percent", "Between zones 1 and 2 (%)")}
              {num("standardised.betweenZones23Percent", "Between zones 2 and 3 (%)")}
              {num("standardised.betweenZones13Percent", "Between zones 1 and 3 (%)", "100 % by default; 150 % in some jurisdictions.")}
              {num("standardised.residualPercent", "Residual net position (%)")}
            </fieldset>

            <fieldset className="grid gap-4 sm:grid-cols-2 xl:grid-cols-4">
              <legend className="mb-2 font-medium">Equities, per national market</legend>
              {num("standardised.equitySpecificPercent", "Specific risk (%)")}
              {num("standardised.equityLiquidDiversifiedPercent", "Specific, liquid and diversified (%)")}
              {num("standardised.equityGeneralPercent", "General market risk (%)")}
              <div className="self-end">{check("standardised.equityLiquidAndDiversified", "The portfolio is liquid and well diversified")}</div>
            </fieldset>

            <fieldset className="grid gap-4 sm:grid-cols-2 xl:grid-cols-4">
              <legend className="mb-2 font-medium">Foreign exchange and gold (shorthand method)</legend>
              {num("standardised.fxPercent", "Rate on the overall net open position (%)")}
              {num("standardised.fxDeMinimisGrossPercent", "De minimis: gross limit (% of eligible capital)")}
              {num("standardised.fxDeMinimisNetPercent", "De minimis: net limit (% of eligible capital)")}
              {num("standardised.fxEligibleCapital", "Eligible capital", "In the reporting currency; leave empty when not tested.")}
              <div className="sm:col-span-2">{check("standardised.fxApplyDeMinimis", "Apply the de minimis exemption when both limits are met (it is always tested and reported)")}</div>
            </fieldset>

            <fieldset className="grid gap-4 sm:grid-cols-2 xl:grid-cols-4">
              <legend className="mb-2 font-medium">Commodities and options</legend>
              <Field id="standardised-commodityMethod" label="Commodities approach" error={errorAt(errors, "standardised.commodityMethod")}>
                <select className={inputClass} {...a11y("standardised.commodityMethod")} {...register("standardised.commodityMethod")}>
                  <option value="simplified">Simplified</option>
                  <option value="maturity">Maturity ladder</option>
                </select>
              </Field>
              {num("standardised.commodityNetPercent", "Simplified: on the net (%)")}
              {num("standardised.commodityGrossPercent", "Simplified: on the gross (%)")}
              {num("standardised.commoditySpreadPercent", "Ladder: spread rate (%)")}
              {num("standardised.commodityCarryPercent", "Ladder: carry rate (%)")}
              {num("standardised.commodityOutrightPercent", "Ladder: outright rate (%)")}
              {num("standardised.optionsFxPercent", "Options on currency or gold (%)")}
              {num("standardised.optionsCommodityPercent", "Options on a commodity (%)")}
            </fieldset>
          </div>
        </details>

        <Field id="reason" label="Why this version" hint="Kept with the version and in the audit log; runs record the version they used." error={errors.reason?.message}>
          <textarea rows={2} className={inputClass} {...a11y("reason")} id="reason" {...register("reason")} />
        </Field>
      </fieldset>

      {editable ? (
        <div className="flex flex-wrap items-center gap-3">
          <button type="submit" className={primaryButtonClass} disabled={isSubmitting || !isDirty}>
            {isSubmitting ? "Saving…" : `Save as version ${nextVersion}`}
          </button>
          <button
            type="button"
            className={secondaryButtonClass}
            onClick={() => {
              const defaults = defaultCapitalProfileForm();
              reset({ ...defaults, name: `${defaults.name} — adapted`, reason: "" }, { keepDefaultValues: true });
              setStatus({ tone: "ok", text: "The defaults are in the form: adapt them to your local rules, say why, and save." });
            }}
          >
            Start from the default profile
          </button>
          {isDirty ? (
            <button type="button" className="text-sm underline" onClick={() => reset(initial)}>
              Undo changes
            </button>
          ) : null}
          {status ? (
            <p role="status" className={`text-sm ${status.tone === "ok" ? "text-ok" : "text-alert"}`}>
              {status.text}
            </p>
          ) : null}
        </div>
      ) : (
        <p className="text-sm text-ink-muted">Compliance officers and heads change the profile.</p>
      )}

      {versions.length > 0 ? (
        <div className="relative overflow-x-auto">
          <table className="min-w-full text-sm">
            <caption className="mb-1 text-left font-medium">Versions</caption>
            <thead>
              <tr className="text-left text-ink-muted">
                <th className="pr-3 font-normal">Version</th>
                <th className="pr-3 font-normal">Saved</th>
                <th className="pr-3 font-normal">By</th>
                <th className="pr-3 font-normal">Filed figure</th>
                <th className="font-normal">Why</th>
              </tr>
            </thead>
            <tbody>
              {versions.map((v) => (
                <tr key={v.id} className="border-t border-ink-line">
                  <td className="pr-3 py-1 figure">
                    {v.version}
                    {v.active ? " (in force)" : ""}
                  </td>
                  <td className="pr-3">{v.createdAt.slice(0, 10)}</td>
                  <td className="pr-3">{v.createdBy?.name ?? "set up with the firm"}</td>
                  <td className="pr-3">
                    {REGIME_LABELS[v.filedRegime]}
                    {v.regimes === "both" ? " (both computed)" : ""}
                  </td>
                  <td>{v.reason || "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
    </form>
  );
}
