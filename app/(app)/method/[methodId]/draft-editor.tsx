"use client";

/**
 * The draft form of a method statement version (react-hook-form + the same zod schema the server checks again),
 * its evidence with the "Attach evidence" action, and approval or discarding.
 */
import { useState } from "react";
import { useRouter } from "next/navigation";
import { TextField, TextAreaField, SelectField, setFieldErrors } from "@/app/_components/form/fields";
import { useForm, useWatch, type FieldErrors, type UseFormRegister, type UseFormReturn } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { apiFetch, ApiError } from "@/app/_components/api";
import { Field, inputClass, primaryButtonClass, secondaryButtonClass, SelectOptions } from "@/app/_components/field";
import { ASSET_CLASSES, ASSET_CLASS_LABELS } from "@/lib/uploads/asset-classes";
import { ESTIMATOR_LABELS, methodDraftSchema, type EstimatorChoice, type MethodDraft } from "@/lib/validation/method";
import { CORRELATION_LABELS, COVARIANCE_LABELS, PORTFOLIO_VOLATILITY_LABELS, SCALING_LABELS, VAR_METHOD_LABELS, engineLimitations } from "@/lib/method/describe";
import type { MethodVersion } from "@/lib/data/method";
import { ESTIMATOR_DEFAULTS } from "@/lib/method/defaults";
import { EvidenceView } from "../_components/evidence-view";
import { ApprovalPanel } from "./approval-panel";

/** The message at a dotted path of the form's errors. */
function errorAt(errors: FieldErrors<MethodDraft>, path: string): string | undefined {
  let node: unknown = errors;
  for (const key of path.split(".")) {
    if (node === null || typeof node !== "object") return undefined;
    node = (node as Record<string, unknown>)[key];
  }
  const message = (node as { message?: unknown } | undefined)?.message;
  return typeof message === "string" ? message : undefined;
}

/**
 * A labelled select whose choice replaces a whole part of the draft (an estimator, the correlation, the backtest's
 * refits, the stress window), so it is controlled rather than bound to one field: its value, the options as
 * [value, label] pairs, and what a change does.
 */
function ChoiceField({ id, label, value, onChange, options, error }: { id: string; label: string; value: string; onChange: (value: string) => void; options: [string, string][]; error?: string }) {
  return (
    <Field id={id} label={label} error={error}>
      <select id={id} className={inputClass} value={value} onChange={(e) => onChange(e.target.value)}>
        <SelectOptions options={options} />
      </select>
    </Field>
  );
}

type Path = Parameters<UseFormRegister<MethodDraft>>[0];

function EstimatorFields({ prefix, estimator, form }: { prefix: string; estimator: EstimatorChoice; form: UseFormReturn<MethodDraft> }) {
  const p = (k: string) => `${prefix}.${k}` as Path;
  const input = (k: string, label: string, hint?: string) => <TextField form={form} name={p(k)} label={label} hint={hint} type="text" inputMode="decimal" className={`${inputClass} w-32`} />;
  const select = (k: string, label: string, options: [string, string][]) => <SelectField form={form} name={p(k)} label={label} options={options} />;
  switch (estimator.kind) {
    case "ma":
      return (
        <>
          {input("window", "Window (days)", "Not longer than the minimum history.")}
          {select("divisor", "Divisor", [["m", "M"], ["m-1", "M−1"]])}
          {select("mean", "Mean", [["zero", "Zero"], ["sample", "Sample mean"]])}
        </>
      );
    case "ewma":
      return (
        <>
          {select("lambdaMode", "λ", [["fixed", "Fixed"], ["fit", "Fitted to the history"]])}
          {input("lambda", estimator.lambdaMode === "fit" ? "λ starting value" : "λ value", "Between 0 and 1, e.g. 0.94.")}
        </>
      );
    case "arch":
      return input("order", "Order m", "1 to 10; needs a minimum history of 10 × m.");
    case "garch":
      return (
        <>
          {select("distribution", "Errors", [["t", "Student-t"], ["normal", "Normal"]])}
          {select("mean", "Mean", [["zero", "Zero"], ["fit", "Fitted"]])}
          {select("fallback", "When the fit fails", [["ewma", "Fall back to EWMA"], ["none", "No fallback: leave the factor out"]])}
          <label className="flex items-center gap-2 self-end pb-2 text-sm">
            <input type="checkbox" {...form.register(p("targeting"))} /> Variance targeting
          </label>
        </>
      );
  }
}

function Group({ legend, children, hint }: { legend: string; children: React.ReactNode; hint?: string }) {
  return (
    <fieldset className="rounded-lg border border-ink-line bg-paper-raised p-5">
      <legend className="px-1 text-lg font-semibold">{legend}</legend>
      {hint ? <p className="mb-3 text-sm text-ink-muted">{hint}</p> : null}
      {children}
    </fieldset>
  );
}

export function DraftEditor({ version, coApprovalRequired, canApprove }: { version: MethodVersion; coApprovalRequired: boolean; canApprove: boolean }) {
  const router = useRouter();
  const [saved, setSaved] = useState<{ tone: "ok" | "alert"; text: string } | null>(null);
  const [evidencePending, setEvidencePending] = useState(false);
  const [evidenceError, setEvidenceError] = useState<string | null>(null);
  const form = useForm<MethodDraft>({
    resolver: zodResolver(methodDraftSchema) as never,
    defaultValues: { content: version.content, rationale: version.rationale, analystLimitations: version.analystLimitations, reason: version.reason },
  });
  const {
    handleSubmit,
    control,
    setValue,
    reset,
    formState: { errors, isSubmitting, isDirty },
  } = form;
  const content = useWatch({ control, name: "content" }) as MethodDraft["content"];
  const analystLimitations = (useWatch({ control, name: "analystLimitations" }) ?? []) as string[];

  const setKind = (path: "content.defaultEstimator" | `content.byAssetClass.${string}`, kind: string) => {
    if (path === "content.defaultEstimator") {
      setValue("content.defaultEstimator", ESTIMATOR_DEFAULTS[kind as EstimatorChoice["kind"]], { shouldDirty: true });
      return;
    }
    const assetClass = path.split(".")[2] as (typeof ASSET_CLASSES)[number];
    const next = { ...content.byAssetClass };
    if (kind === "") delete next[assetClass];
    else next[assetClass] = ESTIMATOR_DEFAULTS[kind as EstimatorChoice["kind"]];
    setValue("content.byAssetClass", next, { shouldDirty: true });
  };

  const onSubmit = handleSubmit(async (values) => {
    setSaved(null);
    try {
      const { version: next } = await apiFetch<{ version: MethodVersion }>(`/api/method/${version.id}`, { method: "PUT", body: values });
      reset({ content: next.content, rationale: next.rationale, analystLimitations: next.analystLimitations, reason: next.reason });
      setSaved({ tone: "ok", text: next.approvedBy === null && version.approvedBy !== null ? "Draft saved. The earlier approval was withdrawn: approve again." : "Draft saved." });
      router.refresh();
    } catch (error) {
      if (error instanceof ApiError) setFieldErrors(form, error.fields);
      setSaved({ tone: "alert", text: error instanceof Error ? error.message : "Could not save." });
    }
  }, () => setSaved({ tone: "alert", text: "Some values are not valid: see the fields marked in red." }));

  async function attachEvidence() {
    setEvidencePending(true);
    setEvidenceError(null);
    try {
      await apiFetch(`/api/method/${version.id}/evidence`, { method: "POST", body: {} });
      router.refresh();
    } catch (error) {
      setEvidenceError(error instanceof Error ? error.message : "Could not compute the evidence.");
    } finally {
      setEvidencePending(false);
    }
  }

  const engine = engineLimitations(content);

  return (
    <div className="flex flex-col gap-6">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-6" aria-label={`Draft version ${version.version}`}>
        <Group legend="Volatility estimators" hint="The firm-wide default applies to every asset class without its own choice.">
          <div className="flex flex-col gap-4">
            <div role="group" aria-labelledby="estimator-default" className="grid items-start gap-2 border-b border-ink-line pb-4 md:grid-cols-[11rem_1fr]">
              <p id="estimator-default" className="pt-7 font-semibold">
                Firm-wide default
              </p>
              <div className="flex flex-wrap items-start gap-4">
                <ChoiceField id="content.defaultEstimator.kind" label="Estimator" value={content.defaultEstimator.kind} onChange={(v) => setKind("content.defaultEstimator", v)} options={Object.entries(ESTIMATOR_LABELS)} />
                <EstimatorFields key={content.defaultEstimator.kind} prefix="content.defaultEstimator" estimator={content.defaultEstimator} form={form} />
              </div>
            </div>
            {ASSET_CLASSES.map((c) => {
              const e = content.byAssetClass[c];
              const path = `content.byAssetClass.${c}` as const;
              return (
                <div key={c} role="group" aria-labelledby={`estimator-${c}`} className="grid items-start gap-2 border-b border-ink-line/60 pb-3 last:border-0 md:grid-cols-[11rem_1fr]">
                  <p id={`estimator-${c}`} className="pt-7 font-medium">
                    {ASSET_CLASS_LABELS[c]}
                  </p>
                  <div className="flex flex-wrap items-start gap-4">
                    <ChoiceField id={`${path}.kind`} label="Estimator" value={e?.kind ?? ""} onChange={(v) => setKind(path, v)} options={[["", "Firm-wide default"], ...Object.entries(ESTIMATOR_LABELS)]} />
                    {e ? <EstimatorFields key={e.kind} prefix={path} estimator={e} form={form} /> : null}
                  </div>
                </div>
              );
            })}
          </div>
        </Group>

        <Group legend="Portfolio volatility, correlation and VaR" hint="Where each factor's volatility in VaR, expected shortfall, the backtest and capital comes from.">
          <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            <SelectField form={form} name="content.portfolioVolatility" label="Portfolio volatilities" options={Object.entries(PORTFOLIO_VOLATILITY_LABELS)} />
            {content.portfolioVolatility === "asset-class" ? (
              <>
                <ChoiceField
                  id="content.correlation.kind"
                  label="Correlation"
                  error={errorAt(errors, "content.correlation.kind")}
                  value={content.correlation.kind}
                  onChange={(v) => setValue("content.correlation", v === "equal" ? { kind: "equal", window: 250 } : v === "ewma" ? { kind: "ewma", lambda: 0.94 } : { kind: "ccc" }, { shouldDirty: true })}
                  options={Object.entries(CORRELATION_LABELS)}
                />
                {content.correlation.kind === "ewma" ? (
                  <TextField form={form} name={"content.correlation.lambda" as Path} label="Correlation λ" hint="Between 0 and 1, e.g. 0.94." type="text" inputMode="decimal" />
                ) : content.correlation.kind === "equal" ? (
                  <TextField form={form} name={"content.correlation.window" as Path} label="Correlation window (days)" type="text" inputMode="numeric" />
                ) : null}
              </>
            ) : (
              <>
                <SelectField form={form} name="content.covariance" label="Covariance" options={Object.entries(COVARIANCE_LABELS)} />
                <TextField form={form} name="content.covarianceLambda" label="Covariance λ" hint="Between 0 and 1." type="text" inputMode="decimal" />
                <TextField form={form} name="content.covarianceWindow" label="Covariance window (days)" type="text" inputMode="numeric" />
              </>
            )}
            <ChoiceField
              id="content.backtestRefit.mode"
              label="Backtest parameters"
              error={errorAt(errors, "content.backtestRefit.mode")}
              value={content.backtestRefit.mode}
              onChange={(v) => setValue("content.backtestRefit", v === "once" ? { mode: "once" } : { mode: "every", days: 21 }, { shouldDirty: true })}
              options={[
                ["every", "Re-estimated on a schedule (out of sample)"],
                ["once", "Fitted once on the whole sample (in sample)"],
              ]}
            />
            {content.backtestRefit.mode === "every" ? (
              <TextField form={form} name={"content.backtestRefit.days" as Path} label="Re-estimate every (business days)" hint="21 is about a month." type="text" inputMode="numeric" />
            ) : null}
            <SelectField form={form} name="content.varMethod" label="VaR method" options={Object.entries(VAR_METHOD_LABELS)} />
            <SelectField form={form} name="content.distribution" label="Return distribution">
              <option value="normal">Normal</option>
              <option value="t">Student-t</option>
            </SelectField>
          </div>
          <fieldset className="mt-4">
            <legend className="text-sm font-medium">Confidence levels</legend>
            <p id="confidences-hint" className="text-xs text-ink-muted">
              As fractions between 0 and 1, e.g. 0.99 for 99 %.
            </p>
            <div className="mt-2 flex flex-wrap items-start gap-3">
              {content.confidences.map((_, i) => (
                <div key={i} className="flex items-start gap-1">
                  <TextField form={form} name={`content.confidences.${i}` as Path} label={`Level ${i + 1}`} type="text" inputMode="decimal" className={`${inputClass} w-28`} />
                  {content.confidences.length > 1 ? (
                    <button
                      type="button"
                      className="mt-7 rounded px-2 py-1 text-sm text-ink-soft underline"
                      onClick={() => setValue("content.confidences", content.confidences.filter((__, j) => j !== i), { shouldDirty: true })}
                      aria-label={`Remove confidence level ${i + 1}`}
                    >
                      Remove
                    </button>
                  ) : null}
                </div>
              ))}
              {content.confidences.length < 4 ? (
                <button type="button" className={`${secondaryButtonClass} mt-6`} onClick={() => setValue("content.confidences", [...content.confidences, 0.95], { shouldDirty: true })}>
                  Add a level
                </button>
              ) : null}
            </div>
            {errorAt(errors, "content.confidences") ? (
              <p role="alert" className="mt-1 text-sm text-alert">
                {errorAt(errors, "content.confidences")}
              </p>
            ) : null}
          </fieldset>
        </Group>

        <Group legend="Horizon and windows">
          <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            <TextField form={form} name="content.horizonDays" label="Horizon (days)" type="text" inputMode="numeric" />
            <SelectField form={form} name="content.scaling" label="Horizon scaling" options={Object.entries(SCALING_LABELS)} />
            <TextField form={form} name="content.historicalWindow" label="Historical window (days)" type="text" inputMode="numeric" />
            <TextField form={form} name="content.minHistory" label="Minimum history (returns)" hint="Factors with fewer returns are left out of a run and listed." type="text" inputMode="numeric" />
            <ChoiceField
              id="content.stressWindow.mode"
              label="Stress window"
              value={content.stressWindow.mode}
              onChange={(v) => setValue("content.stressWindow", v === "search" ? { mode: "search" } : { mode: "chosen", start: "", end: "" }, { shouldDirty: true })}
              options={[
                ["search", "Searched over the stored history"],
                ["chosen", "Chosen dates"],
              ]}
            />
            {content.stressWindow.mode === "chosen" ? (
              <>
                <TextField form={form} name={"content.stressWindow.start" as Path} label="Stress window starts" type="date" />
                <TextField form={form} name={"content.stressWindow.end" as Path} label="Stress window ends" type="date" />
              </>
            ) : null}
          </div>
        </Group>

        <Group legend="Rationale">
          <TextAreaField form={form} name="rationale" label="Why this method suits the firm, in your words" rows={7} />
        </Group>

        <Group legend="Limitations" hint="The engine's limitations of each chosen estimator are filled in and cannot be removed; add your own below.">
          <ul className="mb-4 space-y-2 text-sm" aria-label="The engine's limitations">
            {engine.map((t) => (
              <li key={t} className="flex gap-2">
                <span className="mt-0.5 shrink-0 rounded border border-ink-line bg-paper-sunk px-1.5 text-xs text-ink-soft">Engine</span>
                <span>{t}</span>
              </li>
            ))}
          </ul>
          <div className="flex flex-col gap-3">
            {analystLimitations.map((_, i) => (
              <div key={i} className="flex items-start gap-2">
                <div className="flex-1">
                  <TextAreaField form={form} name={`analystLimitations.${i}` as Path} label={`Your limitation ${i + 1}`} rows={2} className={`${inputClass} w-full`} />
                </div>
                <button
                  type="button"
                  className="mt-7 rounded px-2 py-1 text-sm text-ink-soft underline"
                  onClick={() => setValue("analystLimitations", analystLimitations.filter((__, j) => j !== i), { shouldDirty: true })}
                  aria-label={`Remove your limitation ${i + 1}`}
                >
                  Remove
                </button>
              </div>
            ))}
            <div>
              <button type="button" className={secondaryButtonClass} onClick={() => setValue("analystLimitations", [...analystLimitations, ""], { shouldDirty: true })}>
                Add a limitation
              </button>
            </div>
          </div>
        </Group>

        {version.previousId ? (
          <Group legend="Reason for the change">
            <TextAreaField form={form} name="reason" label={`Why version ${version.previousVersion} needs to change`} rows={3} />
          </Group>
        ) : null}

        <div className="sticky bottom-0 flex flex-wrap items-center gap-3 border-t border-ink-line bg-paper/95 py-3">
          <button type="submit" className={primaryButtonClass} disabled={isSubmitting}>
            {isSubmitting ? "Saving…" : "Save draft"}
          </button>
          {isDirty ? <span className="text-sm text-ink-muted">Unsaved changes</span> : null}
          {saved ? (
            <p role={saved.tone === "alert" ? "alert" : "status"} className={`text-sm ${saved.tone === "alert" ? "text-alert" : "text-ok"}`}>
              {saved.text}
            </p>
          ) : null}
        </div>
      </form>

      <section aria-labelledby="evidence" className="rounded-lg border border-ink-line bg-paper-raised p-5">
        <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
          <h2 id="evidence" className="text-lg font-semibold">
            Evidence: estimators compared on the firm&apos;s history
          </h2>
          <button type="button" className={version.evidence ? secondaryButtonClass : primaryButtonClass} onClick={attachEvidence} disabled={evidencePending}>
            {evidencePending ? "Computing…" : version.evidence ? "Recompute evidence" : "Attach evidence"}
          </button>
        </div>
        <p role="status" aria-live="polite" className="text-sm text-ink-muted">
          {evidencePending ? "Fitting every estimator on each asset class's history; this takes a few seconds." : ""}
        </p>
        {evidenceError ? (
          <p role="alert" className="mb-2 text-sm text-alert">
            {evidenceError}
          </p>
        ) : null}
        <EvidenceView evidence={version.evidence} pending={evidencePending} />
      </section>

      <ApprovalPanel version={version} coApprovalRequired={coApprovalRequired} canApprove={canApprove} canDiscard unsaved={isDirty} />
    </div>
  );
}
