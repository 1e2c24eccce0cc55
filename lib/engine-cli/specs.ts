/**
 * The command line's volatility and correlation choices:
 *   --vol SPECS: comma-separated FACTOR=MODEL items, `default=MODEL` for the rest; MODEL is ma:M, ewma:L, ewma:fit,
 *     arch:M, garch or garch-t (zero mean, each with the engine's stated default start-up, as `engine fit` uses)
 *   --corr SPEC: equal:N, ewma:L or ccc
 */
import { CliError } from "./io";
import type { CorrelationSpec, VolatilityChoice, VolatilitySpec } from "../risk/process/types";

const MODELS = "ma:M, ewma:L, ewma:fit, arch:M, garch or garch-t";

/** One MODEL of --vol. @throws {CliError} naming the item */
export function parseModel(raw: string, item: string): VolatilitySpec {
  const m = raw.trim();
  const bad = (why: string): never => { throw new CliError(`--vol: "${item}": ${why}`); };
  if (m === "garch") return { kind: "garch" };
  if (m === "garch-t") return { kind: "garch", distribution: "t" };
  const [kind, arg, ...rest] = m.split(":");
  if (rest.length || arg === undefined) return bad(`the model must be one of ${MODELS}, not "${m}"`);
  if (kind === "ma" || kind === "arch") {
    const v = Number(arg);
    if (kind === "ma" && !(Number.isInteger(v) && v >= 2)) return bad(`the moving-average window must be a whole number of days of at least 2, not "${arg}"`);
    if (kind === "arch" && !(Number.isInteger(v) && v >= 1 && v <= 30)) return bad(`the ARCH order must be a whole number from 1 to 30, not "${arg}"`);
    return kind === "ma" ? { kind: "ma", window: v } : { kind: "arch", order: v };
  }
  if (kind === "ewma") {
    if (arg === "fit") return { kind: "ewma", lambda: 0.94, fit: true };
    const v = Number(arg);
    if (!(v > 0 && v < 1)) return bad(`λ must be fit or a number between 0 and 1, not "${arg}"`);
    return { kind: "ewma", lambda: v };
  }
  return bad(`the model must be one of ${MODELS}, not "${m}"`);
}

/**
 * --vol SPECS. Factors not named take `default` (EWMA λ = 0.94 when no default is given, stated by the caller).
 * @param factors the factors of the price file, to refuse a name that is not there
 */
export function parseVolSpecs(raw: string, factors: ReadonlySet<string>): { choice: VolatilityChoice; defaultGiven: boolean } {
  const byFactor: Record<string, VolatilitySpec> = {};
  let def: VolatilitySpec | null = null;
  const items = raw.split(",").map((s) => s.trim()).filter(Boolean);
  if (items.length === 0) throw new CliError(`--vol needs FACTOR=MODEL items (MODEL one of ${MODELS})`);
  for (const item of items) {
    const eq = item.lastIndexOf("=");
    if (eq <= 0) throw new CliError(`--vol: "${item}" is not FACTOR=MODEL (use default=MODEL for the factors not named)`);
    const name = item.slice(0, eq).trim();
    const spec = parseModel(item.slice(eq + 1), item);
    if (name === "default") {
      if (def) throw new CliError(`--vol: default is given twice`);
      def = spec;
      continue;
    }
    if (!factors.has(name)) throw new CliError(`--vol: "${item}": no factor "${name}" in --prices (factors: ${[...factors].slice(0, 10).join(", ")}${factors.size > 10 ? ", …" : ""})`);
    if (byFactor[name]) throw new CliError(`--vol: factor "${name}" is given twice`);
    byFactor[name] = spec;
  }
  return { choice: { default: def ?? { kind: "ewma", lambda: 0.94 }, byFactor }, defaultGiven: def !== null };
}

/** --corr SPEC. @throws {CliError} */
export function parseCorrelation(raw: string): CorrelationSpec {
  const m = raw.trim();
  if (m === "ccc") return { kind: "ccc" };
  const [kind, arg, ...rest] = m.split(":");
  if (!rest.length && arg !== undefined) {
    const v = Number(arg);
    if (kind === "equal") {
      if (!(Number.isInteger(v) && v >= 2)) throw new CliError(`--corr: the equal-weight window must be a whole number of days of at least 2, not "${arg}"`);
      return { kind: "equal", window: v };
    }
    if (kind === "ewma") {
      if (!(v > 0 && v < 1)) throw new CliError(`--corr: λ must be a number between 0 and 1, not "${arg}"`);
      return { kind: "ewma", lambda: v };
    }
  }
  throw new CliError(`--corr must be equal:N, ewma:L or ccc, not "${m}"`);
}
