/**
 * Times of acts: every act is stamped with the time it happened, the demo's history is consistent in the past, a
 * signature is never earlier than the submission it signs, and the signing time shown matches the audit trail.
 * Common practice, no source: an audit trail's order of events is the order of the acts.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { actorFor, PEOPLE, runsDatabase } from "../runs/setup";
import type { Database } from "@/db/client";
import { auditEvents, filings, methodStatements, reportingPeriods, runs, signatures } from "@/db/schema";
import { seedDemoHistory } from "@/db/seed-history";
import { businessNow, now, setStampClock, today } from "@/lib/clock";
import { formatTimestamp } from "@/reports/format";
import type { FilingViewModel } from "@/reports/view-model";

let db: Database;
let firmId: string;

beforeAll(async () => {
  db = await runsDatabase({ withMethod: true });
  await seedDemoHistory(db);
  firmId = (await actorFor(PEOPLE.officer)).firmId;
});

const at = async (entityId: string, action: string) => {
  const [event] = await db.select().from(auditEvents).where(and(eq(auditEvents.firmId, firmId), eq(auditEvents.entityId, entityId), eq(auditEvents.action, action)));
  expect(event, `${action} is in the audit trail`).toBeTruthy();
  return event.at;
};

describe("the clocks", () => {
  it("pins business today, never the time of an act", () => {
    expect(process.env.BALLAST_CLOCK).toBe("2026-12-01");
    expect(today()).toBe("2026-12-01");
    expect(businessNow().toISOString()).toBe("2026-12-01T09:00:00.000Z");
    const before = Date.now();
    const stamp = now().getTime();
    expect(stamp).toBeGreaterThanOrEqual(before);
    expect(stamp).toBeLessThanOrEqual(Date.now());
  });

  it("lets a history-writing script set the time of acts, and returns to the real time after", () => {
    setStampClock("2026-11-18T14:10:00.000Z");
    expect(now().toISOString()).toBe("2026-11-18T14:10:00.000Z");
    setStampClock(null);
    expect(Math.abs(now().getTime() - Date.now())).toBeLessThan(60_000);
    expect(() => setStampClock("not a time")).toThrow("not a time");
  });
});

describe("the demo's October, stamped in the past in the order it happened", () => {
  it("runs, then the draft, the submission, the signature and the filing, all before 1 December", async () => {
    const [period] = await db.select().from(reportingPeriods).where(and(eq(reportingPeriods.firmId, firmId), eq(reportingPeriods.periodEnd, "2026-10-31")));
    const [filing] = await db.select().from(filings).where(and(eq(filings.firmId, firmId), eq(filings.periodId, period.id)));
    const [run] = await db.select().from(runs).where(eq(runs.id, filing.runId));
    const [signature] = await db.select().from(signatures).where(eq(signatures.filingId, filing.id));
    const prepared = await at(filing.id, "filing.prepare");
    const submitted = await at(filing.id, "filing.submit");
    const signedInTrail = await at(filing.id, "filing.sign");
    const filed = await at(filing.id, "filing.filed");
    const order = [run.startedAt, run.finishedAt!, prepared, submitted, signature.signedAt, filed];
    expect([...order].sort()).toEqual(order);
    // strictly: the signature comes after the submission it signs, which comes after the run it was built from
    expect(signature.signedAt > submitted).toBe(true);
    expect(submitted > run.finishedAt!).toBe(true);
    for (const stamp of order) expect(stamp < "2026-12-01T00:00:00.000Z", stamp).toBe(true);
    // the signing time shown (page and packs format the stored sign-off) is the audit trail's
    expect(signature.signedAt).toBe(signedInTrail);
    const signOff = (filing.content as unknown as FilingViewModel).signOff!;
    expect(signOff.signedAt).toBe(signature.signedAt);
    expect(formatTimestamp(signOff.signedAt)).toBe(formatTimestamp(signedInTrail));
    expect(formatTimestamp(signOff.signedAt)).toBe("2026-11-18 14:10 UTC");
  });

  it("the method statement was approved in mid-September, co-approved after the analyst's approval", async () => {
    const [method] = await db.select().from(methodStatements).where(and(eq(methodStatements.firmId, firmId), eq(methodStatements.version, 1)));
    expect(method.approvedAt!.slice(0, 10)).toBe("2026-09-15");
    const approved = await at(method.id, "method.approve");
    const coApproved = await at(method.id, "method.co_approve");
    expect(approved < coApproved).toBe(true);
    expect(method.approvedAt).toBe(coApproved);
  });

  it("no signature of the database is earlier than the submission it signs", async () => {
    const all = await db.select().from(signatures).where(eq(signatures.firmId, firmId));
    expect(all.length).toBeGreaterThan(0);
    for (const s of all) {
      const submissions = (await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, s.filingId), eq(auditEvents.action, "filing.submit")))).map((e) => e.at);
      expect(submissions.length).toBeGreaterThan(0);
      expect(s.signedAt > submissions.sort().at(-1)!).toBe(true);
    }
  });
});
