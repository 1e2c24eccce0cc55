/**
 * Reproduction check: a re-run from stored inputs against the original, figure by figure, with the reasons any
 * figure differs (engine version changed, an input no longer matches its recorded hash). Pure.
 */
import { canonicalJson, hashOf, sha256Hex } from "@/lib/domain/canonical";
import type { FigureDifference, Reproduction, RunInputHashes, RunInputs, RunResults } from "./types";

/** The hash of each stored input, and of all four together. */
export function inputHashesOf(inputs: RunInputs): RunInputHashes {
  const positions = hashOf(inputs.positions);
  const prices = hashOf(inputs.prices);
  const method = hashOf(inputs.method);
  const capitalProfile = hashOf(inputs.capitalProfile);
  const combined = sha256Hex(canonicalJson({ positions, prices, method, capitalProfile, periodEnd: inputs.periodEnd, reportingCurrency: inputs.reportingCurrency }));
  return { positions, prices, method, capitalProfile, combined };
}

const INPUT_NAMES: Record<Exclude<keyof RunInputHashes, "combined">, string> = {
  positions: "positions",
  prices: "price history",
  method: "method statement",
  capitalProfile: "capital rule profile",
};

/** Parts of the results that describe the run rather than compute a figure, left out of the comparison. */
const NOT_FIGURES = new Set(["reproduction", "dataQuality", "inputs.fromStoredInputsOf"]);

type Leaf = number | string | boolean | null;

function leaves(value: unknown, path: string, out: Map<string, Leaf>): void {
  if (NOT_FIGURES.has(path)) return;
  if (value === null || value === undefined) out.set(path, null);
  else if (Array.isArray(value)) {
    out.set(`${path}.length`, value.length);
    value.forEach((v, i) => leaves(v, `${path}[${i}]`, out));
  } else if (typeof value === "object") {
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) leaves(v, path ? `${path}.${k}` : k, out);
  } else out.set(path, value as Leaf);
}

/** Results as they are stored (JSON: NaN and infinities become null), so a fresh result compares like a stored one. */
export function asStored<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}

const MAX_DIFFERENCES = 200;

/** Compare a reproduction with its original. Figures must be identical: the same inputs and engine give the same bits. */
export function compareRuns(
  original: { id: string; results: RunResults; inputHashes: RunInputHashes | null; engineVersion: string | null },
  reproduced: { results: RunResults; inputHashes: RunInputHashes; engineVersion: string },
): Reproduction {
  const a = new Map<string, Leaf>();
  const b = new Map<string, Leaf>();
  leaves(asStored(original.results), "", a);
  leaves(asStored(reproduced.results), "", b);
  const differences: FigureDifference[] = [];
  let count = 0;
  const paths = new Set([...a.keys(), ...b.keys()]);
  for (const path of paths) {
    const x = a.has(path) ? a.get(path)! : null;
    const y = b.has(path) ? b.get(path)! : null;
    if (x !== y || a.has(path) !== b.has(path)) {
      count++;
      if (differences.length < MAX_DIFFERENCES) differences.push({ path, original: a.has(path) ? x : null, reproduced: b.has(path) ? y : null });
    }
  }
  const reasons: string[] = [];
  if (original.engineVersion !== reproduced.engineVersion) reasons.push(`The engine version changed from ${original.engineVersion ?? "unknown"} to ${reproduced.engineVersion}.`);
  let inputHashesMatch = true;
  if (!original.inputHashes) {
    inputHashesMatch = false;
    reasons.push("The original run recorded no input hashes.");
  } else {
    for (const key of Object.keys(INPUT_NAMES) as (keyof typeof INPUT_NAMES)[]) {
      if (original.inputHashes[key] !== reproduced.inputHashes[key]) {
        inputHashesMatch = false;
        reasons.push(`The ${INPUT_NAMES[key]} input differs from the one recorded with the original run (SHA-256 ${original.inputHashes[key].slice(0, 12)}… then, ${reproduced.inputHashes[key].slice(0, 12)}… now).`);
      }
    }
  }
  if (count > 0 && reasons.length === 0) reasons.push("The inputs and the engine version are the same, yet figures differ: report this as a defect.");
  return {
    originalRunId: original.id,
    matches: count === 0,
    compared: a.size,
    differences,
    truncated: count > differences.length,
    reasons,
    originalEngineVersion: original.engineVersion,
    engineVersion: reproduced.engineVersion,
    inputHashesMatch,
  };
}
