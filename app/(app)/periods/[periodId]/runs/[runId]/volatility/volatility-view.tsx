"use client";

import { useMemo, useState } from "react";
import { ESTIMATOR_COLOURS as COLOURS } from "@/lib/charts/palette";
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { Bar, CartesianGrid, ComposedChart, Legend, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { apiFetch } from "@/app/_components/api";
import { DraftCaution } from "@/app/_components/draft-caution";
import { inputClass } from "@/app/_components/field";
import { FigureRow, FigureTable } from "@/app/_components/figure-table";
import { formatDate } from "@/app/_components/format";
import type { VolatilityDetail } from "@/lib/runs/volatility-detail";
import type { RunResults } from "@/lib/runs/types";
import { ASSET_CLASS_WORDS, pct } from "../../_components/run-format";
import { CompletedRun } from "../../_components/run-state";
import { Panel } from "@/app/_components/panel";

const ANNUAL = Math.sqrt(252);
const TERM_DAYS_SHOWN = [1, 5, 10, 20, 60, 120, 250];
const annual = (v: number | null) => (v === null ? null : +(v * ANNUAL * 100).toFixed(3));

function Charts({ d }: { d: VolatilityDetail }) {
  const data = useMemo(
    () =>
      d.dates.map((date, t) => {
        const row: Record<string, number | string | null> = { date, sq: +(d.squaredReturns[t] * 1e4).toFixed(4) };
        for (const s of d.series) row[s.estimator] = annual(s.volatility[t]);
        return row;
      }),
    [d],
  );
  const term = d.termStructure ? d.termStructure.volatility.map((v, i) => ({ day: i + 1, vol: annual(v) })) : [];
  const longRun = d.termStructure?.longRunVolatility ?? null;
  const last = d.dates.length - 1;
  return (
    <>
      <Panel id="vol-estimators" title="Conditional volatility under each estimator" className="flex flex-col gap-3">
        <figure aria-labelledby="chart-vol" className="flex flex-col gap-2">
          <figcaption id="chart-vol" className="text-sm font-medium">
            {d.factor}: conditional volatility (annualised, %) under each estimator, {formatDate(d.dates[0])} to {formatDate(d.dates[last])}, with the squared daily returns behind them (basis points², right axis)
          </figcaption>
          <div className="h-80 w-full" aria-hidden="true">
            <ResponsiveContainer width="100%" height="100%">
              <ComposedChart accessibilityLayer={false} data={data} margin={{ top: 8, right: 16, bottom: 8, left: 8 }}>
                <CartesianGrid stroke="#e6e1d6" vertical={false} />
                <XAxis dataKey="date" tick={{ fontSize: 11, fill: "#3d4a57" }} stroke="#6b7682" minTickGap={60} />
                <YAxis yAxisId="vol" tick={{ fontSize: 11, fill: "#3d4a57" }} stroke="#6b7682" unit=" %" width={56} />
                <YAxis yAxisId="sq" orientation="right" tick={{ fontSize: 11, fill: "#6b7682" }} stroke="#b9b2a3" width={56} />
                <Tooltip formatter={(v, name) => [name === "Squared return" ? `${v} bp²` : `${v} %`, name]} />
                <Legend wrapperStyle={{ fontSize: 12 }} />
                <Bar yAxisId="sq" dataKey="sq" name="Squared return" fill="#d8d3c7" isAnimationActive={false} />
                {d.series.map((s) => (
                  <Line key={s.estimator} yAxisId="vol" type="monotone" dataKey={s.estimator} name={`${s.label}${s.chosen ? " (chosen)" : ""}`} stroke={COLOURS[s.estimator]} strokeWidth={s.chosen ? 2.5 : 1.25} dot={false} isAnimationActive={false} connectNulls={false} />
                ))}
              </ComposedChart>
            </ResponsiveContainer>
          </div>
        </figure>
        <FigureTable testId="estimator-table" caption="Forecast volatility for the day after the last price, by estimator" columns={["Estimator", "Daily", "Annualised"]}>
          {d.series.map((s) => (
            <FigureRow
              key={s.estimator}
              className={`border-b border-ink-line/60 text-right ${s.chosen ? "font-semibold" : ""}`}
              head={`${s.label}${s.chosen ? " (chosen)" : ""}`}
              cells={[s.error ? `not fitted: ${s.error}` : pct(s.currentVolatility, 3), s.error ? "—" : pct(s.currentVolatility === null ? null : s.currentVolatility * ANNUAL)]}
            />
          ))}
        </FigureTable>
        <details className="text-sm">
          <summary className="cursor-pointer text-ink-soft">The last 20 days in a table</summary>
          <div className="relative overflow-x-auto">
            <FigureTable
              className="mt-2 w-full text-xs"
              caption="Returns and conditional volatility of the last 20 days"
              hiddenCaption
              pad="py-1"
              padLast
              columns={["Date", "Return", ...d.series.map((s) => `${s.label} (annual)`)]}
            >
              {d.dates.slice(-20).map((date, i) => {
                const t = d.dates.length - 20 + i;
                return (
                  <FigureRow
                    key={date}
                    pad="py-1"
                    padLast
                    head={date}
                    cells={[pct(d.returns[t]), ...d.series.map((s) => pct(s.volatility[t] === null ? null : (s.volatility[t] as number) * ANNUAL))]}
                  />
                );
              })}
            </FigureTable>
          </div>
        </details>
      </Panel>
      <Panel id="vol-term" title="GARCH(1,1) term structure" className="flex flex-col gap-3">
        {d.termStructure ? (
          <>
            <figure aria-labelledby="chart-term" className="flex flex-col gap-2">
              <figcaption id="chart-term" className="text-sm font-medium">
                {d.factor}: forecast volatility (annualised, %) for each of the next {term.length} days under {d.termStructure.label}, against the long-run level
              </figcaption>
              <div className="h-64 w-full" aria-hidden="true">
                <ResponsiveContainer width="100%" height="100%">
                  <LineChart accessibilityLayer={false} data={term} margin={{ top: 8, right: 16, bottom: 16, left: 8 }}>
                    <CartesianGrid stroke="#e6e1d6" vertical={false} />
                    <XAxis dataKey="day" type="number" domain={[1, term.length]} ticks={[1, 25, 50, 75, 100, 125, 150, 175, 200, 225, 250].filter((t) => t <= term.length)} tick={{ fontSize: 11, fill: "#3d4a57" }} stroke="#6b7682" label={{ value: "days ahead", position: "insideBottom", offset: -8, fontSize: 12, fill: "#3d4a57" }} />
                    <YAxis tick={{ fontSize: 11, fill: "#3d4a57" }} stroke="#6b7682" unit=" %" width={56} domain={["auto", "auto"]} tickFormatter={(v: number) => v.toFixed(1)} />
                    <Tooltip formatter={(v) => [`${v} %`, "Forecast volatility"]} labelFormatter={(l) => `Day ${l}`} />
                    {longRun !== null ? <ReferenceLine y={annual(longRun)!} stroke="#a2332b" strokeDasharray="6 4" label={{ value: `long-run ${annual(longRun)} %`, position: "insideTopRight", fontSize: 12, fill: "#a2332b" }} /> : null}
                    <Line type="monotone" dataKey="vol" name="Forecast" stroke="#1f4e79" strokeWidth={2} dot={false} isAnimationActive={false} />
                  </LineChart>
                </ResponsiveContainer>
              </div>
            </figure>
            <p className="text-xs text-ink-muted">{d.termStructure.statement}</p>
            <FigureTable testId="term-table" caption="Forecast volatility by days ahead" columns={["Days ahead", "Daily", "Annualised"]}>
              {TERM_DAYS_SHOWN.filter((n) => n <= term.length).map((n) => (
                <FigureRow key={n} head={n} cells={[pct(d.termStructure!.volatility[n - 1], 3), pct(d.termStructure!.volatility[n - 1] * ANNUAL)]} />
              ))}
              <FigureRow className="text-right" head="Long run" cells={[pct(longRun, 3), pct(longRun === null ? null : longRun * ANNUAL)]} />
            </FigureTable>
          </>
        ) : (
          <p className="text-sm text-ink-muted">GARCH(1,1) could not be fitted on this factor&apos;s returns, so there is no term structure.</p>
        )}
      </Panel>
    </>
  );
}

function View({ runId, results, initialFactor }: { runId: string; results: RunResults; initialFactor: string | null }) {
  const factors = results.factorVolatility.factors;
  const fallback = factors.find((f) => !f.excluded)?.factor ?? factors[0]?.factor ?? "";
  const [factor, setFactor] = useState(initialFactor && factors.some((f) => f.factor === initialFactor) ? initialFactor : fallback);
  const { data, error, isLoading, isFetching } = useQuery({
    queryKey: ["run-volatility", runId, factor],
    queryFn: () => apiFetch<VolatilityDetail>(`/api/runs/${runId}/volatility?factor=${encodeURIComponent(factor)}`),
    enabled: !!factor,
    placeholderData: keepPreviousData,
    staleTime: Infinity,
  });
  if (!factor) return <p className="text-sm text-ink-muted">This run has no factor with price history.</p>;
  return (
    <div className="flex flex-col gap-6">
      <DraftCaution />
      <form aria-label="Choose a factor" className="flex flex-wrap items-end gap-3" onSubmit={(e) => e.preventDefault()}>
        <label className="flex flex-col gap-1 text-sm">
          Factor
          <select className={inputClass} value={factor} onChange={(e) => setFactor(e.target.value)} data-testid="factor-select">
            {factors.map((f) => (
              <option key={f.factor} value={f.factor}>
                {f.factor} ({ASSET_CLASS_WORDS[f.assetClass] ?? f.assetClass})
              </option>
            ))}
          </select>
        </label>
        <p className="pb-2 text-sm text-ink-muted" aria-live="polite">
          {isFetching ? "Computing from the run's stored inputs…" : data ? `${data.dates.length.toLocaleString("en-GB")} daily returns` : ""}
        </p>
      </form>
      <p className="text-sm text-ink-soft">Computed on demand from this run&apos;s stored inputs (not today&apos;s data). {results.factorVolatility.statement}</p>
      {error ? (
        <p role="alert" className="text-sm text-alert">
          {error instanceof Error ? error.message : "Could not compute the volatility."}
        </p>
      ) : isLoading || !data ? (
        <p role="status" className="text-sm text-ink-muted">Computing…</p>
      ) : (
        <Charts d={data} />
      )}
    </div>
  );
}

export function VolatilityView({ runId, initialFactor }: { runId: string; initialFactor: string | null }) {
  return <CompletedRun runId={runId}>{({ results }) => <View runId={runId} results={results} initialFactor={initialFactor} />}</CompletedRun>;
}
