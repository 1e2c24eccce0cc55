"use client";

import { useState } from "react";
import { Bar, BarChart, CartesianGrid, Cell, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { DraftCaution } from "@/app/_components/draft-caution";
import { DataTable } from "@/app/_components/data-table";
import { inputClass } from "@/app/_components/field";
import { FigureRow, FigureTable } from "@/app/_components/figure-table";
import { formatDate } from "@/app/_components/format";
import type { PositionContribution } from "@/lib/risk";
import type { RunResults } from "@/lib/runs/types";
import { ASSET_CLASS_WORDS, compactMoney, confidence, METHOD_WORDS, money, pct } from "../../_components/run-format";
import { CompletedRun } from "../../_components/run-state";
import { Panel } from "@/app/_components/panel";

const column = createColumnHelper<PositionContribution>();

function GroupChart({ title, id, data, currency }: { title: string; id: string; data: { label: string; value: number }[]; currency: string }) {
  return (
    <figure aria-labelledby={id} className="flex flex-col gap-2">
      <figcaption id={id} className="text-sm font-medium">
        {title}
      </figcaption>
      <div className="w-full" style={{ height: Math.max(160, 32 * data.length + 40) }} aria-hidden="true">
        <ResponsiveContainer width="100%" height="100%">
          <BarChart accessibilityLayer={false} data={data} layout="vertical" margin={{ top: 4, right: 24, bottom: 16, left: 8 }}>
            <CartesianGrid horizontal={false} stroke="#d8d3c7" />
            <XAxis type="number" tickFormatter={compactMoney} tick={{ fontSize: 12, fill: "#3d4a57" }} stroke="#6b7682" label={{ value: `component VaR, ${currency}`, position: "insideBottom", offset: -8, fontSize: 12, fill: "#3d4a57" }} />
            <YAxis type="category" dataKey="label" width={200} tick={{ fontSize: 12, fill: "#1c2733" }} stroke="#6b7682" />
            <Tooltip formatter={(v) => [money(Number(v), currency), "Component VaR"]} />
            <Bar dataKey="value" isAnimationActive={false}>
              {data.map((d) => (
                <Cell key={d.label} fill={d.value < 0 ? "#2f6b3f" : "#3d4a57"} />
              ))}
            </Bar>
          </BarChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}

function GroupTable({ caption, rows, currency, total, standAlone }: { caption: string; rows: { label: string; componentVar: number; componentVarHorizon: number; standAloneVar?: number }[]; currency: string; total: number; standAlone: boolean }) {
  return (
    // without the stand-alone column the 10-day column ends the row and keeps its gap, as it always has
    <FigureTable caption={caption} padLast={!standAlone} columns={["Group", "Component VaR 1 day", "Share", "Component VaR 10 days", ...(standAlone ? ["Stand-alone VaR 1 day"] : [])]}>
      {rows.map((r) => (
        <FigureRow
          key={r.label}
          className="whitespace-nowrap border-b border-ink-line/60 text-right"
          headClassName="whitespace-normal text-left font-normal"
          padLast={!standAlone}
          head={r.label}
          cells={[money(r.componentVar, currency), pct(r.componentVar / total, 1), money(r.componentVarHorizon, currency), ...(standAlone ? [money(r.standAloneVar, currency)] : [])]}
        />
      ))}
    </FigureTable>
  );
}

function PositionsTable({ rows, currency, total }: { rows: PositionContribution[]; currency: string; total: number }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "componentVar", desc: true }]);
  const right = (v: string) => <span className="figure block whitespace-nowrap text-right">{v}</span>;
  const columns = [
    column.accessor("instrument", { header: "Position (book · instrument)" }),
    column.accessor((p) => ASSET_CLASS_WORDS[p.assetClass] ?? p.assetClass, { id: "assetClass", header: "Asset class" }),
    column.accessor("currency", { header: "Currency" }),
    column.accessor("marketValue", { header: "Market value", cell: (c) => right(money(c.getValue(), currency)) }),
    column.accessor("componentVar", { header: "Component VaR 1 day", cell: (c) => right(money(c.getValue(), currency)) }),
    column.accessor((p) => p.componentVar / total, { id: "share", header: "Share", cell: (c) => right(pct(c.getValue(), 1)) }),
    column.accessor("componentVarHorizon", { header: "Component VaR 10 days", cell: (c) => right(money(c.getValue(), currency)) }),
    column.accessor("marginalVar", { header: "Per unit of value", cell: (c) => right(pct(c.getValue(), 3)) }),
  ];
  // TanStack Table returns fresh functions each render; this component does not memoise around them.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({ data: rows, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  return (
    <DataTable table={table} caption="Component VaR by position; column headers sort" sortable tableTestId="contributions-table" minWidth="min-w-[900px]" cellClassName="px-3 py-1.5" rowClassName="border-t border-ink-line" />
  );
}

function View({ results, currency }: { results: RunResults; currency: string }) {
  const m = results.monthEnd;
  const [method, setMethod] = useState(m.primaryMethod as string);
  const [conf, setConf] = useState(String(m.capital.profile.confidence));
  const figures = m.methods.find((x) => x.method === method) ?? m.methods[0];
  const c = figures.byConfidence.find((x) => String(x.confidence) === conf) ?? figures.byConfidence[0];
  const total = c.oneDay.var;
  const classes = Object.entries(c.byAssetClass)
    .map(([k, v]) => ({ label: ASSET_CLASS_WORDS[k] ?? k, ...v }))
    .sort((a, b) => b.componentVar - a.componentVar);
  const currencies = Object.entries(c.byCurrency)
    .map(([k, v]) => ({ label: k, ...v }))
    .sort((a, b) => b.componentVar - a.componentVar);
  const top = [...c.contributions].sort((a, b) => Math.abs(b.componentVar) - Math.abs(a.componentVar)).slice(0, 15);
  return (
    <div className="flex flex-col gap-6">
      <DraftCaution />
      <form aria-label="Which figures" className="flex flex-wrap items-end gap-3" onSubmit={(e) => e.preventDefault()}>
        <label className="flex flex-col gap-1 text-sm">
          VaR method
          <select className={inputClass} value={method} onChange={(e) => setMethod(e.target.value)}>
            {m.methods.map((x) => (
              <option key={x.method} value={x.method}>
                {METHOD_WORDS[x.method]}
                {x.method === m.primaryMethod ? " (primary)" : ""}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm">
          Confidence
          <select className={inputClass} value={conf} onChange={(e) => setConf(e.target.value)}>
            {figures.byConfidence.map((x) => (
              <option key={x.confidence} value={String(x.confidence)}>
                {confidence(x.confidence)}
              </option>
            ))}
          </select>
        </label>
      </form>
      <p className="text-sm text-ink-soft">
        Component VaR splits the book&apos;s one-day VaR of <span className="figure font-semibold">{money(total, currency)}</span> ({METHOD_WORDS[figures.method]}, {confidence(c.confidence)}, as of {formatDate(m.asOf)})
        among positions so that the parts add up to the whole (Euler allocation); a negative part is a hedge. Diversification benefit: the sum of the asset classes&apos; stand-alone VaR less the
        book&apos;s VaR, <span className="figure font-semibold">{money(c.diversificationBenefit, currency)}</span> at one day.
      </p>
      <Panel id="by-class" title="By asset class" className="grid gap-4 lg:grid-cols-2" headingClassName="font-semibold lg:col-span-2">
        <GroupChart title={`Component VaR by asset class, one day, ${confidence(c.confidence)}`} id="chart-class" data={classes.map((x) => ({ label: x.label, value: x.componentVar }))} currency={currency} />
        <GroupTable caption="Component and stand-alone VaR by asset class" rows={classes} currency={currency} total={total} standAlone />
      </Panel>
      <Panel id="by-currency" title="By currency" className="grid gap-4 lg:grid-cols-2" headingClassName="font-semibold lg:col-span-2">
        <GroupChart title={`Component VaR by the positions' currency, one day, ${confidence(c.confidence)}`} id="chart-currency" data={currencies.map((x) => ({ label: x.label, value: x.componentVar }))} currency={currency} />
        <GroupTable caption="Component VaR by currency (each position with its price and exchange-rate risk)" rows={currencies} currency={currency} total={total} standAlone={false} />
      </Panel>
      <section aria-labelledby="by-position" className="flex flex-col gap-4">
        <h2 id="by-position" className="font-semibold">
          By position
        </h2>
        <div className="rounded-lg border border-ink-line bg-paper-raised p-4">
          <GroupChart title={`The ${top.length} largest component VaRs by position, one day, ${confidence(c.confidence)}`} id="chart-position" data={top.map((x) => ({ label: x.instrument, value: x.componentVar }))} currency={currency} />
        </div>
        <PositionsTable rows={c.contributions} currency={currency} total={total} />
        {m.excludedPositions.length ? (
          <p className="text-sm text-ink-soft">
            Left out of every figure: {m.excludedPositions.map((p) => `${p.instrument} (${money(p.marketValue, currency)}; ${p.reason})`).join("; ")}.
          </p>
        ) : null}
      </section>
    </div>
  );
}

export function Contributions({ runId }: { runId: string }) {
  return <CompletedRun runId={runId} detail="contributions">{({ results, reportingCurrency }) => <View results={results} currency={reportingCurrency} />}</CompletedRun>;
}
