/**
 * A run's stored inputs as one JSON file ("Export inputs" on the run page), and reading such a file back: what
 * `npm run engine -- run --inputs run-inputs.json --json` recomputes from. Pure.
 */
import { inputHashesOf } from "./compare";
import type { RunInputHashes, RunInputs } from "./types";

export const RUN_INPUTS_FORMAT = "ballast.run-inputs.v1";

/** The exported file: the inputs exactly as stored, with the run they belong to and the hashes recorded at its start. */
export interface RunInputsExport {
  format: typeof RUN_INPUTS_FORMAT;
  runId: string;
  periodEnd: string;
  /** the engine version that computed the run's stored results (null while it has not completed) */
  engineVersion: string | null;
  /** the SHA-256 of each input recorded when the run started */
  inputHashes: RunInputHashes | null;
  inputs: RunInputs;
}

/** The export of a run's stored inputs. */
export function runInputsExport(run: { id: string; engineVersion: string | null; inputHashes: RunInputHashes | null }, inputs: RunInputs): RunInputsExport {
  return { format: RUN_INPUTS_FORMAT, runId: run.id, periodEnd: inputs.periodEnd, engineVersion: run.engineVersion, inputHashes: run.inputHashes, inputs };
}

/** The file name of an export, e.g. "run-inputs-2026-11-30-1a2b3c4d.json". */
export function runInputsFileName(periodEnd: string, runId: string): string {
  return `run-inputs-${periodEnd}-${runId.slice(0, 8)}.json`;
}

/**
 * Read an exported file (or bare stored inputs): the inputs, and whether their hashes still match the recorded ones.
 * @throws {RangeError} naming what is missing when the JSON is not a run's inputs
 */
export function readRunInputsExport(value: unknown): { runId: string | null; inputs: RunInputs; recorded: RunInputHashes | null; hashes: RunInputHashes; hashesMatch: boolean | null } {
  if (value === null || typeof value !== "object") throw new RangeError("the file is not a JSON object");
  const v = value as Partial<RunInputsExport> & Partial<RunInputs>;
  const wrapped = v.format !== undefined;
  if (wrapped && v.format !== RUN_INPUTS_FORMAT) throw new RangeError(`unknown format "${String(v.format)}" (expected ${RUN_INPUTS_FORMAT})`);
  const inputs = (wrapped ? v.inputs : v) as RunInputs | undefined;
  for (const key of ["positions", "prices", "method", "capitalProfile", "periodEnd", "reportingCurrency", "context"] as const) {
    if (!inputs || inputs[key] === undefined) throw new RangeError(`the inputs have no "${key}"`);
  }
  const hashes = inputHashesOf(inputs!);
  const recorded = wrapped ? (v.inputHashes ?? null) : null;
  return { runId: wrapped ? (v.runId ?? null) : null, inputs: inputs!, recorded, hashes, hashesMatch: recorded ? recorded.combined === hashes.combined : null };
}
