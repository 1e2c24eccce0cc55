/**
 * Command-line commands of the portfolio engine:
 *   var --positions P.csv --prices PR.csv [--method parametric|historical|filtered] [--cov equal|ewma|garch-ccc]
 *       [--vol FACTOR=MODEL,…,default=MODEL] [--corr equal:N|ewma:L|ccc]
 *       [--lambda L] [--window N] [--confidence C] [--horizon H] [--scaling sqrt|term|overlap]
 *       [--reporting-currency CCY] [--missing drop|carry-forward|drop-inside-history] --json
 *     --missing says what happens on a date some series has no price (default drop: the date is left out):
 *     carry-forward carries the last price up to 5 dates; drop-inside-history is the rule every run uses (a date is
 *     left out only where a series inside its own history has none; before its first price and after its last the
 *     series simply has no return)
 *     --vol gives each factor its own volatility process (MODEL ma:M, ewma:L, ewma:fit, arch:M, garch, garch-t) and
 *     makes the covariance D·R·D with the --corr correlation (default ewma:λ with --lambda, else 0.94)
 *   backtest --input FILE.csv (date,pnl,var) [--confidence C] --json
 *   capital --input FILE.csv (date,var,svar; at least 60 rows, the last being t−1) [--exceptions N] [--mc M] [--ms M] --json
 */
import { CliError, parseNumber, parseOptions, printJson, readCsv, type CliOptions, type CsvTable } from "./io";
import { alignedLogReturns, alignSeries, type DatedSeries } from "../risk";
import { portfolioVar, type VarMethod, type CovarianceChoice } from "../risk/portfolio/run-month-end";
import type { Position } from "../risk/portfolio/exposures";
import { runBacktest } from "../risk/backtest/backtest";
import { BASEL_CAPITAL_PROFILE, capitalCharge } from "../risk/capital/capital";
import type { HorizonScaling } from "../risk/var/scaling";
import { ENGINE_VERSION } from "../risk/version";
import { parseCorrelation, parseVolSpecs } from "./specs";

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

function column(table: CsvTable, name: string, flag: string, required: true): number;
function column(table: CsvTable, name: string, flag: string, required: false): number | -1;
function column(table: CsvTable, name: string, flag: string, required: boolean): number {
  const i = table.header.findIndex((h) => h.toLowerCase() === name);
  if (i < 0 && required) throw new CliError(`${flag}: missing column "${name}" (columns: ${table.header.join(", ")})`);
  return i;
}

function stringOption(options: CliOptions, name: string): string | undefined {
  const v = options[name];
  return typeof v === "string" ? v : undefined;
}

function numberOption(options: CliOptions, name: string, check: (v: number) => boolean, rule: string): number | undefined {
  const raw = stringOption(options, name);
  if (raw === undefined) return undefined;
  const v = Number(raw);
  if (!Number.isFinite(v) || !check(v)) throw new CliError(`--${name} must be ${rule}, not "${raw}"`);
  return v;
}

function choice<T extends string>(options: CliOptions, name: string, allowed: readonly T[], fallback: T): T {
  const raw = stringOption(options, name);
  if (raw === undefined) return fallback;
  if (!allowed.includes(raw as T)) throw new CliError(`--${name} must be one of ${allowed.join("|")}, not "${raw}"`);
  return raw as T;
}

function checkDate(cell: string | undefined, rowIndex: number, flag: string): string {
  const d = (cell ?? "").trim();
  if (!ISO_DATE.test(d)) throw new CliError(`${flag}: row ${rowIndex + 2}, column "date": "${cell ?? ""}" is not a yyyy-mm-dd date`);
  return d;
}

/** Positions CSV: instrument and market_value required; asset_class, currency, delta_exposure optional. */
export function readPositions(path: string | undefined): Position[] {
  const flag = "--positions";
  const table = readCsv(path, flag);
  const iInst = column(table, "instrument", flag, true);
  const iMv = column(table, "market_value", flag, true);
  const iClass = column(table, "asset_class", flag, false);
  const iCcy = column(table, "currency", flag, false);
  const iDelta = column(table, "delta_exposure", flag, false);
  return table.rows.map((row, r) => {
    const instrument = (row[iInst] ?? "").trim();
    if (!instrument) throw new CliError(`${flag}: row ${r + 2}, column "instrument" is empty`);
    const p: Position = { instrument, marketValue: parseNumber(row[iMv], r, "market_value") };
    if (iClass >= 0 && (row[iClass] ?? "").trim()) p.assetClass = row[iClass].trim();
    if (iCcy >= 0 && (row[iCcy] ?? "").trim()) p.currency = row[iCcy].trim().toUpperCase();
    if (iDelta >= 0 && (row[iDelta] ?? "").trim()) p.deltaExposure = parseNumber(row[iDelta], r, "delta_exposure");
    return p;
  });
}

/** Price CSV, long (date, instrument, close) or wide (date, then one column per instrument; an empty cell is a missing price). */
export function readPrices(path: string | undefined): DatedSeries[] {
  const flag = "--prices";
  const table = readCsv(path, flag);
  const iDate = column(table, "date", flag, true);
  const lower = table.header.map((h) => h.toLowerCase());
  const bySeries = new Map<string, { dates: string[]; values: number[] }>();
  const add = (id: string, date: string, value: number, r: number, col: string) => {
    if (!(value > 0)) throw new CliError(`${flag}: row ${r + 2}, column "${col}": price ${value} is not positive`);
    const s = bySeries.get(id) ?? { dates: [], values: [] };
    if (s.dates.includes(date)) throw new CliError(`${flag}: row ${r + 2}: ${id} has the date ${date} twice`);
    s.dates.push(date);
    s.values.push(value);
    bySeries.set(id, s);
  };
  if (lower.includes("instrument") && lower.includes("close")) {
    const iInst = lower.indexOf("instrument");
    const iClose = lower.indexOf("close");
    table.rows.forEach((row, r) => {
      const id = (row[iInst] ?? "").trim();
      if (!id) throw new CliError(`${flag}: row ${r + 2}, column "instrument" is empty`);
      add(id, checkDate(row[iDate], r, flag), parseNumber(row[iClose], r, "close"), r, "close");
    });
  } else {
    if (table.header.length < 2) throw new CliError(`${flag}: a wide price file needs a date column and at least one instrument column`);
    table.rows.forEach((row, r) => {
      const date = checkDate(row[iDate], r, flag);
      table.header.forEach((h, c) => {
        if (c === iDate) return;
        if ((row[c] ?? "").trim() === "") return; // a missing price, reported by the alignment
        add(h, date, parseNumber(row[c], r, h), r, h);
      });
    });
  }
  if (bySeries.size === 0) throw new CliError(`${flag}: no prices found`);
  for (const s of bySeries.values()) {
    const order = s.dates.map((_, i) => i).sort((a, b) => (s.dates[a] < s.dates[b] ? -1 : 1));
    const d = order.map((i) => s.dates[i]);
    const v = order.map((i) => s.values[i]);
    s.dates = d;
    s.values = v;
  }
  return [...bySeries.entries()].map(([id, s]) => ({ id, dates: s.dates, values: s.values }));
}

const VAR_OPTIONS = ["positions", "prices", "method", "cov", "vol", "corr", "lambda", "window", "confidence", "horizon", "scaling", "reporting-currency", "missing"];

function varCommand(argv: string[]): void {
  const options = parseOptions(argv, VAR_OPTIONS, ["json"]);
  const method = choice<VarMethod>(options, "method", ["parametric", "historical", "filtered"], "parametric");
  const cov = choice<CovarianceChoice>(options, "cov", ["equal", "ewma", "garch-ccc"], "ewma");
  const scaling = choice<HorizonScaling>(options, "scaling", ["sqrt", "term", "overlap"], "sqrt");
  const missing = choice(options, "missing", ["drop", "carry-forward", "drop-inside-history"] as const, "drop");
  const lambda = numberOption(options, "lambda", (v) => v > 0 && v < 1, "a number between 0 and 1");
  const window = numberOption(options, "window", (v) => Number.isInteger(v) && v >= 2, "a whole number of days of at least 2");
  const confidence = numberOption(options, "confidence", (v) => v > 0 && v < 1, "a number between 0 and 1, e.g. 0.99") ?? 0.99;
  const horizon = numberOption(options, "horizon", (v) => Number.isInteger(v) && v >= 1, "a whole number of days, e.g. 1 or 10") ?? 1;
  const volRaw = stringOption(options, "vol");
  const corrRaw = stringOption(options, "corr");
  if (corrRaw !== undefined && volRaw === undefined) throw new CliError("--corr applies with --vol (per-factor volatility processes); without --vol use --cov");
  if (volRaw !== undefined && stringOption(options, "cov") !== undefined) throw new CliError("--vol and --cov do not go together: with --vol the covariance is D·R·D with the --corr correlation");
  if (scaling === "term" && cov !== "garch-ccc" && volRaw === undefined) throw new CliError("--scaling term needs --vol (or --cov garch-ccc)");
  if (scaling === "overlap" && method === "parametric") throw new CliError("--scaling overlap applies to --method historical or filtered");

  const positions = readPositions(stringOption(options, "positions"));
  const series = readPrices(stringOption(options, "prices"));
  const currencies = [...new Set(positions.map((p) => p.currency).filter((c): c is string => !!c))];
  let reporting = stringOption(options, "reporting-currency")?.toUpperCase();
  if (!reporting) {
    if (currencies.length > 1) throw new CliError(`positions are in several currencies (${currencies.join(", ")}): give --reporting-currency`);
    reporting = currencies[0] ?? "REPORTING";
  }
  const ids = new Set(series.map((s) => s.id));
  const fxFactorId = (ccy: string, rep: string) => (ids.has(`${ccy}/${rep}`) ? `${ccy}/${rep}` : `${ccy}${rep}`);
  const aligned = alignSeries(series, { missing });
  if (aligned.dates.length < 3) throw new CliError(`--prices: only ${aligned.dates.length} dates remain after aligning the series (missing: ${missing})`);
  // log returns between the kept dates (NaN only with drop-inside-history, where a series has no price)
  const alignedReturns = alignedLogReturns(aligned);
  const factors: Record<string, number[]> = {};
  for (const s of series) factors[s.id] = Array.from(alignedReturns.returns[s.id]);
  const vol = volRaw !== undefined ? parseVolSpecs(volRaw, ids) : null;
  const correlation = corrRaw !== undefined ? parseCorrelation(corrRaw) : undefined;
  let result;
  try {
    result = portfolioVar({
    positions,
    returns: { dates: alignedReturns.dates, factors },
    reportingCurrency: reporting,
    fxFactorId,
    method: {
      methods: [method],
      covariance: cov,
      lambda,
      covarianceWindow: cov === "equal" ? window : undefined,
      historicalWindow: method !== "parametric" ? window : undefined,
      confidences: [confidence],
      horizonDays: Math.max(horizon, 2) === horizon ? horizon : 10,
      scaling,
      ...(vol ? { volatility: vol.choice, ...(correlation ? { correlation } : {}) } : {}),
    },
    });
  } catch (error) {
    if (vol) throw new CliError((error as Error).message);
    throw error;
  }
  const figures = result.methods[0];
  const c = figures.byConfidence[0];
  const long = horizon > 1;
  const warnings = [...result.warnings];
  const outside = Object.entries(aligned.report.perSeries).filter(([, p]) => p.outsideHistory > 0);
  if (outside.length) {
    warnings.unshift({ code: "outside-history", message: `${outside.length} series had no price on some kept dates before their first or after their last price, and no return there (${outside.map(([id, p]) => `${id}: ${p.outsideHistory}`).join(", ")}).` });
  }
  if (aligned.report.dropped.length) {
    const why = missing === "drop-inside-history" ? "some series had no price on them inside their own history" : "some series had no price on them";
    warnings.unshift({ code: "dates-dropped", message: `${aligned.report.dropped.length} date(s) were dropped because ${why} (first: ${aligned.report.dropped[0].date}, missing ${aligned.report.dropped[0].missingIds.join(", ")}).` });
  }
  if (aligned.report.carried.length) {
    warnings.unshift({ code: "prices-carried", message: `${aligned.report.carried.length} missing price(s) were carried forward from the previous date.` });
  }
  printJson({
    var: long ? c.horizon.var : c.oneDay.var,
    es: long ? c.horizon.es : c.oneDay.es,
    confidence,
    horizonDays: horizon,
    method,
    covariance: method === "historical" ? "not used" : vol ? `D·R·D: per-factor processes, correlation ${result.model.correlation.label}` : cov,
    scaling: long ? figures.scalingStatement : "one-day figures, no scaling",
    portfolioVolatility: figures.portfolioVolatility,
    asOf: result.asOf,
    reportingCurrency: reporting,
    contributions: c.contributions.map((p) => ({
      instrument: p.instrument,
      assetClass: p.assetClass,
      currency: p.currency,
      marketValue: p.marketValue,
      componentVar: long ? p.componentVarHorizon : p.componentVar,
      componentEs: long ? p.componentEsHorizon : p.componentEs,
      marginalVar: long ? (p.marketValue !== 0 ? p.componentVarHorizon / p.marketValue : 0) : p.marginalVar,
    })),
    byAssetClass: Object.fromEntries(
      Object.entries(c.byAssetClass).map(([k, g]) => [k, long
        ? { componentVar: g.componentVarHorizon, componentEs: g.componentEsHorizon, standAloneVar: g.standAloneVarHorizon, standAloneEs: g.standAloneEsHorizon }
        : { componentVar: g.componentVar, componentEs: g.componentEs, standAloneVar: g.standAloneVar, standAloneEs: g.standAloneEs }]),
    ),
    byCurrency: Object.fromEntries(Object.entries(c.byCurrency).map(([k, g]) => [k, { componentVar: long ? g.componentVarHorizon : g.componentVar, componentEs: long ? g.componentEsHorizon : g.componentEs }])),
    byFactor: c.byFactor,
    diversificationBenefit: long ? c.diversificationBenefitHorizon : c.diversificationBenefit,
    covarianceCheck: result.covarianceCheck,
    factors: result.model.factors.map((f) => ({ factor: f.factor, model: f.label, variance: f.variance, params: f.params, startUp: f.startUp, fallback: f.fallback })),
    correlation: { factors: result.correlation.factors, matrix: result.correlation.matrix, estimator: result.model.correlation.label, repair: result.model.correlation.repair },
    model: { statements: result.model.statements, defaultModel: vol ? (vol.defaultGiven ? "as given" : "EWMA λ = 0.94 (no default= given)") : "not used" },
    excludedPositions: result.excludedPositions,
    sample: result.sample,
    warnings,
    limitations: result.limitations,
    choices: result.choices,
    engineVersion: result.engineVersion,
  });
}

/**
 * The --input CSV of dated figures: its date column (ISO dates, increasing) and the named number columns, in that
 * order; with `atLeast`, fewer rows than that is refused before any row is read.
 */
function readDatedColumns(options: CliOptions, names: string[], atLeast?: { rows: number; what: string }): { dates: string[]; values: number[][] } {
  const flag = "--input";
  const table = readCsv(stringOption(options, "input"), flag);
  const iDate = column(table, "date", flag, true);
  const indexes = names.map((name) => column(table, name, flag, true));
  if (atLeast && table.rows.length < atLeast.rows) throw new CliError(`${flag}: ${atLeast.what} needs at least ${atLeast.rows} rows (date,${names.join(",")}), found ${table.rows.length}`);
  const dates: string[] = [];
  const values: number[][] = names.map(() => []);
  table.rows.forEach((row, r) => {
    dates.push(checkDate(row[iDate], r, flag));
    indexes.forEach((i, k) => values[k].push(parseNumber(row[i], r, names[k])));
  });
  for (let i = 1; i < dates.length; i++) if (dates[i] <= dates[i - 1]) throw new CliError(`${flag}: row ${i + 2}: dates must increase (${dates[i - 1]} then ${dates[i]})`);
  return { dates, values };
}

function backtestCommand(argv: string[]): void {
  const options = parseOptions(argv, ["input", "confidence"], ["json"]);
  const confidence = numberOption(options, "confidence", (v) => v > 0 && v < 1, "a number between 0 and 1, e.g. 0.99") ?? 0.99;
  const {
    dates,
    values: [pnl, vars],
  } = readDatedColumns(options, ["pnl", "var"]);
  vars.forEach((v, r) => {
    if (v < 0) throw new CliError(`--input: row ${r + 2}, column "var": VaR is a positive loss, not ${v}`);
  });
  const r = runBacktest(dates, pnl, vars, confidence);
  printJson({
    days: r.days,
    confidence,
    exceptions: r.exceptions,
    exceptionList: r.exceptionList,
    zone: r.zone,
    plusFactor: r.plusFactor,
    cumulativeProbability: r.trafficLight.cumulativeProbability,
    plusFactorRule: r.trafficLight.plusFactorRule,
    kupiec: { lr: r.kupiec.lr, pValue: r.kupiec.pValue, observedRate: r.kupiec.observedRate, expectedRate: r.kupiec.expectedRate },
    christoffersen: r.christoffersen
      ? { lrInd: r.christoffersen.lrInd, pValueInd: r.christoffersen.pValueInd, lrCc: r.christoffersen.lrCc, pValueCc: r.christoffersen.pValueCc, n00: r.christoffersen.n00, n01: r.christoffersen.n01, n10: r.christoffersen.n10, n11: r.christoffersen.n11 }
      : null,
    exceptionRule: r.exceptionRule,
    warnings: r.warnings,
    limitations: r.limitations,
    engineVersion: ENGINE_VERSION,
  });
}

function capitalCommand(argv: string[]): void {
  const options = parseOptions(argv, ["input", "exceptions", "mc", "ms"], ["json"]);
  const exceptions = numberOption(options, "exceptions", (v) => Number.isInteger(v) && v >= 0 && v <= 250, "a whole number from 0 to 250");
  const mc = numberOption(options, "mc", (v) => v > 0, "a positive multiplier");
  const ms = numberOption(options, "ms", (v) => v > 0, "a positive multiplier");
  const profile = BASEL_CAPITAL_PROFILE;
  const {
    dates,
    values: [vars, svars],
  } = readDatedColumns(options, ["var", "svar"], { rows: profile.averagingDays, what: "capital" });
  const result = capitalCharge({ varHistory: vars, stressedVarHistory: svars, exceptions: exceptions ?? 0, multiplier: mc, stressedMultiplier: ms }, profile);
  const { profile: used, ...terms } = result;
  printJson({
    ...terms,
    tMinus1: dates[dates.length - 1],
    averagedFrom: dates[dates.length - profile.averagingDays],
    exceptions: exceptions ?? null,
    profile: used,
    engineVersion: ENGINE_VERSION,
  });
}

/** Command-line commands of the portfolio engine (var, backtest, capital). */
export const commands: Record<string, (argv: string[]) => void | Promise<void>> = {
  var: varCommand,
  backtest: backtestCommand,
  capital: capitalCommand,
};
