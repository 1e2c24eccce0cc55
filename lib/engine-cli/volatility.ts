/**
 * Command-line commands of the volatility engine:
 *   fit --model ma|arch|ewma|garch --input FILE.csv [options] --json
 *   compare --input FILE.csv [options] --json
 */
import { CliError, parseOptions, printJson, readCsv, readNumericColumn, type CliOptions } from "./io";
import { annualisedVolatilityTermStructure, compareEstimators, logReturns, simpleReturns, type InitRule } from "../risk";
import { fitProcess, forecastFit, hasTermStructure } from "../risk/process/registry";
import type { ProcessFit, VolatilitySpec } from "../risk/process/types";

const INPUT_OPTIONS = ["input", "column", "input-kind", "returns"];
const FIT_OPTIONS = [...INPUT_OPTIONS, "model", "window", "divisor", "mean", "lambda", "order", "dist", "init", "horizon", "fallback", "days-per-year"];
const COMPARE_OPTIONS = [...INPUT_OPTIONS, "estimation", "evaluation"];

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/**
 * A "date" column, where there is one, must name each row once, and ISO dates (yyyy-mm-dd) must increase: otherwise
 * the last row would not be the latest day and "today's" variance would be another day's. Errors name the row.
 */
export function checkDates(table: { header: string[]; rows: string[][] }): void {
  const i = table.header.findIndex((h) => h.toLowerCase() === "date");
  if (i < 0) return;
  const seen = new Map<string, number>();
  const cells = table.rows.map((row) => (row[i] ?? "").trim());
  const iso = cells.every((d) => ISO_DATE.test(d));
  cells.forEach((d, r) => {
    const first = seen.get(d);
    if (first !== undefined) throw new CliError(`--input: row ${r + 2}, column "${table.header[i]}": the date ${d} appears twice (first at row ${first})`);
    seen.set(d, r + 2);
    if (iso && r > 0 && d < cells[r - 1]) throw new CliError(`--input: row ${r + 2}, column "${table.header[i]}": dates must increase (${cells[r - 1]} then ${d}); sort the file oldest first`);
  });
}

/** Read the input file and turn it into returns as the options say; errors name the row. */
function readReturns(options: CliOptions): { returns: number[]; column: string; kind: "returns" | "prices" } {
  const file = options.input === true ? undefined : options.input;
  const table = readCsv(file);
  const col = readNumericColumn(table, typeof options.column === "string" ? options.column : undefined);
  checkDates(table);
  const kind = (options["input-kind"] ?? "returns") as string;
  if (kind !== "returns" && kind !== "prices") throw new CliError(`--input-kind must be returns or prices, not "${kind}"`);
  const returnsKind = (options.returns ?? "log") as string;
  if (returnsKind !== "log" && returnsKind !== "simple") throw new CliError(`--returns must be log or simple, not "${returnsKind}"`);
  if (kind === "returns") return { returns: col.values, column: col.name, kind };
  col.values.forEach((p, i) => {
    if (!(p > 0)) throw new CliError(`row ${col.fileRows[i]}, column "${col.name}": price ${p} is not positive`);
  });
  if (col.values.length < 2) throw new CliError(`--input: at least 2 prices are needed, found ${col.values.length}`);
  return { returns: returnsKind === "simple" ? simpleReturns(col.values) : logReturns(col.values), column: col.name, kind };
}

function intOption(options: CliOptions, name: string, fallback: number, min: number): number {
  const raw = options[name];
  if (raw === undefined) return fallback;
  const v = Number(raw);
  if (!(Number.isInteger(v) && v >= min)) throw new CliError(`--${name} must be an integer of at least ${min}, not "${raw}"`);
  return v;
}

function choice<T extends string>(options: CliOptions, name: string, allowed: readonly T[], fallback: T): T {
  const raw = options[name];
  if (raw === undefined) return fallback;
  if (!allowed.includes(raw as T)) throw new CliError(`--${name} must be one of ${allowed.join("|")}, not "${raw}"`);
  return raw as T;
}

/** --init: sample | backcast | unconditional | first-K | a positive number (the first day's variance). */
function initOption(options: CliOptions): InitRule | undefined {
  const raw = options.init;
  if (raw === undefined || raw === true) return undefined;
  if (raw === "sample" || raw === "backcast" || raw === "unconditional") return raw;
  const first = /^first-(\d+)$/.exec(raw);
  if (first) return { firstReturns: Number(first[1]) };
  const v = Number(raw);
  if (Number.isFinite(v) && v > 0) return v;
  throw new CliError(`--init must be sample, backcast, unconditional, first-K or a positive variance, not "${raw}"`);
}

/** The volatility spec a command line asks for (the engine's stated defaults where an option is absent). */
export function specOf(options: CliOptions): VolatilitySpec {
  const model = choice(options, "model", ["ma", "arch", "ewma", "garch"] as const, "garch");
  const init = initOption(options);
  const noTargeting = (): void => { if (options.targeting) throw new CliError(`--targeting applies to --model garch only`); };
  switch (model) {
    case "ma": {
      noTargeting();
      if (init !== undefined) throw new CliError("--init does not apply to --model ma (it needs a full window)");
      return { kind: "ma", window: intOption(options, "window", 20, 2), divisor: choice(options, "divisor", ["m", "m-1"] as const, "m"), mean: choice(options, "mean", ["zero", "sample"] as const, "zero") };
    }
    case "ewma": {
      noTargeting();
      choice(options, "mean", ["zero"] as const, "zero");
      const raw = options.lambda;
      let lambda = 0.94;
      let fit = false;
      if (raw === "fit") fit = true;
      else if (raw !== undefined) {
        lambda = Number(raw);
        if (!(lambda > 0 && lambda < 1)) throw new CliError(`--lambda must be fit or a number between 0 and 1, not "${raw}"`);
      }
      if (init === "unconditional") throw new CliError("--init unconditional does not apply to EWMA (it has no long-run variance)");
      return { kind: "ewma", lambda, fit, ...(init !== undefined ? { init } : {}) };
    }
    case "arch": {
      noTargeting();
      choice(options, "mean", ["zero"] as const, "zero");
      if (typeof init === "number" || init === "unconditional") throw new CliError("--init for ARCH must be sample, backcast or first-K");
      return { kind: "arch", order: intOption(options, "order", 1, 1), ...(init !== undefined ? { init } : {}) };
    }
    case "garch":
      return {
        kind: "garch",
        mean: choice(options, "mean", ["zero", "fit"] as const, "zero"),
        distribution: choice(options, "dist", ["normal", "t"] as const, "normal"),
        targeting: options.targeting === true,
        fallback: choice(options, "fallback", ["none", "ewma"] as const, "none"),
        ...(init !== undefined ? { init } : {}),
      };
  }
}

/** Run the fit a command line asks for, through the engine's one registry of volatility processes. */
export function runFit(returns: readonly number[], options: CliOptions): ProcessFit {
  const spec = specOf(options);
  try {
    return fitProcess(returns, spec);
  } catch (error) {
    if (error instanceof CliError) throw error;
    // the engine's own wording (e.g. "fitGarch11 requires at least 100 returns"), as one line
    throw new CliError(`--model ${spec.kind}: ${(error as Error).message}`);
  }
}

/** `fit`: fit one estimator and print its parameters, forecasts, warnings and limitations. */
function fitCommand(argv: string[]): void {
  const options = parseOptions(argv, FIT_OPTIONS, ["json", "targeting"]);
  if (options.model === undefined) throw new CliError("missing --model ma|arch|ewma|garch");
  const { returns, column, kind } = readReturns(options);
  const pf = runFit(returns, options);
  const fit = pf.fit;
  const horizon = intOption(options, "horizon", 10, 1);
  const daysPerYear = intOption(options, "days-per-year", 252, 1);
  if (daysPerYear !== 252 && daysPerYear !== 250) throw new CliError("--days-per-year must be 252 or 250");
  const forecast = forecastFit(pf, horizon);
  const out = {
    model: options.model,
    fittedModel: fit.kind,
    label: pf.label,
    engineVersion: fit.engineVersion,
    input: { file: options.input, column, kind, returns: kind === "prices" ? (options.returns ?? "log") : "as given" },
    n: returns.length,
    params: fit.params,
    standardErrors: fit.standardErrors ?? null,
    robustStandardErrors: fit.robustStandardErrors ?? null,
    logLikelihood: fit.logLikelihood,
    variance: fit.currentVariance,
    volatility: Math.sqrt(fit.currentVariance),
    longRunVariance: fit.longRunVariance,
    horizonDays: horizon,
    forecast: Array.from(forecast),
    forecastShape: hasTermStructure(pf.used) ? "reverts towards the long-run variance" : "flat: today's variance for every day",
    annualisedVolatility: { daysPerYear, byHorizon: Array.from(annualisedVolatilityTermStructure(forecast, daysPerYear as 252 | 250)) },
    initialization: fit.initialization,
    diagnostics: fit.diagnostics,
    fallbackFrom: fit.fallbackFrom ?? null,
    warnings: fit.warnings,
    limitations: fit.limitations,
  };
  if (options.json) return printJson(out);
  const lines = [
    `${fit.kind} on ${returns.length} returns (${column})`,
    `params: ${Object.entries(fit.params).map(([k, v]) => `${k}=${v.toPrecision(6)}`).join(" ")}`,
    `log-likelihood: ${fit.logLikelihood ?? "n/a"}`,
    `next-day variance: ${fit.currentVariance.toPrecision(6)} (volatility ${Math.sqrt(fit.currentVariance).toPrecision(6)})`,
    ...fit.warnings.map((w) => `warning: ${w.message}`),
  ];
  process.stdout.write(lines.join("\n") + "\n");
}

/** `compare`: fit each estimator on an estimation window and score its one-day forecasts over the evaluation window. */
function compareCommand(argv: string[]): void {
  const options = parseOptions(argv, COMPARE_OPTIONS, ["json"]);
  const { returns, column } = readReturns(options);
  const evaluationDays = options.evaluation === undefined ? undefined : intOption(options, "evaluation", 250, 20);
  const estimationDays = options.estimation === undefined ? undefined : intOption(options, "estimation", 1000, 100);
  let result;
  try {
    result = compareEstimators(returns, { estimationDays, evaluationDays });
  } catch (error) {
    throw new CliError(`compare: ${(error as Error).message}`);
  }
  if (options.json) return printJson({ input: { file: options.input, column }, ...result });
  process.stdout.write(result.ranking.map((r, i) => `${i + 1}. ${r.label}: QLIKE ${r.qlike.toFixed(4)}, MSE ${r.mse.toPrecision(4)}, exceptions ${r.varExceptions}`).join("\n") + "\n" + result.reading + "\n");
}

/** Command-line commands of the volatility engine (fit, compare). */
export const commands: Record<string, (argv: string[]) => void | Promise<void>> = {
  fit: fitCommand,
  compare: compareCommand,
};
