/**
 * Command-line command that recomputes a stored run outside the app:
 *   run --inputs run-inputs.json --json
 * The file is a run page's "Export inputs" download (or bare stored inputs). Prints the run's results exactly as the
 * app stores them, with the input hashes recomputed and compared with the ones recorded when the run started.
 * Bad input exits 1 with one line naming the problem.
 */
import { existsSync, readFileSync } from "node:fs";
import { CliError, parseOptions, printJson } from "./io";
import { DRAFT_CAUTION } from "../domain/caution";
import { ENGINE_VERSION } from "../risk/version";
import { asStored } from "../runs/compare";
import { computeRun } from "../runs/compute";
import { readRunInputsExport } from "../runs/export";

async function run(argv: string[]): Promise<void> {
  const options = parseOptions(argv, ["inputs"], ["json"]);
  const path = options.inputs;
  if (typeof path !== "string") throw new CliError("missing --inputs run-inputs.json (the run page's Export inputs download)");
  if (!existsSync(path)) throw new CliError(`--inputs: file not found: ${path}`);
  let json: unknown;
  try {
    json = JSON.parse(readFileSync(path, "utf8").replace(/^\uFEFF/, ""));
  } catch (error) {
    throw new CliError(`--inputs: ${path} is not JSON (${error instanceof Error ? error.message : String(error)})`);
  }
  let read: ReturnType<typeof readRunInputsExport>;
  try {
    read = readRunInputsExport(json);
  } catch (error) {
    throw new CliError(`--inputs: ${path}: ${error instanceof Error ? error.message : String(error)}`);
  }
  // the same computation as the app's run, on exactly the stored inputs; stored as the app stores it (JSON)
  const results = asStored(await computeRun(read.inputs, { fromStoredInputsOf: null }));
  printJson({
    runId: read.runId,
    engineVersion: ENGINE_VERSION,
    inputHashes: read.hashes,
    inputHashesMatchRecorded: read.hashesMatch,
    results,
    caution: DRAFT_CAUTION,
  });
}

export const commands: Record<string, (argv: string[]) => Promise<void>> = { run };
