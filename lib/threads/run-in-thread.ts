/**
 * Run a TypeScript module in a thread of its own (node:worker_threads), so that a job worker's event loop keeps its
 * lease alive while the thread computes. The module reads `workerData`, posts `{ type: "progress", … }` messages as it
 * goes and ends with `{ type: "done", value }` or `{ type: "error", message }`. The thread loads TypeScript through
 * tsx's register call (an --import flag is not applied to it); for the job worker, which runs under tsx too.
 */
import { Worker } from "node:worker_threads";

/** A message the thread posts while it works. */
export type ThreadProgress = { type: "progress" } & Record<string, unknown>;

/** Start `entry` with `data`; `onProgress` is called in order and awaited before the next; aborting `signal` stops the thread. */
export function runInThread<T>(entry: string, data: unknown, onProgress?: (message: ThreadProgress) => void | Promise<void>, signal?: AbortSignal): Promise<T> {
  return new Promise((resolve, reject) => {
    const thread = new Worker(`require("tsx/cjs/api").register(); require(${JSON.stringify(entry)});`, { eval: true, workerData: data });
    let settled = false;
    let chain: Promise<void> = Promise.resolve();
    const settle = (finish: () => void) => {
      if (settled) return;
      settled = true;
      signal?.removeEventListener("abort", onAbort);
      finish();
      void thread.terminate();
    };
    const onAbort = () => settle(() => reject(new Error("Stopped: the worker no longer holds this job.")));
    if (signal?.aborted) return onAbort();
    signal?.addEventListener("abort", onAbort);
    thread.on("message", (message: ThreadProgress | { type: "done"; value: T } | { type: "error"; message: string }) => {
      if (message.type === "progress") {
        chain = chain.then(() => onProgress?.(message)).catch((error: unknown) => settle(() => reject(error)));
      } else if (message.type === "done") {
        void chain.then(() => settle(() => resolve(message.value)));
      } else {
        void chain.then(() => settle(() => reject(new Error(message.message))));
      }
    });
    thread.on("error", (error) => settle(() => reject(error)));
    thread.on("exit", (code) => void chain.then(() => settle(() => reject(new Error(`The thread stopped (exit code ${code}).`)))));
  });
}
