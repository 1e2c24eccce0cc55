/**
 * The thread a worker computes a run in (started by compute-in-thread.ts): the run's stages posted back as they go,
 * then the results (or the error's message).
 */
import { parentPort, workerData } from "node:worker_threads";
import { computeRun, type ComputeContext } from "./compute";
import type { RunInputs } from "./types";

const input = workerData as { inputs: RunInputs; context: ComputeContext };
computeRun(input.inputs, input.context, (stage, fraction) => parentPort!.postMessage({ type: "progress", stage, fraction }))
  .then((value) => parentPort!.postMessage({ type: "done", value }))
  .catch((error: unknown) => parentPort!.postMessage({ type: "error", message: error instanceof Error ? error.message : String(error) }));
