/**
 * The home page and the periods list cost a bounded number of queries: growing the firm's periods and runs must not
 * add a query per row. Counts every statement the data functions send through the database client.
 */
import { beforeAll, describe, expect, it, vi } from "vitest";
import { actorFor, demoPeriodId, runsDatabase } from "../runs/setup";
import { seedDemoHistory } from "@/db/seed-history";
import { listPeriods, openPeriod } from "@/lib/data/periods";
import { homeItems } from "@/lib/data/home";
import { listAuditEvents } from "@/lib/data/audit";
import { listMembers } from "@/lib/data/members";
import type { Database } from "@/db/client";
import type { Actor } from "@/lib/auth/actor";

let db: Database;
let admin: Actor;
let everyRole: Actor;

beforeAll(async () => {
  process.env.BALLAST_CLOCK = "2026-12-01";
  db = await runsDatabase({ withMethod: true });
  await seedDemoHistory(db); // Northmoor's October: a completed run, a signed and filed filing
  admin = await actorFor("ada.quayle@northmoor.example");
  await copyRuns(1); // a completed run in the open November period, so its freshness is worked out
  // The home page's items differ by role: ask as a person holding every role, so every branch reads what it reads.
  everyRole = { ...admin, roles: ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"] } as Actor;
});

/** How many statements `work` sends to the database. */
async function queriesOf(work: () => Promise<unknown>): Promise<number> {
  const spy = vi.spyOn(db.$client, "execute");
  const batch = vi.spyOn(db.$client, "batch");
  try {
    await work();
    return spy.mock.calls.length + batch.mock.calls.length;
  } finally {
    spy.mockRestore();
    batch.mockRestore();
  }
}

let copies = 0;
/** Copies of October's completed run (with its stored inputs) as completed runs of the open November period. */
async function copyRuns(n: number): Promise<void> {
  const november = await demoPeriodId(db, admin);
  const columns = (await db.$client.execute("SELECT name FROM pragma_table_info('runs')")).rows.map((r) => String(r.name));
  const [october] = (await db.$client.execute({ sql: "SELECT id FROM runs WHERE firm_id = ? AND status = 'completed' AND period_id <> ?", args: [admin.firmId, november] })).rows.map((r) => String(r.id));
  expect(october).toBeTruthy();
  for (let i = 0; i < n; i++) {
    const newId = `${october.slice(0, 28)}copy${copies++}`;
    const values = columns.map((c) => (c === "id" || c === "period_id" ? "?" : c === "is_filing_run" ? "0" : `"${c}"`));
    const args = columns.filter((c) => c === "id" || c === "period_id").map((c) => (c === "id" ? newId : november));
    await db.$client.execute({ sql: `INSERT INTO runs (${columns.map((c) => `"${c}"`).join(", ")}) SELECT ${values.join(", ")} FROM runs WHERE id = ?`, args: [...args, october] });
    await db.$client.execute({ sql: "INSERT INTO run_inputs (run_id, firm_id, data, bytes, created_at) SELECT ?, firm_id, data, bytes, created_at FROM run_inputs WHERE run_id = ?", args: [newId, october] });
  }
}

/** More rows: three earlier open periods, and three more completed runs in November. */
async function grow(): Promise<void> {
  for (const month of ["2026-06", "2026-07", "2026-08"]) await openPeriod(admin, month);
  await copyRuns(3);
}

describe("list pages read in a bounded number of queries", () => {
  it("the periods list and the home page cost the same number of queries with more periods and runs", async () => {
    // The first call reads each run's stored inputs once for its price comparison (kept per price-history state).
    await listPeriods(admin);
    const periodsBefore = await queriesOf(() => listPeriods(admin));
    const open = (await listPeriods(admin)).filter((p) => p.state !== "filed" && p.state !== "signed");
    const homeBefore = await queriesOf(() => homeItems(everyRole, open));

    await grow();
    await listPeriods(admin);
    const grown = await listPeriods(admin);
    expect(grown.length).toBeGreaterThanOrEqual(open.length + 3);
    const periodsAfter = await queriesOf(() => listPeriods(admin));
    const openAfter = grown.filter((p) => p.state !== "filed" && p.state !== "signed");
    const homeAfter = await queriesOf(() => homeItems(everyRole, openAfter));

    expect(periodsAfter).toBe(periodsBefore);
    expect(homeAfter).toBe(homeBefore);
    // Bounded in absolute terms too: each table read once, not once per row (12 and 5 when this was written).
    expect(periodsAfter).toBeLessThanOrEqual(12);
    expect(homeAfter).toBeLessThanOrEqual(6);
  });

  it("the audit trail and the members list cost the same number of queries however many rows they list", async () => {
    const auditBefore = await queriesOf(() => listAuditEvents(admin, { page: 1, pageSize: 50 }));
    const membersBefore = await queriesOf(() => listMembers(admin));
    for (const month of ["2026-03", "2026-04", "2026-05"]) await openPeriod(admin, month);
    expect(await queriesOf(() => listAuditEvents(admin, { page: 1, pageSize: 50 }))).toBe(auditBefore);
    expect(await queriesOf(() => listMembers(admin))).toBe(membersBefore);
  });
});
