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

/** Call an API route and return its JSON, or throw an ApiError carrying the server's message and fields. */
export async function apiFetch<T>(url: string, init?: { method?: string; body?: unknown }): Promise<T> {
  const response = await fetch(url, {
    method: init?.method ?? "GET",
    headers: init?.body !== undefined ? { "content-type": "application/json" } : undefined,
    body: init?.body !== undefined ? JSON.stringify(init.body) : undefined,
  });
  const data = await response.json().catch(() => null);
  if (!response.ok) {
    const error = data?.error;
    throw new ApiError(error?.message ?? `Request failed (${response.status}).`, response.status, error?.code ?? "unknown", error?.fields);
  }
  return data as T;
}
