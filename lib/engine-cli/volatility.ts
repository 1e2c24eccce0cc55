/**
 * Command-line commands of the volatility engine:
 *   fit --model ma|arch|ewma|garch --input FILE.csv [options] --json
 *   compare --input FILE.csv [options] --json
 */
import { CliError, parseOptions, printJson, readCsv, readNumericColumn, type CliOptions } from "./io";
import {
  annualisedVolatilityTermStructure,
  compareEstimators,
  fitArch,
  fitEwma,
  fitGarch11,
  fitMovingAverage,
  forecastVariance,
  logReturns,
  simpleReturns,
  type InitRule,
  type VolatilityFit,
} from "../risk";

const INPUT_OPTIONS = ["input", "column", "input-kind", "returns"];
const FIT_OPTIONS = [...INPUT_OPTIONS, "model", "window", "divisor", "mean", "lambda", "order", "dist", "init", "horizon", "fallback", "days-per-year"];
const COMPARE_OPTIONS = [...INPUT_OPTIONS, "estimation", "evaluation"];

/** Read the input file and turn it into returns as the options say; errors name the row. */
function readReturns(options: CliOptions): { returns: number[]; column: string; kind: "returns" | "prices" } {
  const file = options.input === true ? undefined : options.input;
  const table = readCsv(file);
  const col = readNumericColumn(table, typeof options.column === "string" ? options.column : undefined);
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

/** Run the fit a command line asks for. */
export function runFit(returns: readonly number[], options: CliOptions): VolatilityFit {
  const model = choice(options, "model", ["ma", "arch", "ewma", "garch"] as const, "garch");
  const init = initOption(options);
  const noTargeting = (): void => { if (options.targeting) throw new CliError(`--targeting applies to --model garch only`); };
  try {
    switch (model) {
      case "ma": {
        noTargeting();
        if (init !== undefined) throw new CliError("--init does not apply to --model ma (it needs a full window)");
        return fitMovingAverage(returns, {
          window: intOption(options, "window", 20, 2),
          divisor: choice(options, "divisor", ["m", "m-1"] as const, "m"),
          mean: choice(options, "mean", ["zero", "sample"] as const, "zero"),
        });
      }
      case "ewma": {
        noTargeting();
        choice(options, "mean", ["zero"] as const, "zero");
        const raw = options.lambda;
        let lambda: number | "fit" = 0.94;
        if (raw === "fit") lambda = "fit";
        else if (raw !== undefined) {
          lambda = Number(raw);
          if (!(lambda > 0 && lambda < 1)) throw new CliError(`--lambda must be fit or a number between 0 and 1, not "${raw}"`);
        }
        if (init === "unconditional") throw new CliError("--init unconditional does not apply to EWMA (it has no long-run variance)");
        return fitEwma(returns, { lambda, init });
      }
      case "arch": {
        noTargeting();
        choice(options, "mean", ["zero"] as const, "zero");
        if (typeof init === "number" || init === "unconditional") throw new CliError("--init for ARCH must be sample, backcast or first-K");
        return fitArch(returns, { order: intOption(options, "order", 1, 1), init });
      }
      case "garch":
        return fitGarch11(returns, {
          mean: choice(options, "mean", ["zero", "fit"] as const, "zero"),
          distribution: choice(options, "dist", ["normal", "t"] as const, "normal"),
          targeting: options.targeting === true,
          init,
          fallback: choice(options, "fallback", ["none", "ewma"] as const, "none"),
        });
    }
  } catch (error) {
    if (error instanceof CliError) throw error;
    // the engine's own wording (e.g. "fitGarch11 requires at least 100 returns"), as one line
    throw new CliError(`--model ${model}: ${(error as Error).message}`);
  }
}

/** `fit`: fit one estimator and print its parameters, forecasts, warnings and limitations. */
function fitCommand(argv: string[]): void {
  const options = parseOptions(argv, FIT_OPTIONS, ["json", "targeting"]);
  if (options.model === undefined) throw new CliError("missing --model ma|arch|ewma|garch");
  const { returns, column, kind } = readReturns(options);
  const fit = runFit(returns, options);
  const horizon = intOption(options, "horizon", 10, 1);
  const daysPerYear = intOption(options, "days-per-year", 252, 1);
  if (daysPerYear !== 252 && daysPerYear !== 250) throw new CliError("--days-per-year must be 252 or 250");
  const forecast = forecastVariance(fit, horizon);
  const out = {
    model: options.model,
    fittedModel: fit.kind,
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
    forecastShape: fit.kind === "garch" || fit.kind === "arch" ? "reverts towards the long-run variance" : "flat: today's variance for every day",
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
