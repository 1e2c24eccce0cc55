"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/app/_components/api";
import { DraftCaution } from "@/app/_components/draft-caution";
import { primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { FigureRow, FigureTable } from "@/app/_components/figure-table";
import { Panel } from "@/app/_components/panel";
import { formatDate, formatTimestamp } from "@/app/_components/format";
import { StatusBadge } from "@/app/_components/status-badge";
import type { RunRecord, RunResults } from "@/lib/runs/types";
import { confidence, METHOD_WORDS, money, num, pct } from "../_components/run-format";
import { CompletedRun, RunStatusBadge, ZoneBadge } from "../_components/run-state";
import { Bullets } from "../_components/bullets";
import { useRun } from "../_components/use-run";
import { ModelUsed } from "./model-used";
import { countOf, plural } from "@/lib/text/count";

/** The summary's cards: a Panel with a little room under its heading. */
function Card({ title, id, children, className = "" }: { title: string; id: string; children: React.ReactNode; className?: string }) {
  return (
    <Panel id={id} title={title} className={className} headingClassName="mb-3 font-semibold">
      {children}
    </Panel>
  );
}

/** A line of the capital table: what it is, and its figure. */
const Row = ({ label, children }: { label: React.ReactNode; children: React.ReactNode }) => (
  <FigureRow head={label} cells={[children]} className="border-b border-ink-line/60 text-right last:border-b-0" headClassName="text-left font-normal text-ink-soft" gap="pr-3" />
);

function VarTable({ results, currency }: { results: RunResults; currency: string }) {
  const m = results.monthEnd;
  return (
    <div className="relative overflow-x-auto">
      <FigureTable
        className="w-full min-w-[640px] text-sm"
        testId="var-table"
        caption={
          <>
            Value-at-risk and expected shortfall of the book as of {formatDate(m.asOf)}, in {currency}, at one day and {m.horizonDays} days. The primary method ({METHOD_WORDS[m.primaryMethod]}) drives the
            history, backtest and capital.
          </>
        }
        leftColumns={2}
        columns={["Method", "Confidence", "VaR 1 day", "ES 1 day", `VaR ${m.horizonDays} days`, `ES ${m.horizonDays} days`]}
      >
        {m.methods.flatMap((method) =>
          method.byConfidence.map((c, i) => (
            <tr key={`${method.method}-${c.confidence}`} className={`border-b border-ink-line/60 text-right ${method.method === m.primaryMethod ? "font-semibold" : ""}`}>
              {i === 0 ? (
                <th scope="rowgroup" rowSpan={method.byConfidence.length} className="py-1.5 pr-2 text-left align-top font-medium">
                  {METHOD_WORDS[method.method]}
                  {method.method === m.primaryMethod ? <span className="block text-xs font-normal text-ink-muted">primary</span> : null}
                </th>
              ) : null}
              <td className="py-1.5 pr-2 text-left">{confidence(c.confidence)}</td>
              <td className="py-1.5 pr-2">{money(c.oneDay.var, currency)}</td>
              <td className="py-1.5 pr-2">{money(c.oneDay.es, currency)}</td>
              <td className="py-1.5 pr-2">{money(c.horizon.var, currency)}</td>
              <td className="py-1.5">{money(c.horizon.es, currency)}</td>
            </tr>
          )),
        )}
      </FigureTable>
      <Bullets items={m.methods.map((method) => `${METHOD_WORDS[method.method]}: ${method.scalingStatement}`)} className="mt-2 list-disc pl-5 text-xs text-ink-muted" />
    </div>
  );
}

function Capital({ results, currency }: { results: RunResults; currency: string }) {
  const c = results.monthEnd.capital;
  const p = c.profile;
  return (
    <>
      <table className="w-full text-sm" data-testid="capital-table">
        <caption className="mb-1 text-left text-xs text-ink-muted">
          {c.formula}, at {confidence(p.confidence)} over {p.horizonDays} days, under the capital rule profile “{results.capitalProfile.name}”.
        </caption>
        <tbody>
          <Row label="VaR of the last day, VaR(t−1)">{money(c.varLast, currency)}</Row>
          <Row label={`Mean VaR of the last ${c.averagingDays} days`}>{money(c.varAverage, currency)}</Row>
          <Row label={`Multiplier m_c = ${p.multiplierBase} + plus factor ${c.plusFactor}`}>{num(c.multiplier, 2)}</Row>
          <Row label={`VaR term (${c.varBinding === "last" ? "the last day binds" : "m_c × the mean binds"})`}>{money(c.varTerm, currency)}</Row>
          {p.includeStressed ? (
            <>
              <Row label="Stressed VaR of the last day, sVaR(t−1)">{money(c.stressedVarLast, currency)}</Row>
              <Row label={`Mean stressed VaR of the last ${c.averagingDays} days`}>{money(c.stressedVarAverage, currency)}</Row>
              <Row label={`Multiplier m_s = ${p.stressedMultiplierBase}${p.plusFactorOnStressed ? ` + plus factor ${c.plusFactor}` : ""}`}>{num(c.stressedMultiplier, 2)}</Row>
              <Row label={`Stressed VaR term (${c.stressedBinding === "last" ? "the last day binds" : "m_s × the mean binds"})`}>{money(c.stressedVarTerm, currency)}</Row>
            </>
          ) : null}
          <tr className="border-t-2 border-ink">
            <th scope="row" className="py-2 pr-3 text-left font-semibold">
              Capital
            </th>
            <td className="figure py-2 text-right text-lg font-semibold" data-testid="capital-total">
              {money(c.capital, currency)}
            </td>
          </tr>
        </tbody>
      </table>
      <p className="mt-2 text-xs text-ink-muted">{c.stressedVarStatement}</p>
    </>
  );
}

function Reproduction({ r, periodId }: { r: NonNullable<RunResults["reproduction"]>; periodId: string }) {
  return (
    <section aria-labelledby="reproduction" className={`rounded-lg border p-4 ${r.matches ? "border-ok/40 bg-ok-bg" : "border-alert/40 bg-alert-bg"}`} data-testid="reproduction">
      <h2 id="reproduction" className="mb-1 flex items-center gap-2 font-semibold">
        {r.matches ? <StatusBadge tone="ok">Reproduced</StatusBadge> : <StatusBadge tone="alert">Differs</StatusBadge>}
        Reproduction of an earlier run
      </h2>
      <p className="text-sm">
        {r.matches
          ? `Every figure matches the original: ${r.compared.toLocaleString("en-GB")} values compared, the stored inputs' hashes unchanged, engine ${r.engineVersion}.`
          : `${countOf(r.differences.length, "value")}${r.truncated ? " or more" : ""} ${r.differences.length === 1 && !r.truncated ? "differs" : "differ"} from the original, of ${r.compared.toLocaleString("en-GB")} compared.`}{" "}
        <Link className="underline" href={`/periods/${periodId}/runs/${r.originalRunId}`}>
          Open the original run
        </Link>
      </p>
      {r.reasons.length ? (
        <Bullets items={r.reasons} className="mt-2 list-disc pl-5 text-sm" />
      ) : null}
      {r.differences.length ? (
        <div className="mt-3 max-h-80 overflow-auto rounded border border-ink-line bg-paper-raised">
          <FigureTable className="w-full text-xs" caption="Values that differ" hiddenCaption headClassName="sticky top-0 bg-paper-sunk" columns={["Figure", "Original", "Reproduced"]} pad="px-2 py-1" gap="">
            {r.differences.map((d) => (
              <FigureRow key={d.path} head={d.path} cells={[String(d.original), String(d.reproduced)]} className="border-t border-ink-line/60 text-right" headClassName="text-left font-mono font-normal" pad="px-2 py-1" gap="" />
            ))}
          </FigureTable>
        </div>
      ) : null}
    </section>
  );
}

function Actions({ run, periodId, canReproduce, canChooseForFiling }: { run: RunRecord; periodId: string; canReproduce: boolean; canChooseForFiling: boolean }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const reproduce = useMutation({
    mutationFn: () => apiFetch<{ run: RunRecord }>(`/api/runs/${run.id}/reproduce`, { method: "POST", body: {} }),
    onSuccess: ({ run: created }) => {
      void queryClient.invalidateQueries({ queryKey: ["runs", periodId] });
      router.push(`/periods/${periodId}/runs/${created.id}`);
    },
  });
  const filing = useMutation({
    mutationFn: () => apiFetch<{ run: RunRecord }>(`/api/runs/${run.id}/use-for-filing`, { method: "POST", body: { confirm: true } }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: ["run", run.id] });
      void queryClient.invalidateQueries({ queryKey: ["runs", periodId] });
    },
  });
  const error = reproduce.error ?? filing.error;
  const stale = useRun(run.id).data?.freshness?.stale ?? false;
  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center gap-2">
        {run.isFilingRun ? <StatusBadge tone="ok">Used for the filing</StatusBadge> : null}
        {canChooseForFiling && !run.isFilingRun ? (
          <button
            type="button"
            className={primaryButtonClass}
            disabled={filing.isPending || stale}
            aria-describedby={stale ? "stale-choice-note" : undefined}
            onClick={() => filing.mutate()}
          >
            {filing.isPending ? "Marking…" : "Use for the filing"}
          </button>
        ) : null}
        {canChooseForFiling && !run.isFilingRun && stale ? (
          <span id="stale-choice-note" className="text-sm text-caution" data-testid="stale-choice-note">
            A stale run cannot be chosen for the filing: start a new run on the current inputs.
          </span>
        ) : null}
        {canReproduce ? (
          <button type="button" className={secondaryButtonClass} disabled={reproduce.isPending} onClick={() => reproduce.mutate()}>
            {reproduce.isPending ? "Starting…" : "Reproduce"}
          </button>
        ) : null}
        <a className={secondaryButtonClass} href={`/api/runs/${run.id}/inputs`} download data-testid="export-inputs">
          Export inputs
        </a>
      </div>
      <p className="text-xs text-ink-muted">
        Export inputs downloads the run&apos;s stored inputs as one JSON file (recorded in the audit trail); <code>npm run engine -- run --inputs FILE --json</code> recomputes the run from it.
      </p>
      {canReproduce ? (
        <p className="text-xs text-ink-muted">Reproduce re-runs this run from its stored inputs (never today&apos;s data) as a new run and checks every figure against this one.</p>
      ) : (
        <p className="text-xs text-ink-muted">Risk analysts reproduce runs and choose the one the filing uses.</p>
      )}
      {error ? (
        <p role="alert" className="text-sm text-alert">
          {error instanceof Error ? error.message : String(error)}
        </p>
      ) : null}
    </div>
  );
}

export function RunSummary({ periodId, runId, canReproduce, canChooseForFiling }: { periodId: string; runId: string; canReproduce: boolean; canChooseForFiling: boolean }) {
  return (
    <CompletedRun runId={runId}>
      {({ run, results, reportingCurrency: currency }) => {
        const m = results.monthEnd;
        const s = m.stressed;
        const bt = m.backtest;
        return (
          <div className="flex flex-col gap-6">
            <div className="flex flex-wrap items-start justify-between gap-4">
              <div className="flex flex-wrap items-center gap-2 text-sm text-ink-soft">
                <RunStatusBadge status={run.status} />
                <span>
                  Finished {run.finishedAt ? formatTimestamp(run.finishedAt) : "—"} · figures as of {formatDate(m.asOf)} · engine {run.engineVersion}
                </span>
              </div>
              <Actions run={{ ...run, results }} periodId={periodId} canReproduce={canReproduce} canChooseForFiling={canChooseForFiling} />
            </div>
            {results.reproduction ? <Reproduction r={results.reproduction} periodId={periodId} /> : null}
            <DraftCaution />
            <Card title="Value-at-risk and expected shortfall" id="var">
              <VarTable results={results} currency={currency} />
            </Card>
            <div className="grid gap-6 lg:grid-cols-2">
              <Card title="Stressed value-at-risk" id="stressed">
                <p className="mb-2 text-sm" data-testid="stress-window">
                  Window {formatDate(s.window.start)} to {formatDate(s.window.end)} ({s.window.days} days, {s.window.chosenBy === "search" ? "found by search" : "chosen by the analyst"}).
                </p>
                <FigureTable caption="Stressed VaR by confidence" hiddenCaption columns={["Confidence", "sVaR 1 day", `sVaR ${m.horizonDays} days`]}>
                  {s.byConfidence.map((c) => (
                    <tr key={c.confidence} className="border-b border-ink-line/60 text-right">
                      <td className="py-1.5 pr-2 text-left">{confidence(c.confidence)}</td>
                      <td className="py-1.5 pr-2">{money(c.oneDay.var, currency)}</td>
                      <td className="py-1.5">{money(c.horizon.var, currency)}</td>
                    </tr>
                  ))}
                </FigureTable>
                <p className="mt-2 text-xs text-ink-muted">
                  {s.statement}
                  {s.searchRule ? ` ${s.searchRule}` : ""}
                </p>
              </Card>
              <Card title="Capital" id="capital">
                <Capital results={results} currency={currency} />
              </Card>
            </div>
            <div className="grid gap-6 lg:grid-cols-3">
              <Card title="Backtest" id="backtest">
                <p className="mb-2 flex items-center gap-2" data-testid="backtest-zone">
                  <ZoneBadge zone={bt.zone} />
                  <span className="figure text-sm">
                    {bt.exceptions} exception{bt.exceptions === 1 ? "" : "s"} in {bt.days} days at {confidence(bt.confidence)}
                  </span>
                </p>
                <p className="text-sm text-ink-soft">
                  Kupiec test p-value {num(bt.kupiec.pValue, 3)}; plus factor {bt.plusFactor}.{" "}
                  <Link className="underline" href={`/periods/${periodId}/runs/${runId}/backtest`}>
                    The backtest day by day
                  </Link>
                </p>
              </Card>
              <Card title="Data quality at the run" id="quality">
                <p className="figure text-2xl font-semibold" data-testid="quality-items">
                  {results.dataQuality.items}
                </p>
                <p className="text-sm text-ink-soft">
                  {plural(results.dataQuality.items, "item")} in the period&apos;s data-quality report when the run started: {countOf(results.dataQuality.errors, "error")}, {countOf(results.dataQuality.warnings, "warning")}.{" "}
                  <Link className="underline" href={`/periods/${periodId}/data-quality`}>
                    Today&apos;s report
                  </Link>
                </p>
              </Card>
              <Card title="Method statement" id="method">
                <p className="text-sm" data-testid="method-version">
                  Version {results.method.version}
                  {results.method.approvedAt ? `, approved ${formatDate(results.method.approvedAt.slice(0, 10))}` : ""}.{" "}
                  <Link className="underline" href={`/method/${results.method.id}`}>
                    Read it
                  </Link>
                </p>
                <Bullets items={results.notes} className="mt-2 list-disc pl-5 text-xs text-ink-muted" />
              </Card>
            </div>
            <Card title="Model used for these figures" id="model">
              <ModelUsed results={results} />
            </Card>
            <Card title="Inputs and their fingerprints" id="inputs">
              <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
                <div>
                  <dt className="text-ink-soft">Positions</dt>
                  <dd>
                    {results.inputs.positions.rows} rows from “{results.inputs.positions.fileName}”; gross market value {money(results.positions.grossMarketValue, currency)}, net{" "}
                    {money(results.positions.netMarketValue, currency)}
                  </dd>
                </div>
                <div>
                  <dt className="text-ink-soft">Price history</dt>
                  <dd>
                    {results.inputs.prices.factors} series, {results.inputs.prices.firstDate ? formatDate(results.inputs.prices.firstDate) : "—"} to{" "}
                    {results.inputs.prices.lastDate ? formatDate(results.inputs.prices.lastDate) : "—"}, {results.inputs.prices.closes.toLocaleString("en-GB")} closes; working sample {m.sample.days} days
                  </dd>
                </div>
                <div>
                  <dt className="text-ink-soft">Capital rule profile</dt>
                  <dd>{results.capitalProfile.name}</dd>
                </div>
                <div>
                  <dt className="text-ink-soft">Engine version</dt>
                  <dd data-testid="engine-version">{run.engineVersion}</dd>
                </div>
              </dl>
              <p className="mt-3 text-xs text-ink-muted">{results.inputs.prices.rule}</p>
              {results.inputs.excludedFactors.length ? (
                <div className="mt-3 rounded-md bg-caution-bg px-3 py-2 text-sm" data-testid="excluded-factors">
                  <p className="font-medium text-caution">Left out of every figure, for lack of history:</p>
                  <ul className="list-disc pl-5">
                    {results.inputs.excludedFactors.map((f) => (
                      <li key={f.factor}>
                        {f.factor}: {f.reason}
                      </li>
                    ))}
                  </ul>
                </div>
              ) : null}
              <table className="mt-3 w-full text-xs" data-testid="input-hashes">
                <caption className="mb-1 text-left text-ink-muted">SHA-256 of each stored input&apos;s canonical JSON</caption>
                <tbody>
                  {run.inputHashes
                    ? (["positions", "prices", "method", "capitalProfile", "combined"] as const).map((k) => (
                        <tr key={k} className="border-t border-ink-line/60">
                          <th scope="row" className="py-1 pr-3 text-left font-normal text-ink-soft">
                            {{ positions: "Positions", prices: "Price history", method: "Method statement", capitalProfile: "Capital rule profile", combined: "All inputs" }[k]}
                          </th>
                          <td className="break-all py-1 font-mono">{run.inputHashes![k]}</td>
                        </tr>
                      ))
                    : null}
                </tbody>
              </table>
            </Card>
            <div className="grid gap-6 lg:grid-cols-2">
              <Card title="Warnings" id="warnings">
                {m.warnings.length ? (
                  <Bullets items={m.warnings.map((w) => w.message)} className="list-disc pl-5 text-sm" />
                ) : (
                  <p className="text-sm text-ink-muted">No warning.</p>
                )}
              </Card>
              <Card title="Limitations" id="limitations">
                <Bullets items={m.limitations} className="list-disc pl-5 text-sm" />
              </Card>
            </div>
            <p className="text-xs text-ink-muted">
              Portfolio volatility (one day, {METHOD_WORDS[m.primaryMethod]}): {money(m.methods.find((x) => x.method === m.primaryMethod)?.portfolioVolatility, currency)}; as a share of gross market value{" "}
              {pct((m.methods.find((x) => x.method === m.primaryMethod)?.portfolioVolatility ?? 0) / results.positions.grossMarketValue)}.
            </p>
          </div>
        );
      }}
    </CompletedRun>
  );
}
