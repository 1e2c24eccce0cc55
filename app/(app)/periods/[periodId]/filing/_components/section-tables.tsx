/**
 * The tables the filing's sections name ([table name] in templates/filing/*.md), drawn from the stored view model
 * for the page. Figures in tabular numerals, right-aligned, with their units in the column headings.
 */
import { formatAmount, formatConfidence, formatDate, formatNumber, formatPValue, formatTimestamp } from "@/reports/format";
import { VAR_METHOD_LABELS } from "@/lib/domain/labels";
import { CAPITAL_TABLE_CAPTION, CAPITAL_TABLE_COLUMNS, capitalTableRows } from "@/reports/capital-table";
import type { FilingViewModel } from "@/reports/view-model";
import { FILING_STATE_LABELS, type FilingState } from "./filing-status";

const VAR_METHOD: Record<string, string> = VAR_METHOD_LABELS;

interface Column {
  header: string;
  numeric?: boolean;
}

function Table({ caption, columns, rows, totals = [], testId }: { caption: string; columns: Column[]; rows: (string | React.ReactNode)[][]; totals?: number[]; testId?: string }) {
  return (
    <div className="my-4 overflow-x-auto rounded-md border border-ink-line bg-paper-raised">
      <table className="w-full text-sm" data-testid={testId}>
        <caption className="sr-only">{caption}</caption>
        <thead>
          <tr className="border-b border-ink-line text-left text-ink-muted">
            {columns.map((c, i) => (
              <th key={i} scope="col" className={`px-3 py-2 font-medium ${c.numeric ? "text-right" : ""}`}>
                {c.header}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((row, r) => (
            <tr key={r} className={`border-b border-ink-line/60 last:border-0 ${totals.includes(r) ? "font-semibold" : ""}`}>
              {row.map((cell, i) =>
                i === 0 ? (
                  <th key={i} scope="row" className="px-3 py-2 text-left font-normal">
                    {cell}
                  </th>
                ) : (
                  <td key={i} className={`px-3 py-2 ${columns[i]?.numeric ? "figure text-right" : ""}`}>
                    {cell}
                  </td>
                ),
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** One named table of a section; null for a slot the page leaves to the packs. */
export function SectionTable({ name, vm, status }: { name: string; vm: FilingViewModel; status: FilingState }) {
  const f = vm.figures;
  const ccy = f.currency;
  const H = f.horizonDays;
  const a = formatAmount;
  switch (name) {
    case "cover":
      return (
        <Table
          caption="The filing at a glance"
          testId="cover-table"
          columns={[{ header: "Item" }, { header: "Value" }]}
          rows={[
            ["Firm", vm.firm.name],
            ["Reporting period", `${vm.period.label}, ending ${formatDate(vm.period.end)}`],
            ["Reporting currency", vm.firm.reportingCurrency],
            ["Regulator", vm.firm.regulator || "Not set in the firm's profile"],
            ["Filing deadline", vm.period.deadline ? formatDate(vm.period.deadline) : "Not set"],
            ["Filing version", String(vm.filing.version)],
            ["Status", FILING_STATE_LABELS[status]],
            ["Prepared by", vm.filing.preparedBy],
            ["Submitted for review by", vm.filing.submittedBy ?? "Not yet submitted"],
            ["Figures as of", formatDate(f.asOf)],
            ["Run", `${vm.engine.runId}, started by ${vm.engine.startedBy}`],
            ["Method statement", `Version ${vm.method.version}`],
            ...(vm.filing.filedAt ? [["Filed", `${formatDate(vm.filing.filedAt)}, regulator's reference ${vm.filing.filingReference ?? "—"}`]] : []),
          ]}
        />
      );
    case "capital": {
      const { rows, totalRows } = capitalTableRows(f.capital, ccy);
      return <Table caption={CAPITAL_TABLE_CAPTION} testId="capital-table" columns={[...CAPITAL_TABLE_COLUMNS]} rows={rows} totals={totalRows} />;
    }
    case "totals":
      return (
        <Table
          caption="Value-at-risk and expected shortfall of the book"
          testId="totals-table"
          columns={[
            { header: "Method" },
            { header: "Confidence", numeric: true },
            { header: `VaR, 1 day (${ccy})`, numeric: true },
            { header: `ES, 1 day (${ccy})`, numeric: true },
            { header: `VaR, ${H} days (${ccy})`, numeric: true },
            { header: `ES, ${H} days (${ccy})`, numeric: true },
          ]}
          rows={f.totals.flatMap((m) => m.byConfidence.map((c) => [`${m.label}${m.primary ? " (primary)" : ""}`, formatConfidence(c.confidence), a(c.oneDay.var), a(c.oneDay.es), a(c.horizon.var), a(c.horizon.es)]))}
        />
      );
    case "asset-classes":
      return (
        <>
          {f.byAssetClass.map((set) => {
            const total = f.totals.find((m) => m.primary)?.byConfidence.find((c) => c.confidence === set.confidence);
            const rows = set.rows.map((r) => [r.label, a(r.componentVar1d), a(r.componentEs1d), a(r.componentVarHorizon), a(r.componentEsHorizon), a(r.standAloneVar1d)]);
            if (total) rows.push(["Book total", a(total.oneDay.var), a(total.oneDay.es), a(total.horizon.var), a(total.horizon.es), a(set.rows.reduce((s, r) => s + r.standAloneVar1d, 0))]);
            return (
              <div key={set.confidence}>
                <p className="mt-4 text-sm font-medium text-ink-soft">
                  At {formatConfidence(set.confidence)} confidence, {VAR_METHOD[f.primaryMethod]?.toLowerCase()}
                </p>
                <Table
                  caption={`By asset class at ${formatConfidence(set.confidence)}`}
                  testId={`asset-classes-${set.confidence}`}
                  columns={[
                    { header: "Asset class" },
                    { header: `Component VaR, 1 day (${ccy})`, numeric: true },
                    { header: `Component ES, 1 day (${ccy})`, numeric: true },
                    { header: `Component VaR, ${H} days (${ccy})`, numeric: true },
                    { header: `Component ES, ${H} days (${ccy})`, numeric: true },
                    { header: `Stand-alone VaR, 1 day (${ccy})`, numeric: true },
                  ]}
                  rows={rows}
                  totals={total ? [rows.length - 1] : []}
                />
              </div>
            );
          })}
        </>
      );
    case "stressed":
      return (
        <Table
          caption="Stressed value-at-risk"
          testId="stressed-table"
          columns={[
            { header: "Confidence" },
            { header: `Stressed VaR, 1 day (${ccy})`, numeric: true },
            { header: `Stressed ES, 1 day (${ccy})`, numeric: true },
            { header: `Stressed VaR, ${H} days (${ccy})`, numeric: true },
            { header: `Stressed ES, ${H} days (${ccy})`, numeric: true },
          ]}
          rows={f.stressed.byConfidence.map((c) => [formatConfidence(c.confidence), a(c.oneDay.var), a(c.oneDay.es), a(c.horizon.var), a(c.horizon.es)])}
        />
      );
    case "backtest-tests": {
      const b = f.backtest;
      const rows = [
        ["Days compared", String(b.days), ""],
        ["Exceptions (expected)", `${b.exceptions} (${formatNumber(b.expectedExceptions, 1)})`, ""],
        ["Zone and plus factor", `${b.zone}, ${formatNumber(b.plusFactor, 2)}`, `cumulative probability ${formatNumber(b.cumulativeProbability, 4)}`],
        ["Kupiec, likelihood ratio", formatNumber(b.kupiec.lr, 3), `p-value ${formatPValue(b.kupiec.pValue)}`],
      ];
      if (b.christoffersen) {
        rows.push(["Christoffersen, independence", formatNumber(b.christoffersen.lrInd, 3), `p-value ${formatPValue(b.christoffersen.pValueInd)}`]);
        rows.push(["Christoffersen, conditional coverage", formatNumber(b.christoffersen.lrCc, 3), `p-value ${formatPValue(b.christoffersen.pValueCc)}`]);
      }
      return <Table caption="Backtest measures" testId="backtest-table" columns={[{ header: "Measure" }, { header: "Value", numeric: true }, { header: "Note" }]} rows={rows} />;
    }
    case "exceptions":
      return f.backtest.exceptionList.length ? (
        <Table
          caption="Backtest exceptions with the compliance officer's explanations"
          testId="exceptions-table"
          columns={[{ header: "Date" }, { header: `P&L (${ccy})`, numeric: true }, { header: `VaR (${ccy})`, numeric: true }, { header: `Loss beyond VaR (${ccy})`, numeric: true }, { header: "Explanation" }]}
          rows={f.backtest.exceptionList.map((e) => [formatDate(e.date), a(e.pnl), a(e.var), a(e.excess), e.explanation ? <span className="whitespace-pre-wrap">{e.explanation}</span> : <span className="text-ink-muted">No explanation given.</span>])}
        />
      ) : null;
    case "run-record":
      return (
        <Table
          caption="The run's inputs by their SHA-256 hashes"
          columns={[{ header: "Input" }, { header: "SHA-256" }]}
          rows={[...vm.engine.inputHashes.map((h) => [h.name, <code key={h.name} className="break-all text-xs">{h.hash}</code>]), ["engine version", vm.engine.version]]}
        />
      );
    case "data-quality":
      return vm.dataQuality.items.length ? (
        <Table
          caption="Data-quality findings"
          testId="data-quality-table"
          columns={[{ header: "Severity" }, { header: "Check" }, { header: "Instrument" }, { header: "Finding" }]}
          rows={vm.dataQuality.items.map((i) => [i.severity, i.label, i.instrument, i.message])}
        />
      ) : null;
    case "sign-off":
      return (
        <Table
          caption="Sign-off"
          testId="sign-off-table"
          columns={[{ header: "Item" }, { header: "Value" }]}
          rows={
            vm.signOff
              ? [
                  ["Signed by", vm.signOff.signerName],
                  [vm.firm.licenceLabel, vm.signOff.licenceReference],
                  ["Signed at", formatTimestamp(vm.signOff.signedAt)],
                  ["Content hash (SHA-256)", <code key="hash" className="break-all text-xs" data-testid="signed-hash">{vm.signOff.contentHash}</code>],
                ]
              : [
                  ["Signed by", "—"],
                  [vm.firm.licenceLabel, "—"],
                  ["Signed at", "—"],
                  ["Content hash (SHA-256)", "Filled in when the filing is signed"],
                ]
          }
        />
      );
    default:
      return null;
  }
}
