/**
 * The spreadsheet filing pack: opens templates/filing-pack.xlsx and writes the view model's VALUES into it (no
 * formula is written, none is expected to be recalculated): numbers as numbers with number formats, dates as date
 * serials with a date format, every text as a string with formula-looking text neutralised (../neutralise), the
 * DRAFT marking (or the signature) and the caution at the top of every sheet, headers frozen, column widths set.
 */
import path from "node:path";
import XlsxPopulate from "xlsx-populate";
import { contentHash, FILING_STATUS_LABELS, VAR_METHOD_LABELS, type FilingViewModel } from "../view-model";
import { statusMarking } from "../sections";
import { excelSerialDate, excelSerialTimestamp, formatConfidence, formatDate, formatTimestamp } from "../format";
import { neutralise } from "../neutralise";
import {
  BASE_FONT,
  CAUTION_ROW,
  CAUTION_STYLE,
  COLUMNS,
  DRAFT_STYLE,
  DYNAMIC_COLUMN_WIDTH,
  FIRST_DATA_ROW,
  FREEZE,
  HEADER_ROW,
  HEADER_STYLE,
  MARKING_ROW,
  NUMBER_FORMATS,
  SIGNED_STYLE,
  SUMMARY_ITEMS,
  SUMMARY_VAR_COLUMNS,
  SUMMARY_VAR_HEADER_ROW,
  TITLE_ROW,
  TITLE_STYLE,
  headerText,
  type ColumnSpec,
  type SheetName,
  type ValueKind,
} from "./layout";
import { asPackWorkbook, type PackCell, type PackSheet, type PackWorkbook } from "./workbook-types";
import { regulatoryCapitalOf } from "../regulatory-capital-text";
import { withSharedStyles } from "./shared-styles";

export const TEMPLATE_PATH = path.join(process.cwd(), "templates", "filing-pack.xlsx");

export interface WorkbookPackOptions {
  /** another template with the same layout (tests) */
  templatePath?: string;
}

type CellValue = string | number | null;

/** Write one value with its kind's format; text is neutralised, null leaves "—" for figures and nothing for text. */
function put(cell: PackCell, value: CellValue, kind: ValueKind): void {
  if (value === null) {
    if (kind !== "text") cell.value("—").style({ ...BASE_FONT, horizontalAlignment: "right" });
    return;
  }
  if (kind === "text") {
    cell.value(neutralise(String(value)));
    return;
  }
  let n: number;
  if (kind === "date") n = excelSerialDate(String(value));
  else if (kind === "timestamp") n = excelSerialTimestamp(String(value));
  else if (typeof value === "number") n = value;
  else throw new TypeError(`The workbook expected a number for a ${kind} cell ${cell.address()}, got "${value}".`);
  if (!Number.isFinite(n)) throw new RangeError(`The workbook cannot store ${n} in ${cell.address()}.`);
  cell.value(n).style({ ...BASE_FONT, numberFormat: NUMBER_FORMATS[kind] });
}

interface TableColumn {
  header: string;
  kind: ValueKind;
  width: number;
}

function fixed(sheet: SheetName, ccy: string, h: number): TableColumn[] {
  return COLUMNS[sheet].map((c: ColumnSpec) => ({ header: headerText(c, ccy, h), kind: c.kind, width: c.width }));
}

/** Headers, widths and rows of one sheet's table. */
function writeTable(sheet: PackSheet, columns: TableColumn[], rows: CellValue[][]): void {
  // room for three lines of a wrapped header where a run adds long column names
  if (columns.some((c) => c.header.length > 30)) sheet.row(HEADER_ROW).height(44);
  columns.forEach((c, i) => {
    sheet.cell(HEADER_ROW, i + 1).value(c.header).style({ ...HEADER_STYLE, horizontalAlignment: c.kind === "text" ? "left" : "right" });
    sheet.column(i + 1).width(c.width);
  });
  rows.forEach((row, r) => {
    row.forEach((value, i) => put(sheet.cell(FIRST_DATA_ROW + r, i + 1), value, columns[i]?.kind ?? "text"));
  });
}

/**
 * Title, marking and caution, each merged across the table's width so that they wrap within it (printed pages
 * repeat these rows: the template's print titles).
 */
function topRows(sheet: PackSheet, title: string, vm: FilingViewModel, width: number): void {
  const columns = Math.max(2, width);
  let chars = 0;
  for (let i = 1; i <= columns; i++) chars += sheet.column(i).width() ?? 9;
  const caution = `Draft caution: ${vm.caution}`;
  sheet.cell(TITLE_ROW, 1).value(neutralise(`${title} · ${vm.firm.name} · ${vm.period.label} · version ${vm.filing.version}`)).style(TITLE_STYLE);
  sheet.cell(MARKING_ROW, 1).value(statusMarking(vm)).style(vm.signOff ? SIGNED_STYLE : DRAFT_STYLE);
  sheet.cell(CAUTION_ROW, 1).value(caution).style(CAUTION_STYLE);
  for (const row of [TITLE_ROW, MARKING_ROW, CAUTION_ROW]) sheet.range(row, 1, row, columns).merged(true);
  sheet.range(CAUTION_ROW, 1, CAUTION_ROW, columns).style(CAUTION_STYLE);
  // about 1.1 characters of 10-point text per unit of column width; 13 points a line
  const lines = Math.ceil((caution.length * 1.1) / chars);
  sheet.row(TITLE_ROW).height(22);
  sheet.row(CAUTION_ROW).height(13 * lines + 5);
}

function summaryValues(vm: FilingViewModel): Record<string, CellValue> {
  const f = vm.figures;
  const rc = regulatoryCapitalOf(vm);
  const c = f.capital;
  const b = f.backtest;
  return {
    firm_name: vm.firm.name,
    reporting_currency: vm.firm.reportingCurrency,
    regulator: vm.firm.regulator || "Not set",
    period_end: vm.period.end,
    filing_deadline: vm.period.deadline,
    filing_version: vm.filing.version,
    filing_status: FILING_STATUS_LABELS[vm.filing.status],
    prepared_by: vm.filing.preparedBy,
    submitted_by: vm.filing.submittedBy ?? "Not yet submitted",
    figures_as_of: f.asOf,
    primary_method: VAR_METHOD_LABELS[f.primaryMethod],
    filed_capital_regime: rc.filed !== null ? rc.filedLabel : `${rc.filedLabel}: not available (${rc.missing ?? "not computed"})`,
    filed_capital: rc.filed,
    filed_capital_rwa: rc.filedRwa,
    comparison_capital_regime: rc.comparisonLabel ?? "None computed",
    comparison_capital: rc.comparison,
    capital: c.capital,
    capital_confidence: c.confidence,
    capital_horizon_days: c.horizonDays,
    averaging_days: c.averagingDays,
    var_last: c.varLast,
    var_average: c.varAverage,
    multiplier_base: c.multiplierBase,
    plus_factor: c.plusFactor,
    multiplier: c.multiplier,
    var_term: c.varTerm,
    svar_last: c.stressedVarLast,
    svar_average: c.stressedVarAverage,
    svar_multiplier: c.stressedMultiplier,
    svar_term: c.includesStressed ? c.stressedVarTerm : null,
    stress_window_start: f.stressed.window.start,
    stress_window_end: f.stressed.window.end,
    backtest_days: b.days,
    backtest_exceptions: b.exceptions,
    backtest_expected: b.expectedExceptions,
    backtest_zone: b.zone,
    kupiec_lr: b.kupiec.lr,
    kupiec_p: b.kupiec.pValue,
    christoffersen_ind_lr: b.christoffersen?.lrInd ?? null,
    christoffersen_ind_p: b.christoffersen?.pValueInd ?? null,
    christoffersen_cc_lr: b.christoffersen?.lrCc ?? null,
    christoffersen_cc_p: b.christoffersen?.pValueCc ?? null,
    method_version: vm.method.version,
    run_id: vm.engine.runId,
    engine_version: vm.engine.version,
    signed_by: vm.signOff ? vm.signOff.signerName : "Not signed",
    licence_reference: vm.signOff ? vm.signOff.licenceReference : "",
    signed_at: vm.signOff ? vm.signOff.signedAt : null,
    content_hash: vm.signOff ? vm.signOff.contentHash : "Filled in when the filing is signed",
  };
}

function writeSummary(wb: PackWorkbook, sheet: PackSheet, vm: FilingViewModel): void {
  const f = vm.figures;
  const ccy = f.currency;
  const values = summaryValues(vm);
  SUMMARY_ITEMS.forEach((item, i) => {
    const cell = wb.definedName(item.name);
    if (!cell) throw new Error(`templates/filing-pack.xlsx has no defined name "${item.name}"; run scripts/make-pack-template.ts.`);
    if (!(item.name in values)) throw new Error(`The workbook pack has no value for the summary item "${item.name}".`);
    put(cell, values[item.name], item.kind);
    if (item.name === "licence_reference") sheet.cell(FIRST_DATA_ROW + i, 1).value(`Signer's ${vm.firm.licenceLabel.toLowerCase()}`);
    if (item.unit === "ccy") sheet.cell(FIRST_DATA_ROW + i, 3).value(ccy);
  });
  SUMMARY_VAR_COLUMNS.forEach((c, i) => sheet.cell(SUMMARY_VAR_HEADER_ROW, i + 1).value(headerText(c, ccy, f.horizonDays)).style({ ...HEADER_STYLE, horizontalAlignment: c.kind === "text" ? "left" : "right" }));
  const rows: CellValue[][] = [];
  for (const m of f.totals) for (const c of m.byConfidence) rows.push([`VaR and ES, ${m.label.toLowerCase()}${m.primary ? " (primary)" : ""}`, c.confidence, c.oneDay.var, c.oneDay.es, c.horizon.var, c.horizon.es]);
  for (const c of f.stressed.byConfidence) rows.push([`Stressed VaR and ES, ${VAR_METHOD_LABELS[f.stressed.method].toLowerCase()}`, c.confidence, c.oneDay.var, c.oneDay.es, c.horizon.var, c.horizon.es]);
  rows.forEach((row, r) => row.forEach((v, i) => put(sheet.cell(SUMMARY_VAR_HEADER_ROW + 1 + r, i + 1), v, SUMMARY_VAR_COLUMNS[i].kind)));
  COLUMNS.Summary.forEach((c, i) => sheet.column(i + 1).width(c.width));
  SUMMARY_VAR_COLUMNS.forEach((c, i) => {
    if (i >= COLUMNS.Summary.length) sheet.column(i + 1).width(c.width);
  });
}

/**
 * The spreadsheet pack of a filing.
 * @throws when a signed filing's stored hash is not the hash of this content, or the template lacks a defined name
 */
export async function buildWorkbookPack(vm: FilingViewModel, options: WorkbookPackOptions = {}): Promise<Buffer> {
  if (vm.signOff && vm.signOff.contentHash !== contentHash(vm)) {
    throw new Error("The signature's content hash does not match this filing's content: the pack is not built for content that differs from what was signed.");
  }
  const wb = asPackWorkbook(await XlsxPopulate.fromFileAsync(options.templatePath ?? TEMPLATE_PATH));
  const f = vm.figures;
  const ccy = f.currency;
  const H = f.horizonDays;
  const sheet = (name: SheetName): PackSheet => {
    const s = wb.sheet(name);
    if (!s) throw new Error(`templates/filing-pack.xlsx has no sheet "${name}"; run scripts/make-pack-template.ts.`);
    return s;
  };

  // Summary
  const summary = sheet("Summary");
  writeSummary(wb, summary, vm);

  // Positions
  writeTable(
    sheet("Positions"),
    fixed("Positions", ccy, H),
    f.positions.map((p) => [p.instrument, p.assetClassLabel, p.currency, p.marketValue, p.exposure, p.componentVar1d, p.included ? "yes" : "no", p.included ? "" : `Left out: ${p.note}`]),
  );

  // Risk factors: one column per estimator the run computed, then the chosen one
  const estimators: { id: string; label: string }[] = [];
  for (const r of f.riskFactors) for (const e of r.estimates) if (!estimators.some((x) => x.id === e.estimator)) estimators.push({ id: e.estimator, label: e.label });
  writeTable(
    sheet("Risk factors"),
    [
      ...fixed("Risk factors", ccy, H),
      ...estimators.map((e) => ({ header: `${e.label}, 1-day volatility`, kind: "percent" as const, width: DYNAMIC_COLUMN_WIDTH })),
      { header: "Chosen estimator", kind: "text", width: 24 },
      { header: "Chosen, 1-day volatility", kind: "percent", width: DYNAMIC_COLUMN_WIDTH },
    ],
    f.riskFactors.map((r) => [
      r.factor,
      r.kind,
      r.exposure,
      ...estimators.map((e) => r.estimates.find((x) => x.estimator === e.id)?.volatility ?? null),
      r.chosenLabel ?? "",
      r.chosenVolatility,
    ]),
  );

  // Correlation
  const corr = f.correlation;
  writeTable(
    sheet("Correlation"),
    [...fixed("Correlation", ccy, H), ...(corr?.factors ?? []).map((x) => ({ header: neutralise(x), kind: "correlation" as const, width: 11 }))],
    corr ? corr.matrix.map((row, i) => [corr.factors[i], ...row]) : [["No correlation matrix was stored with this run."]],
  );

  // Contributions: every confidence, by position, asset class and currency, with the book's total
  const contributionRows: CellValue[][] = [];
  const primary = f.totals.find((m) => m.primary);
  for (const set of f.contributions) {
    for (const p of set.byPosition) contributionRows.push([set.confidence, "position", p.instrument, p.assetClass, p.currency, p.marketValue, p.componentVar1d, p.componentEs1d, p.componentVarHorizon, p.componentEsHorizon, p.shareOfVar, null, null]);
    const total = primary?.byConfidence.find((c) => c.confidence === set.confidence);
    for (const a of set.byAssetClass) contributionRows.push([set.confidence, "asset class", a.label, a.assetClass, "", null, a.componentVar1d, a.componentEs1d, a.componentVarHorizon, a.componentEsHorizon, total?.oneDay.var ? a.componentVar1d / total.oneDay.var : null, a.standAloneVar1d, a.standAloneVarHorizon]);
    for (const c of set.byCurrency) contributionRows.push([set.confidence, "currency", c.currency, "", c.currency, null, c.componentVar1d, c.componentEs1d, c.componentVarHorizon, c.componentEsHorizon, total?.oneDay.var ? c.componentVar1d / total.oneDay.var : null, null, null]);
    if (total) contributionRows.push([set.confidence, "book", "Book total", "", "", null, total.oneDay.var, total.oneDay.es, total.horizon.var, total.horizon.es, 1, null, null]);
  }
  writeTable(sheet("Contributions"), fixed("Contributions", ccy, H), contributionRows);

  // VaR history: per confidence VaR and ES at one day and the horizon, and the next day's P&L
  const historyColumns: TableColumn[] = [...fixed("VaR history", ccy, H)];
  for (const c of f.confidences) {
    const k = formatConfidence(c);
    historyColumns.push(
      { header: `VaR ${k}, 1 day (${ccy})`, kind: "amount", width: DYNAMIC_COLUMN_WIDTH },
      { header: `ES ${k}, 1 day (${ccy})`, kind: "amount", width: DYNAMIC_COLUMN_WIDTH },
      { header: `VaR ${k}, ${H} days (${ccy})`, kind: "amount", width: DYNAMIC_COLUMN_WIDTH },
      { header: `ES ${k}, ${H} days (${ccy})`, kind: "amount", width: DYNAMIC_COLUMN_WIDTH },
    );
  }
  historyColumns.push({ header: `P&L of the next day (${ccy})`, kind: "amount", width: DYNAMIC_COLUMN_WIDTH });
  writeTable(
    sheet("VaR history"),
    historyColumns,
    f.varHistory.points.map((p) => [p.asOf, ...f.confidences.flatMap((_c, i) => [p.var1d[i], p.es1d[i], p.varHorizon[i], p.esHorizon[i]]), p.pnlNext]),
  );

  // Backtest: the days with P&L and VaR the run stored, and every exception, by date
  const byDate = new Map<string, CellValue[]>();
  for (const d of f.backtest.pnlVsVar) byDate.set(d.date, [d.date, d.pnl, d.var, d.exception ? "yes" : "", d.exception ? -d.pnl - d.var : null, ""]);
  for (const e of f.backtest.exceptionList) byDate.set(e.date, [e.date, e.pnl, e.var, "yes", e.excess, e.explanation || "No explanation given."]);
  writeTable(
    sheet("Backtest"),
    fixed("Backtest", ccy, H),
    [...byDate.keys()].sort().map((d) => byDate.get(d) as CellValue[]),
  );

  // Data quality
  writeTable(
    sheet("Data quality"),
    fixed("Data quality", ccy, H),
    vm.dataQuality.items.length ? vm.dataQuality.items.map((i) => [i.severity, i.label, i.instrument, i.message, i.dates.join(", ")]) : [["", "No problems were found.", "", "", ""]],
  );

  // Method, notes and the run record
  const methodRows: CellValue[][] = [[`Method statement`, `Version ${vm.method.version}${vm.method.approvedAt ? `, approved ${formatDate(vm.method.approvedAt)}` : ""}`]];
  for (const s of vm.method.sentences) methodRows.push(["Method", s]);
  for (const line of vm.method.rationale.split(/\r?\n/).filter((l) => l.trim())) methodRows.push(["Rationale", line]);
  for (const l of vm.limitations) methodRows.push([`Limitation (${l.source})`, l.text]);
  for (const w of vm.engine.warnings) methodRows.push(["Warning from the run", w.message]);
  for (const line of vm.filing.coverNote.split(/\r?\n/).filter((l) => l.trim())) methodRows.push(["Cover note", line]);
  if (vm.filing.reason.trim()) methodRows.push([`Reason for version ${vm.filing.version}`, vm.filing.reason]);
  for (const c of vm.filing.changesSinceLast) methodRows.push(["Change since the last filing", c]);
  methodRows.push(["Run", `${vm.engine.runId}, started by ${vm.engine.startedBy}; ${vm.engine.sample.days} days of returns from ${formatDate(vm.engine.sample.firstDate)} to ${formatDate(vm.engine.sample.lastDate)}`]);
  for (const n of vm.engine.notes) methodRows.push(["How the run applied it", n]);
  if (f.riskFactorStatement) methodRows.push(["Factor volatilities", f.riskFactorStatement]);
  for (const m of vm.method.models ?? []) methodRows.push([`Model used: ${m.factor}`, `${m.label}; chosen by ${m.source}${m.assetClass ? ` (${m.assetClass})` : ""}${m.parameters ? `; ${m.parameters}` : ""}; start-up: ${m.startUp}`]);
  const cands = vm.method.candidates;
  if (cands) {
    methodRows.push(["Candidate methods", cands.statement]);
    for (const r of cands.rows) {
      methodRows.push([
        `Candidate: ${r.label}`,
        r.error
          ? `not computed: ${r.error}`
          : `${r.exceptions} exceptions in ${cands.days} days (${r.zone}); Kupiec p ${r.kupiecPValue === null ? "—" : r.kupiecPValue.toFixed(3)}; Christoffersen p ${r.christoffersenPValue === null ? "—" : r.christoffersenPValue.toFixed(3)}; mean VaR ${r.meanVar === null ? "—" : Math.round(r.meanVar)} ${ccy}; capital ${r.capital === null ? "—" : Math.round(r.capital)} ${ccy}`,
      ]);
    }
  }
  methodRows.push(["Engine version", vm.engine.version]);
  for (const h of vm.engine.inputHashes) methodRows.push([`Input hash: ${h.name}`, h.hash]);
  for (const c of vm.engine.choices) methodRows.push([`Choice: ${c.name}`, c.value]);
  methodRows.push(["Stressed VaR window", `${formatDate(f.stressed.window.start)} to ${formatDate(f.stressed.window.end)}, ${f.stressed.window.days} days${f.stressed.searchRule ? `; ${f.stressed.searchRule}` : ""}`]);
  methodRows.push(["Sign-off", vm.signOff ? `Signed by ${vm.signOff.signerName} (${vm.firm.licenceLabel} ${vm.signOff.licenceReference}) on ${formatTimestamp(vm.signOff.signedAt)}; SHA-256 ${vm.signOff.contentHash}` : "Not signed"]);
  for (const s of vm.supersededSignatures) methodRows.push([`Superseded signature, version ${s.version}`, `${s.signerName} on ${formatTimestamp(s.signedAt)}, SHA-256 ${s.contentHash}; superseded ${formatTimestamp(s.supersededAt)}: ${s.reason}`]);
  methodRows.push(["Caution", vm.caution]);
  const methodSheet = sheet("Method");
  const methodColumns = fixed("Method", ccy, H);
  writeTable(methodSheet, methodColumns, methodRows);
  // wrapped text: a height for each row, as not every program sizes rows when it opens a file
  const textWidth = methodColumns[1].width;
  methodRows.forEach((row, r) => {
    const lines = Math.max(1, Math.ceil(String(row[1] ?? "").length / (textWidth * 1.1)));
    if (lines > 1) methodSheet.row(FIRST_DATA_ROW + r).height(13 * lines + 3);
  });

  // every sheet: title, marking, caution, frozen header
  const titles: Record<SheetName, string> = {
    Summary: "Filing pack",
    Positions: "Positions",
    "Risk factors": "Risk factors",
    Correlation: "Correlation",
    Contributions: "Contributions",
    "VaR history": "VaR history",
    Backtest: "Backtest",
    "Data quality": "Data quality",
    Method: "Method statement and notes",
  };
  for (const [name, title] of Object.entries(titles) as [SheetName, string][]) {
    const s = sheet(name);
    const used = s.usedRange();
    const width = name === "Summary" ? SUMMARY_VAR_COLUMNS.length : used ? Math.max(...used.value().map((r) => r.length)) : 2;
    topRows(s, title, vm, width);
    s.freezePanes(FREEZE[name]);
  }
  const bytes = await wb.outputAsync();
  // one shared cell format per distinct style (xlsx-populate writes one per cell), no empty fills
  return withSharedStyles(bytes as Uint8Array);
}
