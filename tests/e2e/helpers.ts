import { request as playwrightRequest, type APIRequestContext, type Page, expect } from "@playwright/test";
import { readFileSync } from "node:fs";
import { createClient } from "@libsql/client";
import { DEMO_PASSWORD, DEMO_USERS, SECOND_FIRM_USERS } from "@/db/seed";

export const BASE_URL = `http://localhost:${process.env.E2E_PORT ?? 3100}`;
export { DEMO_PASSWORD, DEMO_USERS, SECOND_FIRM_USERS };

/** Fill and send the sign-in form, as a person would (the answer may be a refusal). */
export async function submitSignIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

/** Sign in through the page and wait until the signed-in home is shown. */
export async function signInThroughPage(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await submitSignIn(page, email, password);
  await expect(page).toHaveURL(/\/home$/);
}

/** The sign-in form's own message (Next.js keeps an empty route announcer with the same role). */
export const signInError = (page: Page) => page.locator("#sign-in-error");

/** An API client signed in as `email` through Auth.js's credentials endpoint (CSRF token first). */
export async function signedInApi(email: string | null, password = DEMO_PASSWORD): Promise<APIRequestContext> {
  const api = await playwrightRequest.newContext({ baseURL: BASE_URL });
  if (!email) return api;
  const { csrfToken } = await (await api.get("/api/auth/csrf")).json();
  const response = await api.post("/api/auth/callback/credentials", {
    form: { csrfToken, email, password, callbackUrl: `${BASE_URL}/home` },
    maxRedirects: 0,
  });
  expect([200, 302]).toContain(response.status());
  const session = await (await api.get("/api/auth/session")).json();
  expect(session?.user?.email, `signed in as ${email}`).toBe(email);
  return api;
}

/** A CSV file as the upload button takes it. */
export const csv = (name: string, text: string) => ({ name, mimeType: "text/csv", buffer: Buffer.from(text) });

/** A demo firm's file from templates/demo/, as text. */
export const demoFile = (name: string) => readFileSync(`templates/demo/${name}`, "utf8");

/**
 * Northmoor's demo November book with its first position resized by `by` units and that position's market value
 * scaled with it (its own ratio of value to quantity × price kept), so that the file's SHA-256 is new; with the
 * number of positions it holds.
 */
export function resizedDemoBook(by: number): { text: string; positions: number } {
  const lines = demoFile("northmoor-positions-2026-11.csv").trimEnd().split("\n");
  const [head, first, ...rest] = lines;
  const cells = first.split(",");
  const quantity = Number(cells[6]) + by;
  cells[6] = String(quantity);
  cells[8] = (quantity * Number(cells[7]) * (Number(cells[8]) / ((quantity - by) * Number(cells[7])))).toFixed(2);
  return { text: [head, cells.join(","), ...rest].join("\n") + "\n", positions: lines.length - 1 };
}

/** The id of the signed-in firm's reporting period ending `periodEnd` (YYYY-MM-DD). */
export async function periodIdEnding(api: APIRequestContext, periodEnd: string): Promise<string> {
  const periods = (await (await api.get("/api/periods")).json()).periods as { id: string; periodEnd: string }[];
  return periods.find((p) => p.periodEnd === periodEnd)!.id;
}

/**
 * A positions file moved to another as-of date: its dates replaced and its market values left empty, so that Ballast
 * computes them from quantity × price × that date's rate (the file's own values are of its original date, and a
 * market value that disagrees with quantity × price × rate is refused).
 */
export function bookDatedTo(text: string, from: string, to: string): string {
  const [head, ...rows] = text.trimEnd().split("\n");
  const at = head.split(",").indexOf("market_value");
  const moved = rows.map((row) => {
    const cells = row.split(",");
    if (cells[0] === from) cells[0] = to;
    if (at >= 0) cells[at] = "";
    return cells.join(",");
  });
  return [head, ...moved].join("\n") + "\n";
}

/**
 * Written on their own schedule, not by the request under test: the job queue the worker works through, and what it
 * computes once and stores for reading (the data-quality report, rendered packs), which a page view may also store.
 */
const WORKER_TABLES = ["jobs", "data_quality_reports", "pack_files"];

/** Every stored row but sign-in attempts and the worker's tables, as one string (to show a request changed nothing). */
export async function databaseSnapshot(options: { ignore?: string[] } = {}): Promise<string> {
  const client = createClient({ url: `file:./${process.env.E2E_DB_FILE ?? "data/e2e.db"}` });
  try {
    const tables = await client.execute(
      `SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE '__drizzle%' AND name <> 'sign_in_attempts' AND name NOT IN (${WORKER_TABLES.map((t) => `'${t}'`).join(", ")}) ORDER BY name`,
    );
    const out: Record<string, unknown[]> = {};
    for (const { name } of tables.rows) {
      if (options.ignore?.includes(String(name))) continue;
      out[String(name)] = (await client.execute(`SELECT * FROM "${String(name)}" ORDER BY rowid`)).rows.map((r) => ({ ...r }));
    }
    return JSON.stringify(out);
  } finally {
    client.close();
  }
}

/** Wait, polling the run API, until a run has completed (the worker computes it). */
export async function runCompletes(api: APIRequestContext, runId: string, timeout = 180_000): Promise<void> {
  await expect.poll(async () => (await (await api.get(`/api/runs/${runId}`)).json()).run.status, { timeout, intervals: [500, 1000, 2000] }).toBe("completed");
}

/** Start a run of a period through the API (leaving out factors short of history), wait until it completes; its id. */
export async function completedRunOf(api: APIRequestContext, periodId: string, timeout = 180_000): Promise<string> {
  const started = await api.post(`/api/periods/${periodId}/runs`, { data: { excludeShortHistory: true } });
  expect(started.status(), await started.text()).toBe(202);
  const runId = (await started.json()).run.id as string;
  await runCompletes(api, runId, timeout);
  return runId;
}
