/**
 * The filing's tables that the filing page and the Word pack both draw, once each: the page's caption, the columns
 * (headings, which hold figures, relative widths in the Word pack) and the rows as text. Where the two write a cell
 * differently (a hash in code type on the page, text made safe for the pack) the caller writes that cell. The screen
 * ignores the widths, the Word pack the captions. The capital table has its own spec (./capital-table); a table only
 * one of them draws stays with it.
 */
import { formatAmount, formatConfidence, formatDate, formatNumber, formatPValue, formatTimestamp } from "./format";
import type { BacktestExceptionRow, BacktestFigures, FilingFigures, FilingViewModel } from "./view-model";

/** One column of a filing table: its heading, whether it holds figures, its relative width in the Word pack (1 when not given). */
export interface FilingTableColumn {
  header: string;
  numeric?: boolean;
  weight?: number;
}

/** A filing table: the page's caption (for screen readers; the Word pack shows none), its columns and rows, the rows that are totals. */
export interface FilingTable<Cell = string> {
  caption: string;
  columns: FilingTableColumn[];
  rows: (string | Cell)[][];
  totalRows?: number[];
}

/** A figure's value-at-risk and expected shortfall at one day and over the horizon. */
interface OneDayAndHorizon {
  oneDay: { var: number; es: number };
  horizon: { var: number; es: number };
}

/** A group's component value-at-risk and expected shortfall at one day and over the horizon. */
interface ComponentFigures {
  componentVar1d: number;
  componentEs1d: number;
  componentVarHorizon: number;
  componentEsHorizon: number;
}

const a = formatAmount;

/** Four figure columns in the reporting currency: `{what}VaR` and `{what}ES` at one day, then over `H` days. */
export function varEsColumns(what: "" | "Component " | "Stressed ", ccy: string, H: number, weight?: number): FilingTableColumn[] {
  return [`${what}VaR, 1 day`, `${what}ES, 1 day`, `${what}VaR, ${H} days`, `${what}ES, ${H} days`].map((header) => ({ header: `${header} (${ccy})`, numeric: true, weight }));
}

/** The cells under varEsColumns("" or "Stressed "): VaR and ES at one day, then over the horizon. */
export function varEsCells(x: OneDayAndHorizon): string[] {
  return [a(x.oneDay.var), a(x.oneDay.es), a(x.horizon.var), a(x.horizon.es)];
}

/** The cells under varEsColumns("Component "): component VaR and ES at one day, then over the horizon. */
export function componentCells(x: ComponentFigures): string[] {
  return [a(x.componentVar1d), a(x.componentEs1d), a(x.componentVarHorizon), a(x.componentEsHorizon)];
}

/** The cover table without its last row: the date the filing was filed, which the page and the pack word apart. `status` is the status's label. */
export function coverTable(vm: FilingViewModel, status: string): FilingTable {
  return {
    caption: "The filing at a glance",
    columns: [
      { header: "Item", weight: 1 },
      { header: "Value", weight: 2.2 },
    ],
    rows: [
      ["Firm", vm.firm.name],
      ["Reporting period", `${vm.period.label}, ending ${formatDate(vm.period.end)}`],
      ["Reporting currency", vm.firm.reportingCurrency],
      ["Regulator", vm.firm.regulator || "Not set in the firm's profile"],
      ["Filing deadline", vm.period.deadline ? formatDate(vm.period.deadline) : "Not set"],
      ["Filing version", String(vm.filing.version)],
      ["Status", status],
      ["Prepared by", vm.filing.preparedBy],
      ["Submitted for review by", vm.filing.submittedBy ?? "Not yet submitted"],
      ["Figures as of", formatDate(vm.figures.asOf)],
      ["Run", `${vm.engine.runId}, started by ${vm.engine.startedBy}`],
      ["Method statement", `Version ${vm.method.version}`],
    ],
  };
}

/** Every method's VaR and ES at each confidence, at one day and over the horizon. */
export function totalsTable(f: FilingFigures): FilingTable {
  return {
    caption: "Value-at-risk and expected shortfall of the book",
    columns: [{ header: "Method", weight: 2.2 }, { header: "Confidence", numeric: true, weight: 1 }, ...varEsColumns("", f.currency, f.horizonDays, 1.3)],
    rows: f.totals.flatMap((m) => m.byConfidence.map((c) => [`${m.label}${m.primary ? " (primary)" : ""}`, formatConfidence(c.confidence), ...varEsCells(c)])),
  };
}

/** Stressed VaR and ES at each confidence. */
export function stressedTable(f: FilingFigures): FilingTable {
  return {
    caption: "Stressed value-at-risk",
    columns: [{ header: "Confidence", weight: 1 }, ...varEsColumns("Stressed ", f.currency, f.horizonDays, 1.4)],
    rows: f.stressed.byConfidence.map((c) => [formatConfidence(c.confidence), ...varEsCells(c)]),
  };
}

/** The backtest's measures: days, exceptions, zone, and the coverage tests with their p-values. */
export function backtestTable(b: BacktestFigures): FilingTable {
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
  return {
    caption: "Backtest measures",
    columns: [
      { header: "Measure", weight: 2.2 },
      { header: "Value", numeric: true, weight: 1.2 },
      { header: "Note", weight: 2 },
    ],
    rows,
  };
}

/** Each backtest exception with its loss beyond VaR; `explanation` writes the last cell. */
export function exceptionsTable<Cell>(f: FilingFigures, explanation: (e: BacktestExceptionRow) => string | Cell): FilingTable<Cell> {
  const ccy = f.currency;
  return {
    caption: "Backtest exceptions with the compliance officer's explanations",
    columns: [
      { header: "Date", weight: 1.1 },
      { header: `P&L (${ccy})`, numeric: true, weight: 1.1 },
      { header: `VaR (${ccy})`, numeric: true, weight: 1.1 },
      { header: `Loss beyond VaR (${ccy})`, numeric: true, weight: 1.1 },
      { header: "Explanation", weight: 3.2 },
    ],
    rows: f.backtest.exceptionList.map((e) => [formatDate(e.date), a(e.pnl), a(e.var), a(e.excess), explanation(e)]),
  };
}

/** The run's inputs by their hashes, then the engine's version; `hash` writes each hash's cell. */
export function runRecordTable<Cell>(vm: FilingViewModel, hash: (input: { name: string; hash: string }) => string | Cell): FilingTable<Cell> {
  return {
    caption: "The run's inputs by their SHA-256 hashes",
    columns: [
      { header: "Input", weight: 1 },
      { header: "SHA-256", weight: 4 },
    ],
    rows: [...vm.engine.inputHashes.map((h) => [h.name, hash(h)]), ["engine version", vm.engine.version]],
  };
}

/** The data-quality findings; `text` writes the instrument and the finding (the pack keeps formula-looking text as text). */
export function dataQualityTable(vm: FilingViewModel, text: (s: string) => string = (s) => s): FilingTable {
  return {
    caption: "Data-quality findings",
    columns: [
      { header: "Severity", weight: 0.9 },
      { header: "Check", weight: 1.8 },
      { header: "Instrument", weight: 1.3 },
      { header: "Finding", weight: 4 },
    ],
    rows: vm.dataQuality.items.map((i) => [i.severity, i.label, text(i.instrument), text(i.message)]),
  };
}

/** Who signed, their reference, when, and the content hash (written by `hash`); dashes until the filing is signed. */
export function signOffTable<Cell>(vm: FilingViewModel, hash: (contentHash: string) => string | Cell): FilingTable<Cell> {
  return {
    caption: "Sign-off",
    columns: [
      { header: "Item", weight: 1.2 },
      { header: "Value", weight: 3.6 },
    ],
    rows: vm.signOff
      ? [
          ["Signed by", vm.signOff.signerName],
          [vm.firm.licenceLabel, vm.signOff.licenceReference],
          ["Signed at", formatTimestamp(vm.signOff.signedAt)],
          ["Content hash (SHA-256)", hash(vm.signOff.contentHash)],
        ]
      : [
          ["Signed by", "—"],
          [vm.firm.licenceLabel, "—"],
          ["Signed at", "—"],
          ["Content hash (SHA-256)", "Filled in when the filing is signed"],
        ],
  };
}
