"use client";

import Link from "next/link";
import { useQuery } from "@tanstack/react-query";
import { Bar, BarChart, CartesianGrid, Cell, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { apiFetch } from "@/app/_components/api";
import { DraftCaution } from "@/app/_components/draft-caution";
import { FigureRow, FigureTable } from "@/app/_components/figure-table";
import { formatDate } from "@/app/_components/format";
import type { RunChange } from "@/lib/runs/types";
import { compactMoney, confidence, money } from "../../_components/run-format";
import { CompletedRun } from "../../_components/run-state";
import { Bullets } from "../../_components/bullets";
import { Panel } from "@/app/_components/panel";

const STEP_WORDS = { positions: "Positions", volatilities: "Volatilities", correlations: "Correlations" } as const;

function View({ runId, currency }: { runId: string; currency: string }) {
  const { data, error, isPending } = useQuery({ queryKey: ["run-change", runId], queryFn: () => apiFetch<RunChange>(`/api/runs/${runId}/change`) });
  if (isPending) return <p role="status" className="text-sm text-ink-muted">Loading the comparison…</p>;
  if (error || !data) return <p role="alert" className="text-sm text-alert">{error instanceof Error ? error.message : "Could not load the comparison."}</p>;
  if (!data.explanation || !data.previous) {
    return (
      <div className="rounded-lg border border-dashed border-ink-line bg-paper-raised p-6 text-center" data-testid="change-empty">
        <p className="font-medium">Nothing to compare with yet</p>
        <p className="mt-1 text-sm text-ink-soft">{data.note}</p>
        <p className="mt-1 text-sm text-ink-soft">Once an earlier period has a run chosen for its filing, this page explains the change in value-at-risk by positions, volatilities and correlations.</p>
      </div>
    );
  }
  const x = data.explanation;
  const chart = [{ label: "Last period", value: x.previousVar, base: true }, ...x.steps.map((s) => ({ label: STEP_WORDS[s.step], value: s.change, base: false })), { label: "This period", value: x.currentVar, base: true }];
  return (
    <div className="flex flex-col gap-6">
      <DraftCaution />
      <p className="text-sm text-ink-soft">
        One-day parametric VaR at {confidence(x.confidence)}: <span className="figure font-semibold">{money(x.previousVar, currency)}</span> in the{" "}
        <Link className="underline" href={`/periods/${data.previous.periodId}/runs/${data.previous.runId}`}>
          filing run of the period ending {formatDate(data.previous.periodEnd)}
        </Link>
        , <span className="figure font-semibold">{money(x.currentVar, currency)}</span> now: a change of <span className="figure font-semibold">{money(x.change, currency)}</span>. Order: {x.order}.
      </p>
      <Panel id="change-steps" title="The change, step by step" className="grid gap-4 lg:grid-cols-2" headingClassName="font-semibold lg:col-span-2">
        <figure aria-labelledby="chart-change" className="flex flex-col gap-2">
          <figcaption id="chart-change" className="text-sm font-medium">
            Last period&apos;s VaR, the change from each step, and this period&apos;s VaR ({currency})
          </figcaption>
          <div className="h-64 w-full" aria-hidden="true">
            <ResponsiveContainer width="100%" height="100%">
              <BarChart accessibilityLayer={false} data={chart} margin={{ top: 8, right: 16, bottom: 8, left: 8 }}>
                <CartesianGrid stroke="#e6e1d6" vertical={false} />
                <XAxis dataKey="label" tick={{ fontSize: 12, fill: "#1c2733" }} stroke="#6b7682" />
                <YAxis tickFormatter={compactMoney} tick={{ fontSize: 11, fill: "#3d4a57" }} stroke="#6b7682" width={64} />
                <Tooltip formatter={(v) => [money(Number(v), currency), "VaR or change"]} />
                <Bar dataKey="value" isAnimationActive={false}>
                  {chart.map((d) => (
                    <Cell key={d.label} fill={d.base ? "#3d4a57" : d.value > 0 ? "#a2332b" : "#2f6b3f"} />
                  ))}
                </Bar>
              </BarChart>
            </ResponsiveContainer>
          </div>
        </figure>
        <FigureTable testId="change-table" caption="Each step changes one thing and keeps the rest; the steps add up to the whole change." columns={["Step", "From", "To", "Change"]}>
          {x.steps.map((s) => (
            <FigureRow
              key={s.step}
              head={
                <>
                  {STEP_WORDS[s.step]}
                  <span className="block text-xs text-ink-muted">{s.description}</span>
                </>
              }
              cells={[money(s.from, currency), money(s.to, currency), money(s.change, currency)]}
            />
          ))}
          <FigureRow className="text-right font-semibold" headClassName="text-left" head="Whole change" cells={[money(x.previousVar, currency), money(x.currentVar, currency), money(x.change, currency)]} />
        </FigureTable>
      </Panel>
      {x.newFactors.length || x.droppedFactors.length ? (
        <p className="text-sm text-ink-soft">
          {x.newFactors.length ? `New this period: ${x.newFactors.join(", ")}. ` : ""}
          {x.droppedFactors.length ? `Gone since last period: ${x.droppedFactors.join(", ")}.` : ""}
        </p>
      ) : null}
      {x.warnings.length ? (
        <Bullets items={x.warnings.map((w) => w.message)} className="list-disc pl-5 text-sm text-caution" />
      ) : null}
    </div>
  );
}

export function ChangeView({ runId }: { runId: string }) {
  return <CompletedRun runId={runId}>{({ reportingCurrency }) => <View runId={runId} currency={reportingCurrency} />}</CompletedRun>;
}
