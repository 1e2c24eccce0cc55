/**
 * parseFile in a thread of its own (lib/threads/run-in-thread.ts), so that the job worker's event loop keeps its
 * lease alive and reports progress while a large file is checked. For the job worker only; the web tier never parses.
 */
import path from "node:path";
import { runInThread } from "../threads/run-in-thread";
import type { ParsedUpload, ParseFileContext, UploadKind } from "./parse-file";
import type { ParseProgress, ReadOptions } from "./types";

/** Parse in a thread; `onProgress` is told of progress; aborting `signal` stops the thread. */
export function parseInThread(bytes: Uint8Array, kind: UploadKind, options: ReadOptions, context: ParseFileContext, onProgress?: ParseProgress, signal?: AbortSignal): Promise<ParsedUpload> {
  return runInThread<ParsedUpload>(path.join(__dirname, "parse-thread.ts"), { bytes, kind, options, context }, (m) => onProgress?.(m.done as number, m.total as number), signal);
}
