/**
 * parseFile in a thread of its own (node:worker_threads), so that the job worker's event loop keeps its lease
 * alive and reports progress while a large file is checked. For the job worker only (it runs under tsx, which the
 * thread loads too); the web tier never parses.
 */
import { Worker } from "node:worker_threads";
import path from "node:path";
import type { ParsedUpload, ParseFileContext, UploadKind } from "./parse-file";
import type { ParseProgress, ReadOptions } from "./types";

/** Parse in a thread; `onProgress` is told of progress; aborting `signal` stops the thread. */
export function parseInThread(bytes: Uint8Array, kind: UploadKind, options: ReadOptions, context: ParseFileContext, onProgress?: ParseProgress, signal?: AbortSignal): Promise<ParsedUpload> {
  return new Promise((resolve, reject) => {
    // The thread loads the TypeScript entry through tsx's own register call (an --import flag is not applied to it).
    const entry = JSON.stringify(path.join(__dirname, "parse-thread.ts"));
    const thread = new Worker(`require("tsx/cjs/api").register(); require(${entry});`, { eval: true, workerData: { bytes, kind, options, context } });
    let settled = false;
    const settle = (finish: () => void) => {
      if (settled) return;
      settled = true;
      signal?.removeEventListener("abort", onAbort);
      finish();
      void thread.terminate();
    };
    const onAbort = () => settle(() => reject(new Error("Stopped: the worker no longer holds this job.")));
    signal?.addEventListener("abort", onAbort);
    thread.on("message", (message: { type: "progress"; done: number; total: number } | { type: "done"; parsed: ParsedUpload } | { type: "error"; message: string }) => {
      if (message.type === "progress") onProgress?.(message.done, message.total);
      else if (message.type === "done") settle(() => resolve(message.parsed));
      else settle(() => reject(new Error(message.message)));
    });
    thread.on("error", (error) => settle(() => reject(error)));
    thread.on("exit", (code) => settle(() => reject(new Error(`The file-reading thread stopped (exit code ${code}).`))));
  });
}
