import { test, expect } from "@playwright/test";
import { readFileSync } from "node:fs";
import { createClient } from "@libsql/client";
import { databaseSnapshot, DEMO_USERS, signedInApi } from "./helpers";

/**
 * The malformed-request corpus (tests/fixtures/bad-input/requests.json): each payload gets its status, the
 * shared error shape and a message naming the field, and the database is unchanged after each — compared table by
 * table (sign-in attempts aside: signing the test's personas in writes them before the corpus starts).
 */
const corpus = JSON.parse(readFileSync("tests/fixtures/bad-input/requests.json", "utf8")) as {
  cases: {
    as: "admin" | "officer";
    method: string;
    path: string;
    body?: unknown;
    raw?: string;
    /** the Content-Type sent (application/json when a body or raw text is given and this is not) */
    contentType?: string;
    /** send a JSON string body of this many bytes instead (the size limit) */
    bigBytes?: number;
    status: number;
    expect?: string;
    field?: string;
  }[];
};

/**
 * The database's commit counter as another connection sees it (SQLite's PRAGMA data_version moves whenever any other
 * connection commits): a cheap "did anything get written?" between cases, with the full comparison when it moved.
 */
function commitWatcher() {
  const client = createClient({ url: `file:./${process.env.E2E_DB_FILE ?? "data/e2e.db"}` });
  return {
    version: async () => Number((await client.execute("PRAGMA data_version")).rows[0][0]),
    close: () => client.close(),
  };
}

const snapshot = () => databaseSnapshot();

test("every malformed request is refused plainly and changes nothing", async () => {
  expect(corpus.cases.length).toBeGreaterThanOrEqual(40);
  const apis = { admin: await signedInApi(DEMO_USERS[0].email), officer: await signedInApi(DEMO_USERS[1].email) };
  const { members } = await (await apis.admin.get("/api/members")).json();
  const { uploads } = await (await apis.officer.get("/api/uploads?kind=positions")).json();
  const ids: Record<string, string> = {
    memberId: members.find((m: { email: string }) => m.email === DEMO_USERS[4].email).id,
    selfMemberId: members.find((m: { email: string }) => m.email === DEMO_USERS[0].email).id,
    uploadId: uploads.find((u: { status: string }) => u.status === "confirmed").id,
    periodId: (await (await apis.officer.get("/api/periods")).json()).periods.find((p: { periodEnd: string }) => p.periodEnd === "2026-11-30").id,
  };
  const failures: string[] = [];
  // Nothing may change at all, so one picture of the database serves every case; between cases the commit counter
  // says whether anything was written, and only then is the whole database compared again.
  const before = await snapshot();
  const watcher = commitWatcher();
  let seen = await watcher.version();
  for (const c of corpus.cases) {
    const url = c.path.replace(/\{(\w+)\}/g, (_m, name: string) => ids[name]);
    const hasBody = c.raw !== undefined || c.body !== undefined || c.bigBytes !== undefined;
    const response = await apis[c.as].fetch(url, {
      method: c.method,
      headers: hasBody ? { "content-type": c.contentType ?? "application/json" } : undefined,
      data: c.bigBytes !== undefined ? Buffer.from(JSON.stringify({ name: "x".repeat(c.bigBytes) })) : c.raw !== undefined ? Buffer.from(c.raw) : c.body,
    });
    const body = await response.json().catch(() => null);
    const label = `${c.method} ${c.path} ${c.contentType ?? ""} ${c.bigBytes ? `${c.bigBytes} bytes` : JSON.stringify(c.body ?? c.raw ?? "").slice(0, 60)}`;
    if (response.status() !== c.status) failures.push(`${label}: status ${response.status()} (expected ${c.status}) ${JSON.stringify(body).slice(0, 160)}`);
    if (typeof body?.error?.code !== "string" || typeof body?.error?.message !== "string") failures.push(`${label}: no shared error shape`);
    const text = JSON.stringify(body?.error ?? {});
    if (c.expect && !text.includes(c.expect)) failures.push(`${label}: message lacks "${c.expect}": ${text.slice(0, 200)}`);
    if (c.field && !(body?.error?.fields && c.field in body.error.fields)) failures.push(`${label}: no message for field ${c.field}: ${text.slice(0, 200)}`);
    const now = await watcher.version();
    if (now !== seen && (await snapshot()) !== before) failures.push(`${label}: the database changed`);
    seen = now;
  }
  watcher.close();
  if ((await snapshot()) !== before) failures.push("the database changed over the corpus");
  await apis.admin.dispose();
  await apis.officer.dispose();
  expect(failures).toEqual([]);
});
