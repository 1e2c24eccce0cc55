"use client";

import { useFieldArray, useForm, useWatch, type FieldPath, type UseFormReturn } from "react-hook-form";
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
import { apiFetch } from "@/app/_components/api";
import { inputClass, secondaryButtonClass } from "@/app/_components/field";
import { CheckboxField, NumberField, SelectField, TextAreaField, TextField, useFieldBinding } from "@/app/_components/form/fields";
import type { CapitalProfileVersion } from "@/lib/data/capital-profile";
import { SaveButton, SaveStatusLine, useSettingsSave } from "./save-status";

type Path = FieldPath<CapitalProfileInput>;
type Form = UseFormReturn<CapitalProfileInput>;

/** A field's id: its path with dashes for dots. */
const idOf = (path: string) => path.replace(/\./g, "-");

/** An empty number input is missing (the schema then names it), never read as 0. */
const emptyToUndefined = (v: unknown) => (v === "" || v === null || v === undefined ? undefined : Number(v));
const emptyToNull = (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v));

/** A figure typed into a table cell (its column heading and row say what it is, in its aria-label), bound to the form, its error below it when `showError`. */
function CellInput({ form, name, label, step = "any", showError = false }: { form: Form; name: Path; label: string; step?: string; showError?: boolean }) {
  const { error, props } = useFieldBinding({ form, name, id: idOf(name) });
  return (
    <>
      <input type="number" step={step} aria-label={label} className={`${inputClass} figure w-24`} {...props} />
      {showError && error ? (
        <p className="text-sm text-alert" role="alert">
          {error}
        </p>
      ) : null}
    </>
  );
}

function years(y: number | null | undefined): string {
  if (y === undefined) return "—";
  if (y === null) return "open";
  return y < 1 ? `${Number((y * 12).toPrecision(6))} m` : `${Number(y.toPrecision(6))} y`;
}

export function CapitalProfileForm({ current, versions, editable }: { current: CapitalProfileVersion | null; versions: CapitalProfileVersion[]; editable: boolean }) {
  const initial = current?.form ?? defaultCapitalProfileForm();
  const form = useForm<CapitalProfileInput, unknown, CapitalProfileValues>({
    resolver: zodResolver(capitalProfileSchema),
    defaultValues: initial,
  });
  const {
    control,
    reset,
    formState: { isSubmitting, isDirty },
  } = form;
  const plusFactors = useFieldArray({ control, name: "internal.plusFactors" });
  const bands = useWatch({ control, name: "standardised.bands" }) ?? initial.standardised.bands;
  const tiers = useWatch({ control, name: "standardised.qualifying" }) ?? initial.standardised.qualifying;
  const regimes = useWatch({ control, name: "regimes" });
  const irMethod = useWatch({ control, name: "standardised.interestRateMethod" });

  const { status, setStatus, onSubmit } = useSettingsSave(form, async (values) => {
    const saved = await apiFetch<CapitalProfileVersion>("/api/capital-profile", { method: "POST", body: values });
    reset(saved.form);
    return `Saved as version ${saved.version}. Runs started from now use it.`;
  });

  const num = (path: Path, label: string, hint?: string, step = "any") => (
    <NumberField
      form={form}
      name={path}
      id={idOf(path)}
      label={label}
      hint={hint}
      step={step}
      inputMode="decimal"
      className={`${inputClass} figure`}
      rules={{ setValueAs: path === "standardised.fxEligibleCapital" ? emptyToNull : emptyToUndefined }}
    />
  );
  const check = (path: Path, label: string) => (
    <CheckboxField form={form} name={path}>
      {label}
    </CheckboxField>
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
          <TextField form={form} name="name" id="cp-name" label="Profile name" />
          <SelectField form={form} name="regimes" label="A run computes" options={REGIME_CHOICES.map((c) => [c, REGIME_CHOICE_LABELS[c]])} />
          <SelectField
            form={form}
            name="filedRegime"
            label="Filed figure"
            hint="The draft filing and both packs carry this figure; the other is shown beside it as comparison."
            options={CAPITAL_REGIMES.map((r) => [r, REGIME_LABELS[r]])}
          />
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
                    <CellInput form={form} name={`internal.plusFactors.${i}.exceptions`} label={`Exceptions, row ${i + 1}`} step="1" showError />
                  </td>
                  <td className="pr-4 py-1">
                    <CellInput form={form} name={`internal.plusFactors.${i}.addOn`} label={`Plus factor, row ${i + 1}`} />
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
              <TextField form={form} name="standardised.name" id="standardised-name" label="Rule set name" />
              <SelectField form={form} name="standardised.interestRateMethod" id="standardised-interestRateMethod" label="Debt general market risk">
                <option value="maturity">Maturity method</option>
                <option value="duration">Duration method</option>
              </SelectField>
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
                        <CellInput form={form} name={`standardised.qualifying.${i}.ratePercent`} label={`Qualifying weight up to ${t.upToMonths ?? "open"} months`} />
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
                        <CellInput form={form} name={`standardised.bands.${i}.weightPercent`} label={`Risk weight, band ${b.band}`} />
                      </td>
                      <td>
                        <CellInput form={form} name={`standardised.bands.${i}.yieldChangePercent`} label={`Yield change, band ${b.band}`} />
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
              <SelectField form={form} name="standardised.commodityMethod" id="standardised-commodityMethod" label="Commodities approach">
                <option value="simplified">Simplified</option>
                <option value="maturity">Maturity ladder</option>
              </SelectField>
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

        <TextAreaField form={form} name="reason" label="Why this version" hint="Kept with the version and in the audit log; runs record the version they used." rows={2} />
      </fieldset>

      {editable ? (
        <div className="flex flex-wrap items-center gap-3">
          <SaveButton busy={isSubmitting} disabled={isSubmitting || !isDirty}>
            Save as version {nextVersion}
          </SaveButton>
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
          <SaveStatusLine status={status} />
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
