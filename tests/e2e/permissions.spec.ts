import { test, expect, type APIRequestContext } from "@playwright/test";
import { ROUTES, type RouteCase } from "../permission-table";
import { completedRunOf as startCompletedRun, DEMO_USERS, SECOND_FIRM_USERS, signedInApi } from "./helpers";
import type { Role } from "@/lib/auth/roles";

/**
 * Every route in the permission table × (signed out, each role, a member of another firm) → the status the table
 * implies: 401 signed out, 403 without the role, 404 for another firm's record, and for an allowed role a 2xx read
 * or a 422 on a deliberately invalid write (which proves the gate let it through without writing anything).
 */
const personas: { label: string; email: string | null; roles: readonly Role[]; otherFirm?: boolean }[] = [
  { label: "signed out", email: null, roles: [] },
  ...DEMO_USERS.filter((u) => u.roles.length === 1).map((u) => ({ label: u.roles[0], email: u.email, roles: u.roles })),
  { label: "other firm (admin + compliance head)", email: SECOND_FIRM_USERS[0].email, roles: SECOND_FIRM_USERS[0].roles, otherFirm: true },
];

function isAllowed(route: RouteCase, roles: readonly Role[]): boolean {
  if (route.allowed === "public") return true;
  if (route.allowed === "member") return roles.length > 0;
  return roles.some((r) => (route.allowed as readonly Role[]).includes(r));
}

/** A completed, current run of the demo period (the seed has none): the risk analyst starts one through the API if needed. */
async function completedRunOf(periodId: string): Promise<string> {
  const analyst = await signedInApi(DEMO_USERS.find((u) => u.roles.length === 1 && u.roles[0] === "risk_analyst")!.email);
  const listed = (await (await analyst.get(`/api/periods/${periodId}/runs`)).json()).runs as { id: string; status: string; freshness?: { stale: boolean } | null }[];
  // a stale run (an earlier spec changed the period's inputs) cannot be chosen for the filing: a fresh one is needed
  let runId = listed.find((r) => r.status === "completed" && !r.freshness?.stale)?.id;
  runId ??= await startCompletedRun(analyst, periodId);
  await analyst.dispose();
  return runId;
}

/**
 * The demo period's current filing (the seed has none): the risk analyst marks the completed run for the filing and
 * the compliance officer assembles the draft, unless an earlier spec already left a filing for the period.
 */
async function filingOf(periodId: string, runId: string): Promise<string> {
  const officer = await signedInApi(DEMO_USERS.find((u) => u.roles.length === 1 && u.roles[0] === "compliance_officer")!.email);
  let filingId = (await (await officer.get(`/api/periods/${periodId}/filing`)).json()).current?.id as string | undefined;
  if (!filingId) {
    const analyst = await signedInApi(DEMO_USERS.find((u) => u.roles.length === 1 && u.roles[0] === "risk_analyst")!.email);
    const state = (await (await officer.get(`/api/periods/${periodId}/filing`)).json()).markedRun as { freshness?: { stale: boolean } } | null;
    if (!state || state.freshness?.stale) {
      const marked = await analyst.post(`/api/runs/${runId}/use-for-filing`, { data: { confirm: true } });
      expect(marked.status(), await marked.text()).toBe(200);
    }
    await analyst.dispose();
    const prepared = await officer.post(`/api/periods/${periodId}/filing`, { data: {} });
    expect(prepared.status(), await prepared.text()).toBe(200);
    filingId = (await prepared.json()).filing.id as string;
  }
  await officer.dispose();
  return filingId;
}

// The ids of the seeded records each [param] stands for, found once for every persona's sweep.
let ids: Record<string, string> = {};

test.beforeAll(async () => {
  // finding a completed run may start one and wait for it: on two shared cores that takes well over the default limit,
  // which is there to catch a hang
  test.setTimeout(300_000);
  const admin = await signedInApi(DEMO_USERS[0].email);
  ids = {
    periodId: (await (await admin.get("/api/periods")).json()).periods[0].id,
    memberId: (await (await admin.get("/api/members")).json()).members.find((m: { email: string }) => m.email === DEMO_USERS[4].email).id,
    uploadId: (await (await admin.get("/api/uploads")).json()).uploads[0]?.id,
    template: "positions.csv",
    methodId: (await (await admin.get("/api/method")).json()).versions[0]?.id,
  };
  expect(ids.uploadId, "the demo seed holds at least one upload").toBeTruthy();
  expect(ids.methodId, "the demo seed holds an approved method statement").toBeTruthy();
  await admin.dispose();
  ids.runId = await completedRunOf(ids.periodId);
  ids.filingId = await filingOf(ids.periodId, ids.runId);
});

// One test per persona, so that each sweep of every route (pack downloads and the data-quality report among them)
// has a limit of its own and reports on its own.
for (const persona of personas) {
  test(`every route answers ${persona.label} as the permission table says`, async () => {
    test.setTimeout(180_000); // a sweep of every route, some of which render packs: the limit catches a hang
    const failures: string[] = [];
    const api: APIRequestContext = await signedInApi(persona.email);
    for (const route of ROUTES.filter((r) => !r.external)) {
      const url = route.path.replace(/\[(\w+)\]/g, (_m, name: string) => ids[name]);
      const allowed = isAllowed(route, persona.roles);
      let expected: number[];
      let data: unknown;
      // a public write with an invalid body answers 422 to anyone, signed in or not
      if (!persona.email) expected = route.allowed === "public" ? [route.method === "GET" ? 200 : 422] : [401];
      else if (!allowed) expected = [403];
      else if (persona.otherFirm && route.scoped) {
        expected = [404];
        data = route.validBody;
      } else if (route.method === "GET") expected = [route.probe ?? 200];
      else {
        expected = [422];
        data = route.invalidBody;
      }
      if (route.method !== "GET" && data === undefined) data = route.invalidBody;
      const response = await api.fetch(url, { method: route.method, data });
      if (!expected.includes(response.status())) {
        failures.push(`${persona.label}: ${route.method} ${route.path} → ${response.status()} (expected ${expected.join(" or ")})`);
      }
      if (response.status() >= 400) {
        const body = await response.json();
        if (typeof body?.error?.code !== "string" || typeof body?.error?.message !== "string") {
          failures.push(`${persona.label}: ${route.method} ${route.path} error body lacks the shared shape`);
        }
      }
    }
    await api.dispose();
    expect(failures).toEqual([]);
  });
}

test("a malformed JSON body answers 400 in the shared shape and changes nothing", async () => {
  const admin = await signedInApi(DEMO_USERS[0].email);
  const before = await (await admin.get("/api/firm")).json();
  const response = await admin.fetch("/api/firm", { method: "PATCH", headers: { "content-type": "application/json" }, data: Buffer.from("{not json") });
  expect(response.status()).toBe(400);
  expect((await response.json()).error.code).toBe("bad_request:body");
  expect(await (await admin.get("/api/firm")).json()).toEqual(before);
  const badQuery = await admin.get("/api/audit?page=0");
  expect(badQuery.status()).toBe(400);
  expect((await badQuery.json()).error.message).toContain("page");
  await admin.dispose();
});

test("health answers without sign-in with the version and the database state", async () => {
  const api = await signedInApi(null);
  const response = await api.get("/api/health");
  expect(response.status()).toBe(200);
  const body = await response.json();
  expect(body).toMatchObject({ status: "ok", database: "ok" });
  expect(body.version).toMatch(/^\d+\.\d+\.\d+/);
  await api.dispose();
});
