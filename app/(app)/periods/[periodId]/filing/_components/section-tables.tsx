/**
 * The tables the filing's sections name ([table name] in templates/filing/*.md), drawn from the stored view model
 * for the page. Figures in tabular numerals, right-aligned, with their units in the column headings.
 */
import { formatAmount, formatConfidence, formatDate } from "@/reports/format";
import { VAR_METHOD_LABELS } from "@/lib/domain/labels";
import { CAPITAL_TABLE_CAPTION, CAPITAL_TABLE_COLUMNS, capitalTableRows } from "@/reports/capital-table";
import { backtestTable, componentCells, coverTable, dataQualityTable, exceptionsTable, runRecordTable, signOffTable, stressedTable, totalsTable, varEsCells, varEsColumns, type FilingTableColumn } from "@/reports/filing-tables";
import type { FilingViewModel } from "@/reports/view-model";
import { FILING_STATE_LABELS, type FilingState } from "./filing-status";

const VAR_METHOD: Record<string, string> = VAR_METHOD_LABELS;

function Table({ caption, columns, rows, totalRows = [], testId }: { caption: string; columns: FilingTableColumn[]; rows: (string | React.ReactNode)[][]; totalRows?: number[]; testId?: string }) {
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
            <tr key={r} className={`border-b border-ink-line/60 last:border-0 ${totalRows.includes(r) ? "font-semibold" : ""}`}>
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

/** A hash in code type, broken anywhere. */
function Hash({ hash, testId }: { hash: string; testId?: string }) {
  return (
    <code className="break-all text-xs" data-testid={testId}>
      {hash}
    </code>
  );
}

/** One named table of a section; null for a slot the page leaves to the packs. */
export function SectionTable({ name, vm, status }: { name: string; vm: FilingViewModel; status: FilingState }) {
  const f = vm.figures;
  const ccy = f.currency;
  const H = f.horizonDays;
  const a = formatAmount;
  switch (name) {
    case "cover": {
      const cover = coverTable(vm, FILING_STATE_LABELS[status]);
      const filed = vm.filing.filedAt ? [["Filed", `${formatDate(vm.filing.filedAt)}, regulator's reference ${vm.filing.filingReference ?? "—"}`]] : [];
      return <Table {...cover} testId="cover-table" rows={[...cover.rows, ...filed]} />;
    }
    case "capital": {
      const { rows, totalRows } = capitalTableRows(f.capital, ccy);
      return <Table caption={CAPITAL_TABLE_CAPTION} testId="capital-table" columns={[...CAPITAL_TABLE_COLUMNS]} rows={rows} totalRows={totalRows} />;
    }
    case "totals":
      return <Table {...totalsTable(f)} testId="totals-table" />;
    case "asset-classes":
      return (
        <>
          {f.byAssetClass.map((set) => {
            const total = f.totals.find((m) => m.primary)?.byConfidence.find((c) => c.confidence === set.confidence);
            const rows = set.rows.map((r) => [r.label, ...componentCells(r), a(r.standAloneVar1d)]);
            if (total) rows.push(["Book total", ...varEsCells(total), a(set.rows.reduce((s, r) => s + r.standAloneVar1d, 0))]);
            return (
              <div key={set.confidence}>
                <p className="mt-4 text-sm font-medium text-ink-soft">
                  At {formatConfidence(set.confidence)} confidence, {VAR_METHOD[f.primaryMethod]?.toLowerCase()}
                </p>
                <Table
                  caption={`By asset class at ${formatConfidence(set.confidence)}`}
                  testId={`asset-classes-${set.confidence}`}
                  columns={[{ header: "Asset class" }, ...varEsColumns("Component ", ccy, H), { header: `Stand-alone VaR, 1 day (${ccy})`, numeric: true }]}
                  rows={rows}
                  totalRows={total ? [rows.length - 1] : []}
                />
              </div>
            );
          })}
        </>
      );
    case "stressed":
      return <Table {...stressedTable(f)} testId="stressed-table" />;
    case "backtest-tests":
      return <Table {...backtestTable(f.backtest)} testId="backtest-table" />;
    case "exceptions":
      return f.backtest.exceptionList.length ? (
        <Table
          {...exceptionsTable(f, (e) => (e.explanation ? <span className="whitespace-pre-wrap">{e.explanation}</span> : <span className="text-ink-muted">No explanation given.</span>))}
          testId="exceptions-table"
        />
      ) : null;
    case "run-record":
      return <Table {...runRecordTable(vm, (h) => <Hash key={h.name} hash={h.hash} />)} />;
    case "data-quality":
      return vm.dataQuality.items.length ? <Table {...dataQualityTable(vm)} testId="data-quality-table" /> : null;
    case "sign-off":
      return <Table {...signOffTable(vm, (hash) => <Hash key="hash" hash={hash} testId="signed-hash" />)} testId="sign-off-table" />;
    default:
      return null;
  }
}
