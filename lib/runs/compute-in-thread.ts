/**
 * computeRun in a thread of its own (lib/threads/run-in-thread.ts): a large book's long steps no longer stop the job
 * worker's heartbeat, so its lease is not taken as lost while it computes. For the job worker only.
 */
import path from "node:path";
import { runInThread } from "../threads/run-in-thread";
import type { ComputeContext, RunProgress } from "./compute";
import type { RunInputs, RunResults } from "./types";

/** Compute a run in a thread; each stage goes to `onProgress` (awaited, in order); aborting `signal` stops it. */
export function computeInThread(inputs: RunInputs, context: ComputeContext, onProgress?: RunProgress, signal?: AbortSignal): Promise<RunResults> {
  return runInThread<RunResults>(path.join(__dirname, "compute-thread.ts"), { inputs, context }, (m) => onProgress?.(m.stage as string, m.fraction as number), signal);
}
