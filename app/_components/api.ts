/** Client-side JSON calls to Ballast's API routes, surfacing the shared error shape. */
import type { FieldErrors } from "@/lib/errors";

export class ApiError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly code: string,
    readonly fields?: FieldErrors,
  ) {
    super(message);
  }
}

// The last answer to a GET per address, with its ETag, in this tab's memory only (answers say no-store, so the
// browser keeps none): a poll whose answer did not change gets 304 and this body back.
const lastAnswers = new Map<string, { etag: string; data: unknown }>();

/** Call an API route and return its JSON, or throw an ApiError carrying the server's message and fields. */
export async function apiFetch<T>(url: string, init?: { method?: string; body?: unknown }): Promise<T> {
  const method = init?.method ?? "GET";
  const headers: Record<string, string> = {};
  if (init?.body !== undefined) headers["content-type"] = "application/json";
  const last = method === "GET" ? lastAnswers.get(url) : undefined;
  if (last) headers["if-none-match"] = last.etag;
  const response = await fetch(url, { method, headers, body: init?.body !== undefined ? JSON.stringify(init.body) : undefined });
  if (response.status === 304 && last) return last.data as T;
  const data = await response.json().catch(() => null);
  const etag = response.headers.get("etag");
  if (method === "GET" && response.ok && etag) {
    lastAnswers.delete(url);
    lastAnswers.set(url, { etag, data });
    while (lastAnswers.size > 50) lastAnswers.delete(lastAnswers.keys().next().value!);
  }
  if (!response.ok) {
    const error = data?.error;
    throw new ApiError(error?.message ?? `Request failed (${response.status}).`, response.status, error?.code ?? "unknown", error?.fields);
  }
  return data as T;
}
