"use client";

/** The estimator comparison per asset class: a titled bar chart of QLIKE and the table behind it. */
import { Bar, BarChart, CartesianGrid, Cell, LabelList, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { DraftCaution } from "@/app/_components/draft-caution";
import { FigureTable } from "@/app/_components/figure-table";
import { formatDate, formatTimestamp } from "@/app/_components/format";
import type { BookEvidence, ClassEvidence, MethodEvidence } from "@/lib/method/evidence";

const num = (v: number | null, digits: number) => (v === null ? "—" : v.toLocaleString("en-GB", { minimumFractionDigits: digits, maximumFractionDigits: digits }));
const SUPERSCRIPT: Record<string, string> = { "-": "⁻", "+": "", 0: "⁰", 1: "¹", 2: "²", 3: "³", 4: "⁴", 5: "⁵", 6: "⁶", 7: "⁷", 8: "⁸", 9: "⁹" };
/** 1.644e-7 as "1.644 × 10⁻⁷". */
const sci = (v: number) => {
  const [mantissa, exponent] = v.toExponential(3).split("e");
  return `${mantissa} × 10${[...exponent].map((ch) => SUPERSCRIPT[ch] ?? ch).join("")}`;
};

function QlikeChart({ c, titleId }: { c: ClassEvidence; titleId: string }) {
  const ranking = c.comparison!.ranking;
  const best = ranking[0].qlike;
  const data = ranking.map((r) => ({ label: r.label, above: Number((r.qlike - best).toFixed(4)), id: r.id }));
  return (
    <figure aria-labelledby={titleId} className="flex flex-col gap-2">
      <figcaption id={titleId} className="text-sm font-medium">
        {c.label}: QLIKE of each estimator above the best ({ranking[0].label}), one-day forecasts over {c.comparison!.evaluationDays} days — shorter is better
      </figcaption>
      <div className="h-64 w-full" aria-hidden="true">
        <ResponsiveContainer width="100%" height="100%">
          <BarChart accessibilityLayer={false} data={data} layout="vertical" margin={{ top: 4, right: 48, bottom: 16, left: 8 }}>
            <CartesianGrid horizontal={false} stroke="#d8d3c7" />
            <XAxis type="number" tick={{ fontSize: 12, fill: "#3d4a57" }} stroke="#6b7682" label={{ value: "QLIKE above the best", position: "insideBottom", offset: -8, fontSize: 12, fill: "#3d4a57" }} />
            <YAxis type="category" dataKey="label" width={190} tick={{ fontSize: 12, fill: "#1c2733" }} stroke="#6b7682" />
            <Tooltip formatter={(v) => [Number(v).toFixed(4), "QLIKE above the best"]} />
            <Bar dataKey="above" isAnimationActive={false} minPointSize={3}>
              {data.map((d, i) => (
                <Cell key={d.id} fill={i === 0 ? "#2f6b3f" : "#3d4a57"} />
              ))}
              <LabelList dataKey="above" position="right" formatter={(v) => (Number(v) === 0 ? "best" : Number(v).toFixed(3))} style={{ fontSize: 11, fill: "#1c2733" }} />
            </Bar>
          </BarChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}

function RankingTable({ c }: { c: ClassEvidence }) {
  const cmp = c.comparison!;
  return (
    <div className="relative overflow-x-auto">
      <FigureTable
        className="w-full min-w-[720px] text-sm"
        caption={
          <>
            {c.label}: ranked by QLIKE (lower is better). Mean squared error compares σ² with r²; log-likelihood out of sample, higher is better; AIC and BIC in sample where a likelihood is defined;
            exceptions of the normal 99 % one-day VaR against {num(cmp.expectedExceptions, 1)} expected.
          </>
        }
        leftColumns={2}
        columns={["Rank", "Estimator", "QLIKE", "MSE", "Log-likelihood (out of sample)", "AIC", "BIC", "VaR exceptions"]}
      >
        {cmp.ranking.map((r, i) => (
          <tr key={r.id} className="border-b border-ink-line/60 text-right">
            <td className="py-1.5 pr-2 text-left">{i + 1}</td>
            <th scope="row" className="py-1.5 pr-2 text-left font-normal">
              {r.label}
              {r.warnings.length ? <span className="sr-only">. {r.warnings.join(" ")}</span> : null}
            </th>
            <td className="py-1.5 pr-2">{num(r.qlike, 4)}</td>
            <td className="py-1.5 pr-2">{sci(r.mse)}</td>
            <td className="py-1.5 pr-2">{num(r.outOfSampleLogLikelihood, 1)}</td>
            <td className="py-1.5 pr-2">{num(r.aic, 1)}</td>
            <td className="py-1.5 pr-2">{num(r.bic, 1)}</td>
            <td className="py-1.5">{r.varExceptions}</td>
          </tr>
        ))}
      </FigureTable>
      {cmp.failed.length ? (
        <p className="mt-1 text-xs text-ink-muted">Could not be fitted: {cmp.failed.map((f) => `${f.label} (${f.error})`).join("; ")}</p>
      ) : null}
    </div>
  );
}

const ZONE_WORDS: Record<string, string> = { green: "Green", amber: "Amber", red: "Red" };
const ZONE_FILL: Record<string, string> = { green: "#2f6b3f", amber: "#9a6a12", red: "#a3342b" };
const amount = (v: number | null) => (v === null ? "—" : Math.round(v).toLocaleString("en-GB"));

/** The book-level backtest of this version and each candidate: a titled chart of exceptions and the table behind it. */
export function BookEvidenceView({ book }: { book: BookEvidence }) {
  const ev = book.candidates;
  if (!ev) {
    return (
      <p role="status" className="text-sm text-alert" data-testid="book-evidence-error">
        The book-level backtest could not be computed: {book.error}
      </p>
    );
  }
  const expected = ev.days * (1 - ev.confidence);
  // the engine names its own row after the run's method; here that method is this version's
  const labelOf = (r: { id: string; label: string }) => (r.id === "this-method" ? `Version ${book.version} (this statement)` : r.label);
  const data = ev.rows.map((r) => ({ id: r.id, label: labelOf(r).length > 60 ? `${labelOf(r).slice(0, 57)}…` : labelOf(r), exceptions: r.exceptions ?? 0, zone: r.zone ?? "none", failed: r.exceptions === null }));
  const refit = ev.refit.mode === "rolling" ? `parameters re-estimated every ${ev.refit.everyDays} business days` : "parameters fitted once on the whole sample (in sample)";
  return (
    <div className="flex flex-col gap-3" data-testid="book-evidence">
      <p className="text-sm text-ink-soft">
        Version {book.version}
        {book.approvedVersion !== null ? `, approved version ${book.approvedVersion}` : ""} and the standard candidates on the book of {book.periodEnd ? formatDate(book.periodEnd) : "—"}: each day&apos;s one-day{" "}
        {Number((ev.confidence * 100).toFixed(2))} % VaR from data up to the day before ({refit}), over the last {ev.days} days ({ev.dates[0] ? formatDate(ev.dates[0]) : "—"} to{" "}
        {ev.dates.at(-1) ? formatDate(ev.dates.at(-1)!) : "—"}).
      </p>
      <figure aria-labelledby="book-evidence-title" className="flex flex-col gap-2">
        <figcaption id="book-evidence-title" className="text-sm font-medium">
          Backtest exceptions of each method on the firm&apos;s book, last {ev.days} days, against {num(expected, 1)} expected at {Number((ev.confidence * 100).toFixed(2))} % — bar colour is the zone
        </figcaption>
        <div className="w-full" style={{ height: Math.max(220, 34 * data.length + 40) }} aria-hidden="true">
          <ResponsiveContainer width="100%" height="100%">
            <BarChart accessibilityLayer={false} data={data} layout="vertical" margin={{ top: 4, right: 48, bottom: 16, left: 8 }}>
              <CartesianGrid horizontal={false} stroke="#d8d3c7" />
              <XAxis type="number" allowDecimals={false} tick={{ fontSize: 12, fill: "#3d4a57" }} stroke="#6b7682" label={{ value: "Exceptions", position: "insideBottom", offset: -8, fontSize: 12, fill: "#3d4a57" }} />
              <YAxis type="category" dataKey="label" width={260} tick={{ fontSize: 11, fill: "#1c2733" }} stroke="#6b7682" />
              <ReferenceLine x={expected} stroke="#1c2733" strokeDasharray="4 3" label={{ value: `expected ${num(expected, 1)}`, position: "top", fontSize: 11, fill: "#1c2733" }} />
              <Tooltip formatter={(v) => [String(v), "Exceptions"]} />
              <Bar dataKey="exceptions" isAnimationActive={false} minPointSize={2}>
                {data.map((d) => (
                  <Cell key={d.id} fill={ZONE_FILL[d.zone] ?? "#9aa3ab"} />
                ))}
                <LabelList dataKey="exceptions" position="right" style={{ fontSize: 11, fill: "#1c2733" }} />
              </Bar>
            </BarChart>
          </ResponsiveContainer>
        </div>
      </figure>
      <div className="relative overflow-x-auto">
        <FigureTable
          className="w-full min-w-[820px] text-sm"
          testId="book-evidence-table"
          caption={
            <>
              The table behind the chart. Kupiec: unconditional coverage; Christoffersen: independence and conditional coverage (p-values, higher is better). Mean VaR and capital in the
              reporting currency; capital adds the run&apos;s stressed-VaR term, the same for every row.
            </>
          }
          columns={["Method", "Exceptions", { label: "Zone", align: "left" }, "Kupiec p", "Independence p", "Cond. coverage p", "Mean VaR", "Capital"]}
        >
          {ev.rows.map((r) => (
            <tr key={r.id} className="border-b border-ink-line/60 text-right">
              <th scope="row" className="max-w-[22rem] py-1.5 pr-2 text-left font-normal">
                {labelOf(r)}
                {r.error ? <span className="block text-xs text-alert">Could not be computed: {r.error}</span> : null}
              </th>
              <td className="py-1.5 pr-2">{r.exceptions ?? "—"}</td>
              <td className="py-1.5 pr-2 text-left">{r.zone ? ZONE_WORDS[r.zone] : "—"}</td>
              <td className="py-1.5 pr-2">{num(r.kupiecPValue, 3)}</td>
              <td className="py-1.5 pr-2">{num(r.christoffersenIndependencePValue, 3)}</td>
              <td className="py-1.5 pr-2">{num(r.christoffersenPValue, 3)}</td>
              <td className="py-1.5 pr-2">{amount(r.meanVar)}</td>
              <td className="py-1.5">{amount(r.capital)}</td>
            </tr>
          ))}
        </FigureTable>
      </div>
      <p className="text-xs text-ink-muted">{ev.statement}</p>
    </div>
  );
}

export function EvidenceView({ evidence, pending = false }: { evidence: MethodEvidence | null; pending?: boolean }) {
  if (!evidence) {
    return <p className="text-sm text-ink-muted">{pending ? "Computing…" : "No evidence attached yet."}</p>;
  }
  return (
    <div className={`flex flex-col gap-6 ${pending ? "opacity-50" : ""}`} aria-busy={pending}>
      <p className="text-sm text-ink-soft" data-testid="evidence-summary">
        Computed {formatTimestamp(evidence.computedAt)} from the firm&apos;s stored prices up to {formatDate(evidence.asOf)}; asset classes from{" "}
        {evidence.source === "positions" ? `the confirmed positions of the period ending ${formatDate(evidence.periodEnd!)}` : "the firm's instruments (no confirmed positions)"}. Each class is the
        equal-weight average of the daily log returns of its instruments with at least {evidence.minReturns} returns, on the dates all of them have a close. Engine {evidence.engineVersion}.
      </p>
      <DraftCaution />
      {evidence.book ? (
        <article aria-labelledby="ev-book" className="flex flex-col gap-3 border-t border-ink-line pt-4">
          <h3 id="ev-book" className="font-semibold">
            This method and the candidates, backtested on the firm&apos;s book
          </h3>
          <BookEvidenceView book={evidence.book} />
        </article>
      ) : null}
      {evidence.classes.map((c) => (
        <article key={c.assetClass} aria-labelledby={`ev-${c.assetClass}`} className="flex flex-col gap-3 border-t border-ink-line pt-4">
          <h3 id={`ev-${c.assetClass}`} className="font-semibold">
            {c.label}
          </h3>
          <p className="text-sm text-ink-soft">
            {c.instruments.length} {c.instruments.length === 1 ? "instrument" : "instruments"}
            {c.from && c.to ? `, prices ${formatDate(c.from)} to ${formatDate(c.to)}, ${c.returns.toLocaleString("en-GB")} daily returns` : ""}
            {c.excluded.length ? `; left out: ${c.excluded.map((e) => `${e.code} (${e.reason})`).join(", ")}` : ""}.
          </p>
          {c.comparison ? (
            <>
              <p className="rounded-md bg-paper-sunk px-3 py-2 text-sm">{c.comparison.reading}</p>
              <QlikeChart c={c} titleId={`chart-${c.assetClass}`} />
              <RankingTable c={c} />
            </>
          ) : (
            <p role="status" className="text-sm text-alert">
              {c.error}
            </p>
          )}
        </article>
      ))}
    </div>
  );
}
