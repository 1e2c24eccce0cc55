/**
 * The thread a worker parses a large file in (started by parse-in-thread.ts): one file per thread, progress posted
 * back every PROGRESS_EVERY rows, then the parse result (or the error's message).
 */
import { parentPort, workerData } from "node:worker_threads";
import { parseFile, type ParseFileContext, type UploadKind } from "./parse-file";
import type { ReadOptions } from "./types";

const input = workerData as { bytes: Uint8Array; kind: UploadKind; options: ReadOptions; context: ParseFileContext };
parseFile(input.bytes, input.kind, input.options, input.context, (done, total) => parentPort!.postMessage({ type: "progress", done, total }))
  .then((value) => parentPort!.postMessage({ type: "done", value }))
  .catch((error: unknown) => parentPort!.postMessage({ type: "error", message: error instanceof Error ? error.message : String(error) }));
