"use client";

import { useMemo } from "react";
import { CHART_PALETTE } from "@/lib/charts/palette";
import { Bar, CartesianGrid, Cell, ComposedChart, Legend, Line, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from "recharts";
import { DraftCaution } from "@/app/_components/draft-caution";
import { FigureRow, FigureTable } from "@/app/_components/figure-table";
import { formatDate } from "@/app/_components/format";
import type { RunResults } from "@/lib/runs/types";
import { compactMoney, confidence, METHOD_WORDS, money, num, pct } from "../../_components/run-format";
import { CompletedRun, ZoneBadge } from "../../_components/run-state";
import { Bullets } from "../../_components/bullets";
import { Panel } from "@/app/_components/panel";

function View({ results, currency }: { results: RunResults; currency: string }) {
  const bt = results.monthEnd.backtest;
  const s = results.backtestSeries;
  const data = useMemo(() => s.dates.map((date, i) => ({ date, pnl: s.pnl[i], loss: -s.var[i], exception: s.exception[i] ? s.pnl[i] : null })), [s]);
  const expected = bt.days * (1 - bt.confidence);
  const k = bt.kupiec;
  const ch = bt.christoffersen;
  return (
    <div className="flex flex-col gap-6">
      <DraftCaution />
      <Panel id="bt-result" title="Result" className="grid gap-4 md:grid-cols-3" headingClassName="sr-only">
        <div>
          <p className="text-sm text-ink-soft">Zone</p>
          <p className="mt-1" data-testid="backtest-zone">
            <ZoneBadge zone={bt.zone} />
          </p>
          <p className="mt-1 text-xs text-ink-muted">Plus factor {bt.plusFactor} on the capital multiplier.</p>
        </div>
        <div>
          <p className="text-sm text-ink-soft">Exceptions</p>
          <p className="figure text-2xl font-semibold" data-testid="backtest-exceptions">
            {bt.exceptions} <span className="text-base font-normal text-ink-soft">of {bt.days} days</span>
          </p>
          <p className="text-xs text-ink-muted">
            {num(expected, 1)} expected at {confidence(bt.confidence)}. {bt.exceptionRule.charAt(0).toUpperCase() + bt.exceptionRule.slice(1)}
          </p>
        </div>
        <div>
          <p className="text-sm text-ink-soft">Method</p>
          <p className="text-sm">{METHOD_WORDS[bt.method]} one-day VaR forecast from the day before</p>
        </div>
        <p className="text-xs text-ink-muted md:col-span-3">{bt.statement}</p>
      </Panel>

      <Panel id="bt-chart" title={<>P&amp;L against VaR, day by day</>} className="flex flex-col gap-3">
        <figure aria-labelledby="chart-bt" className="flex flex-col gap-2">
          <figcaption id="chart-bt" className="text-sm font-medium">
            Daily P&amp;L of today&apos;s book ({currency}) from {formatDate(s.dates[0])} to {formatDate(s.dates[s.dates.length - 1])} against the negative one-day {confidence(s.confidence)} VaR; a loss below the
            line is an exception (marked ●)
          </figcaption>
          <div className="h-80 w-full" aria-hidden="true">
            <ResponsiveContainer width="100%" height="100%">
              <ComposedChart accessibilityLayer={false} data={data} margin={{ top: 8, right: 16, bottom: 8, left: 8 }}>
                <CartesianGrid stroke={CHART_PALETTE.grid} vertical={false} />
                <XAxis dataKey="date" tick={{ fontSize: 11, fill: CHART_PALETTE.soft }} stroke={CHART_PALETTE.muted} minTickGap={60} />
                <YAxis tickFormatter={compactMoney} tick={{ fontSize: 11, fill: CHART_PALETTE.soft }} stroke={CHART_PALETTE.muted} width={64} />
                <Tooltip formatter={(v, name) => [money(Number(v), currency), name]} />
                <Legend wrapperStyle={{ fontSize: 12 }} />
                <Bar dataKey="pnl" name="P&L" fill={CHART_PALETTE.pnl} isAnimationActive={false}>
                  {data.map((d) => (
                    <Cell key={d.date} fill={d.exception !== null ? CHART_PALETTE.exception : CHART_PALETTE.pnl} />
                  ))}
                </Bar>
                <Line type="stepAfter" dataKey="loss" name="− VaR" stroke={CHART_PALETTE.varLine} strokeWidth={1.5} dot={false} isAnimationActive={false} />
                <Scatter dataKey="exception" name="Exception" fill={CHART_PALETTE.exception} shape="circle" isAnimationActive={false} />
              </ComposedChart>
            </ResponsiveContainer>
          </div>
        </figure>
        <details className="text-sm">
          <summary className="cursor-pointer text-ink-soft">Every day in a table</summary>
          <div className="max-h-96 overflow-auto" tabIndex={0} role="region" aria-label="Every backtest day (scrolls)">
            <FigureTable className="mt-2 w-full text-xs" caption="P&L and VaR of each backtest day" hiddenCaption headClassName="sticky top-0 bg-paper-raised" pad="py-1" columns={["Date", "P&L", "VaR", "Exception"]}>
              {s.dates.map((d, i) => (
                <FigureRow key={d} pad="py-1" head={d} cells={[money(s.pnl[i], currency), money(s.var[i], currency), s.exception[i] ? "yes" : ""]} />
              ))}
            </FigureTable>
          </div>
        </details>
      </Panel>

      <div className="grid gap-6 lg:grid-cols-2">
        <Panel id="bt-tests" title="Statistical tests" headingClassName="mb-3 font-semibold">
          <FigureTable
            testId="backtest-tests"
            caption="Likelihood-ratio statistics with their χ² p-values; a small p-value speaks against the VaR model."
            columns={["Test", "Statistic", "p-value"]}
          >
            <FigureRow head={`Kupiec test (proportion of failures): observed rate ${pct(k.observedRate)} against ${pct(k.expectedRate)}`} cells={[num(k.lr, 3), num(k.pValue, 3)]} />
            {ch ? (
              <>
                <FigureRow head="Christoffersen test of independence" cells={[num(ch.lrInd, 3), num(ch.pValueInd, 3)]} />
                <FigureRow className="text-right" head="Christoffersen test of conditional coverage" cells={[num(ch.lrCc, 3), num(ch.pValueCc, 3)]} />
              </>
            ) : (
              <tr>
                <td colSpan={3} className="py-1.5 text-ink-muted">
                  The Christoffersen tests need at least one exception and one day without.
                </td>
              </tr>
            )}
          </FigureTable>
        </Panel>
        <Panel id="bt-exceptions" title="Exceptions" headingClassName="mb-3 font-semibold">
          {bt.exceptionList.length ? (
            <FigureTable testId="exception-table" caption="Days the loss exceeded the VaR" hiddenCaption columns={["Date", "P&L", "VaR", "Beyond the VaR"]}>
              {bt.exceptionList.map((e) => (
                <FigureRow key={e.date} head={formatDate(e.date)} cells={[money(e.pnl, currency), money(e.var, currency), money(e.excess, currency)]} />
              ))}
            </FigureTable>
          ) : (
            <p className="text-sm text-ink-muted">No day&apos;s loss exceeded its VaR.</p>
          )}
          {bt.warnings.length ? (
            <Bullets items={bt.warnings.map((w) => w.message)} className="mt-3 list-disc pl-5 text-xs text-caution" />
          ) : null}
        </Panel>
      </div>
    </div>
  );
}

export function BacktestView({ runId }: { runId: string }) {
  return <CompletedRun runId={runId}>{({ results, reportingCurrency }) => <View results={results} currency={reportingCurrency} />}</CompletedRun>;
}
