"use client";

import Link from "next/link";
import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { DraftCaution } from "@/app/_components/draft-caution";
import { FigureTable } from "@/app/_components/figure-table";
import type { RunResults } from "@/lib/runs/types";
import type { InterestRateCurrencyResult, StandardisedBlocks, StandardisedResult } from "@/lib/risk/standardised";
import { filedCapitalOf, RWA_MULTIPLIER } from "@/lib/runs/filed-capital";
import { REGIME_LABELS } from "@/lib/validation/capital-profile";
import { compactMoney, money, num, pct } from "../../_components/run-format";
import { CompletedRun } from "../../_components/run-state";
import { Bullets } from "../../_components/bullets";
import { Panel } from "@/app/_components/panel";

/** The blocks in the order the total adds them, with their names on screen. */
export const BLOCK_WORDS: { key: keyof StandardisedBlocks; label: string }[] = [
  { key: "interestRateSpecific", label: "Interest rate: specific risk" },
  { key: "interestRateGeneral", label: "Interest rate: general market risk" },
  { key: "equitySpecific", label: "Equities: specific risk" },
  { key: "equityGeneral", label: "Equities: general market risk" },
  { key: "fx", label: "Foreign exchange and gold" },
  { key: "commodities", label: "Commodities" },
  { key: "options", label: "Options (carve-out)" },
];

/** The capital tables' headings: every column keeps its gap; the body rows set their own, tighter padding (`td`). */
const CAPITAL_TABLE = { pad: "py-1.5", gap: "pr-3", padLast: true, bodyClassName: "" } as const;
const td = "py-1 pr-3 figure text-right";

/** Figures side by side, one right-aligned cell each. */
function FigureCells({ values }: { values: React.ReactNode[] }) {
  return (
    <>
      {values.map((v, i) => (
        <td key={i} className={td}>
          {v}
        </td>
      ))}
    </>
  );
}

/** Amounts in the reporting currency side by side, one figure cell each. */
function MoneyCells({ values, currency }: { values: number[]; currency: string }) {
  return <FigureCells values={values.map((v) => money(v, currency))} />;
}

/** A body row of the capital tables: what the row is, then its cells. */
function Row({ head, children }: { head: React.ReactNode; children: React.ReactNode }) {
  return (
    <tr className="border-b border-ink-line/60">
      <th scope="row" className="py-1 pr-3 text-left font-normal">
        {head}
      </th>
      {children}
    </tr>
  );
}

/** A building block's card: its heading, then what it holds, or `empty` (the line saying it has no positions) when that is given. */
function BlockPanel({ id, title, empty, children }: { id: string; title: React.ReactNode; empty?: string | false; children: React.ReactNode }) {
  return (
    <Panel id={id} title={title} level={3} headingClassName="mb-2 font-semibold">
      {empty ? <p className="text-sm text-ink-soft">{empty}</p> : children}
    </Panel>
  );
}

function years(y: number): string {
  return `${num(y, 2)} y`;
}

function FiguresHeadline({ results, currency }: { results: RunResults; currency: string }) {
  const { filed, comparison, missing, filedRegime } = filedCapitalOf(results);
  const cp = results.capitalProfile;
  return (
    <section aria-labelledby="capital-filed" className="grid gap-4 md:grid-cols-2">
      <h2 id="capital-filed" className="sr-only">
        Filed figure and comparison
      </h2>
      <div className="rounded-lg border-2 border-brass bg-paper-raised p-4" data-testid="filed-figure">
        <p className="text-sm text-ink-soft">Filed figure · {REGIME_LABELS[filedRegime]}</p>
        {filed ? (
          <>
            <p className="figure mt-1 text-3xl font-semibold">{money(filed.capital, currency)}</p>
            {filed.rwa !== null ? (
              <p className="figure text-sm text-ink-soft">
                Risk-weighted-asset equivalent (× {RWA_MULTIPLIER}): {money(filed.rwa, currency)}
              </p>
            ) : null}
          </>
        ) : (
          <p role="alert" className="mt-1 text-sm text-alert">
            {missing}
          </p>
        )}
      </div>
      <div className="rounded-lg border border-ink-line bg-paper-raised p-4" data-testid="comparison-figure">
        <p className="text-sm text-ink-soft">Comparison · {comparison ? comparison.label : "none computed"}</p>
        {comparison ? (
          <>
            <p className="figure mt-1 text-2xl">{money(comparison.capital, currency)}</p>
            {comparison.rwa !== null ? <p className="figure text-sm text-ink-soft">Risk-weighted-asset equivalent: {money(comparison.rwa, currency)}</p> : null}
            <p className="mt-1 text-xs text-ink-muted">Shown beside the filed figure; it is not filed.</p>
          </>
        ) : (
          <p className="mt-1 text-sm text-ink-soft">This run&apos;s capital rule profile computes one figure only.</p>
        )}
      </div>
      <p className="text-sm text-ink-soft md:col-span-2">
        Capital rule profile {cp.version ? `version ${cp.version}` : "(stored before profiles were versioned)"} · {cp.name} · as of {results.inputs.periodEnd}. Change the profile in{" "}
        <Link href="/settings" className="underline">
          Settings
        </Link>
        ; a run keeps the version it used.
      </p>
    </section>
  );
}

function BlocksChart({ result, currency }: { result: StandardisedResult; currency: string }) {
  const data = BLOCK_WORDS.map((b) => ({ label: b.label, value: result.blocks[b.key] }));
  return (
    <figure className="rounded-lg border border-ink-line bg-paper-raised p-4">
      <figcaption className="mb-2 text-sm font-semibold">Standardised charge by building block, {currency}, as of {result.asOf ?? "the period end"}</figcaption>
      <div className="h-72" aria-hidden="true">
        <ResponsiveContainer width="100%" height="100%">
          <BarChart accessibilityLayer={false} data={data} layout="vertical" margin={{ top: 4, right: 24, bottom: 16, left: 8 }}>
            <CartesianGrid horizontal={false} stroke="#d8d3c7" />
            <XAxis type="number" tickFormatter={compactMoney} tick={{ fontSize: 12, fill: "#3d4a57" }} stroke="#6b7682" label={{ value: `charge, ${currency}`, position: "insideBottom", offset: -8, fontSize: 12, fill: "#3d4a57" }} />
            <YAxis type="category" dataKey="label" width={230} tick={{ fontSize: 12, fill: "#1c2733" }} stroke="#6b7682" />
            <Tooltip formatter={(v) => [money(Number(v), currency), "Charge"]} />
            <Bar dataKey="value" fill="#3d4a57" isAnimationActive={false} />
          </BarChart>
        </ResponsiveContainer>
      </div>
      <FigureTable className="mt-3 w-full text-sm" testId="blocks-table" caption="The chart's figures: each block's charge and its share of the total" {...CAPITAL_TABLE} columns={["Block", "Charge", "Share"]}>
        {data.map((d) => (
          <Row key={d.label} head={d.label}>
            <FigureCells values={[money(d.value, currency), result.total > 0 ? pct(d.value / result.total, 1) : "—"]} />
          </Row>
        ))}
        <tr className="font-semibold">
          <th scope="row" className="py-1 pr-3 text-left">
            Total market-risk capital
          </th>
          <FigureCells values={[money(result.total, currency), "100 %"]} />
        </tr>
        {result.rwa ? (
          <tr>
            <th scope="row" className="py-1 pr-3 text-left font-normal">
              Risk-weighted-asset equivalent (× {result.rwaMultiplier})
            </th>
            <td className={td}>{money(result.rwa, currency)}</td>
            <td />
          </tr>
        ) : null}
      </FigureTable>
    </figure>
  );
}

function Ladder({ ladder, currency }: { ladder: InterestRateCurrencyResult; currency: string }) {
  const weightWord = ladder.method === "duration" ? "Yield change (points)" : "Risk weight";
  return (
    <Panel id={`ladder-${ladder.currency}`} title={<>{ladder.currency} ladder ({ladder.method === "duration" ? "duration method" : "maturity method"}): charge {money(ladder.charge, currency)}</>} level={4} className="flex flex-col gap-3" testId={`ladder-${ladder.currency}`}>
      <div className="relative overflow-x-auto">
        <FigureTable className="min-w-full text-sm" caption={<>Each band: positions, weighted positions, the matched amount and its vertical disallowance at {pct(ladder.verticalRate, 0)}</>} {...CAPITAL_TABLE} columns={["Band", "Zone", weightWord, "Long", "Short", "Weighted long", "Weighted short", "Matched", "Net", "Vertical charge"]}>
          {ladder.bands.map((b) => (
            <tr key={b.index} className="border-b border-ink-line/60">
              <th scope="row" className="py-1 pr-3 text-left font-normal whitespace-nowrap">{b.band}</th>
              <FigureCells values={[b.zone, ladder.method === "duration" ? num(b.weight, 2) : pct(b.weight, 2)]} />
              <MoneyCells currency={currency} values={[b.long, b.short, b.weightedLong, b.weightedShort, b.matched, b.net, b.verticalCharge]} />
            </tr>
          ))}
        </FigureTable>
      </div>
      <div className="grid gap-4 lg:grid-cols-2">
        <FigureTable className="text-sm" caption="Within each zone: the bands' nets and the horizontal disallowance" {...CAPITAL_TABLE} columns={["Zone", "Net long", "Net short", "Matched", "Rate", "Charge", "Zone net"]}>
          {ladder.zones.map((z) => (
            <Row key={z.zone} head={<>Zone {z.zone}</>}>
              <MoneyCells currency={currency} values={[z.netLong, z.netShort, z.matched]} />
              <td className={td}>{pct(z.rate, 0)}</td>
              <MoneyCells currency={currency} values={[z.charge, z.net]} />
            </Row>
          ))}
        </FigureTable>
        <FigureTable className="text-sm" caption="Between zones, in the order applied, then the residual net position" {...CAPITAL_TABLE} columns={["Step", "Matched", "Rate", "Charge"]}>
          {(
            [
              ["Zone 1 against zone 2", ladder.betweenDetail.zone12],
              ["Zone 2 against zone 3", ladder.betweenDetail.zone23],
              ["Zone 1 against zone 3", ladder.betweenDetail.zone13],
            ] as const
          ).map(([label, d]) => (
            <Row key={label} head={label}>
              <FigureCells values={[money(d.matched, currency), pct(d.rate, 0), money(d.charge, currency)]} />
            </Row>
          ))}
          <Row head="Residual net position">
            <FigureCells values={[money(ladder.residual, currency), ladder.residual > 0 ? pct(ladder.residualCharge / ladder.residual, 0) : "—", money(ladder.residualCharge, currency)]} />
          </Row>
        </FigureTable>
      </div>
      <p className="text-sm figure">
        {ladder.currency}: vertical {money(ladder.vertical, currency)} + within zones {money(ladder.withinZones, currency)} + between zones{" "}
        {money(ladder.between.zone12 + ladder.between.zone23 + ladder.between.zone13, currency)} + residual {money(ladder.residualCharge, currency)} = {money(ladder.charge, currency)}
      </p>
    </Panel>
  );
}

function Blocks({ result, currency }: { result: StandardisedResult; currency: string }) {
  const ir = result.interestRate;
  return (
    <div className="flex flex-col gap-6">
      <BlockPanel id="ir-specific" title={<>Interest rate: specific risk, {money(result.blocks.interestRateSpecific, currency)}</>} empty={ir.specific.length === 0 && "No debt positions."}>
        <div className="relative overflow-x-auto">
          <FigureTable className="min-w-full text-sm" caption="Each issue's net position, long or short alike, times its category's weight" leftColumns={3} {...CAPITAL_TABLE} columns={["Issue", "Currency", "Issuer", "Residual maturity", "Net position", "Weight", "Charge"]}>
            {ir.specific.map((l) => (
              <Row key={`${l.instrument}-${l.currency}`} head={l.instrument}>
                <td className="py-1 pr-3">{l.currency}</td>
                <td className="py-1 pr-3">{l.issuerCategory}</td>
                <FigureCells values={[years(l.residualMaturityYears), money(l.net, currency), pct(l.rate, 2), money(l.charge, currency)]} />
              </Row>
            ))}
          </FigureTable>
        </div>
      </BlockPanel>

      <section aria-labelledby="ir-general" className="flex flex-col gap-4">
        <h3 id="ir-general" className="font-semibold">Interest rate: general market risk, {money(result.blocks.interestRateGeneral, currency)} (one ladder per currency, summed without offsetting)</h3>
        {ir.legs.length > 0 ? (
          <details className="rounded-lg border border-ink-line bg-paper-raised p-4">
            <summary className="cursor-pointer text-sm font-medium">What went on the ladders: {ir.legs.length} positions and notional legs</summary>
            <div className="mt-2 overflow-x-auto">
              <FigureTable className="min-w-full text-sm" leftColumns={3} {...CAPITAL_TABLE} columns={["Instrument", "Leg", "Currency", "Amount", "Years", "Coupon", { label: "Band", align: "left" }]}>
                {ir.legs.map((l, i) => (
                  <Row key={i} head={l.instrument}>
                    <td className="py-1 pr-3">{l.leg}</td>
                    <td className="py-1 pr-3">{l.currency}</td>
                    <FigureCells values={[money(l.amount, currency), num(l.years, 3), `${num(l.coupon, 2)} %`]} />
                    <td className="py-1 pr-3 whitespace-nowrap">{l.band}</td>
                  </Row>
                ))}
              </FigureTable>
            </div>
          </details>
        ) : null}
        {ir.byCurrency.length === 0 ? <p className="text-sm text-ink-soft">No positions on an interest-rate ladder.</p> : ir.byCurrency.map((l) => <Ladder key={l.currency} ladder={l} currency={currency} />)}
      </section>

      <BlockPanel id="equity-block" title={<>Equities, per national market: specific {money(result.blocks.equitySpecific, currency)}, general {money(result.blocks.equityGeneral, currency)}</>} empty={result.equity.byMarket.length === 0 && "No equity positions."}>
        <FigureTable className="min-w-full text-sm" testId="equity-table" {...CAPITAL_TABLE} columns={["Market", "Issues", "Gross", "Net", "Specific rate", "Specific", "General rate", "General"]}>
          {result.equity.byMarket.map((m) => (
            <Row key={m.market} head={m.market}>
              <FigureCells values={[m.issues.length, money(m.gross, currency), money(m.net, currency), pct(m.specificRate, 0), money(m.specific, currency), pct(m.generalRate, 0), money(m.general, currency)]} />
            </Row>
          ))}
        </FigureTable>
      </BlockPanel>

      <BlockPanel id="fx-block" title={<>Foreign exchange and gold (shorthand method): {money(result.blocks.fx, currency)}</>}>
        <div className="grid gap-4 lg:grid-cols-2">
          <FigureTable className="text-sm" testId="fx-table" caption={<>Net open position per currency against {result.fx.reportingCurrency}</>} {...CAPITAL_TABLE} columns={["Currency", "From positions", "Currency positions", "Net"]}>
            {result.fx.byCurrency.map((c) => (
              <Row key={c.currency} head={c.currency}>
                <MoneyCells currency={currency} values={[c.fromPositions, c.fromCurrencyPositions, c.net]} />
              </Row>
            ))}
          </FigureTable>
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
            <dt>Sum of net long positions</dt>
            <dd className="figure text-right">{money(result.fx.netLong, currency)}</dd>
            <dt>Sum of net short positions</dt>
            <dd className="figure text-right">{money(result.fx.netShort, currency)}</dd>
            <dt>Net gold position (never netted)</dt>
            <dd className="figure text-right">{money(result.fx.gold, currency)}</dd>
            <dt>Overall net open position</dt>
            <dd className="figure text-right">{money(result.fx.overallNetOpenPosition, currency)}</dd>
            <dt>Charge at {pct(result.fx.rate, 0)}</dt>
            <dd className="figure text-right font-semibold">{money(result.fx.charge, currency)}</dd>
            <dt>De minimis test</dt>
            <dd className="text-right">
              {result.fx.deMinimis.met === null
                ? "not made (no eligible capital in the profile)"
                : `${result.fx.deMinimis.met ? "met" : "not met"}${result.fx.deMinimis.applied ? ", applied" : ", not applied"}`}
            </dd>
          </dl>
        </div>
      </BlockPanel>

      <BlockPanel id="commodity-block" title={<>Commodities: {money(result.blocks.commodities, currency)}</>} empty={result.commodities.byCommodity.length === 0 && "No commodity positions."}>
        <FigureTable className="min-w-full text-sm" testId="commodity-table" {...CAPITAL_TABLE} columns={["Commodity", "Long", "Short", "Net", "Gross", "On the net", "On the gross", "Charge"]}>
          {result.commodities.byCommodity.map((c) => (
            <Row key={c.commodity} head={c.commodity}>
              <MoneyCells currency={currency} values={[c.long, c.short, c.net, c.gross, c.netCharge, c.grossCharge, c.charge]} />
            </Row>
          ))}
        </FigureTable>
      </BlockPanel>

      <BlockPanel id="options-block" title={<>Options (simplified carve-out): {money(result.blocks.options, currency)}</>} empty={result.options.length === 0 && "No option positions."}>
        <FigureTable className="min-w-full text-sm" leftColumns={3} {...CAPITAL_TABLE} columns={["Option", "Underlying", "Treatment", "Underlying value", "Rates", "In the money", "Charge"]}>
          {result.options.map((o) => (
            <Row key={o.instrument} head={<>{o.instrument} ({o.optionKind})</>}>
              <td className="py-1 pr-3">{o.underlying}</td>
              <td className="py-1 pr-3">{o.treatment === "hedged" ? "with its hedge" : "bought, no hedge"}</td>
              <FigureCells values={[money(o.underlyingValue, currency), pct(o.specificRate + o.generalRate, 0), money(o.inTheMoney, currency), money(o.charge, currency)]} />
            </Row>
          ))}
        </FigureTable>
      </BlockPanel>

      {result.warnings.length > 0 ? (
        <BlockPanel id="std-notes" title="What the blocks did not cover or assumed">
          <Bullets items={result.warnings.map((w) => w.message)} className="list-disc pl-5 text-sm" />
        </BlockPanel>
      ) : null}
    </div>
  );
}

/** The filed figure and the other beside it, then the standardised building blocks line by line. */
function View({ results, currency }: { results: RunResults; currency: string }) {
  const std = results.standardised;
  return (
    <div className="flex flex-col gap-6">
      <DraftCaution />
      <FiguresHeadline results={results} currency={currency} />
      {std?.result ? (
        <>
          <BlocksChart result={std.result} currency={currency} />
          <Blocks result={std.result} currency={currency} />
          <p className="text-xs text-ink-muted">
            Standardised rule set “{std.result.profileName}” of the run&apos;s capital rule profile, engine {std.result.engineVersion}. Every figure is in {currency} at the period end.
          </p>
        </>
      ) : std && std.problems.length > 0 ? (
        <section role="alert" className="rounded-lg border border-alert/30 bg-alert-bg p-4 text-sm">
          <p className="font-semibold text-alert">The standardised figure could not be computed from this run&apos;s positions.</p>
          <ul className="mt-2 list-disc pl-5">
            {std.problems.slice(0, 20).map((p, i) => (
              <li key={i}>
                Row {p.row} ({p.instrument}), column {p.column}: {p.message}
              </li>
            ))}
          </ul>
          {std.problems.length > 20 ? <p className="mt-1">… and {std.problems.length - 20} more.</p> : null}
        </section>
      ) : (
        <p className="rounded-lg border border-ink-line bg-paper-raised p-4 text-sm text-ink-soft">
          This run&apos;s capital rule profile computes the internal-models figure only, so there are no building blocks to show. To compute them, change the profile in Settings; runs started afterwards
          compute both.
        </p>
      )}
    </div>
  );
}

/** The Capital tab of a completed run. */
export function CapitalView({ runId }: { runId: string }) {
  return <CompletedRun runId={runId}>{({ results, reportingCurrency }) => <View results={results} currency={reportingCurrency} />}</CompletedRun>;
}
