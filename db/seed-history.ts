/**
 * The demo's last month: Northmoor's October 2026 walked through the whole cycle the way the people would, through
 * the same data functions the app uses — positions confirmed, a run computed and chosen for the filing, the draft
 * prepared and submitted by the compliance officer, signed by the compliance head, and recorded as filed — so that
 * "change since last period", reproduce and the filing history have something to show.
 */
import { and, eq } from "drizzle-orm";
import type { Database } from "./client";
import { reportingPeriods } from "./schema";
import { actorFor, load } from "./seed-uploads";
import { DEMO_PASSWORD } from "./demo-people";
import { openPeriod } from "../lib/data/periods";
import { startRun, useForFiling as chooseFilingRun } from "../lib/data/runs";
import { executeRun } from "../lib/data/run-execution";
import { prepareFiling, submitFiling, signFiling, markFiled } from "../lib/data/filings";
import { setStampClock } from "../lib/clock";

/** Northmoor's October 2026: signed and filed. Needs the demo price history and method statement first. */
export async function seedDemoHistory(db: Database): Promise<void> {
  // The October cycle happened in November: the business dates of its steps are those days, not the demo's today.
  // Each act is stamped at a time of that day, in order: run after positions, submission after the draft,
  // signature after the submission, filed after the signature, all before 1 December.
  const today = process.env.BALLAST_CLOCK;
  const on = (date: string, time: string) => {
    process.env.BALLAST_CLOCK = date;
    setStampClock(`${date}T${time}:00.000Z`);
  };
  try {
    await walkOctober(db, on);
  } finally {
    setStampClock(null);
    if (today === undefined) delete process.env.BALLAST_CLOCK;
    else process.env.BALLAST_CLOCK = today;
  }
}

async function walkOctober(db: Database, on: (date: string, time: string) => void): Promise<void> {
  on("2026-11-09", "09:30");
  const officer = await actorFor(db, "tomas.reyne@northmoor.example");
  const analyst = await actorFor(db, "priya.castell@northmoor.example");
  const head = await actorFor(db, "helen.marsh@northmoor.example");
  const [existing] = await db.select().from(reportingPeriods).where(and(eq(reportingPeriods.firmId, officer.firmId), eq(reportingPeriods.periodEnd, "2026-10-31")));
  const period = existing ?? (await openPeriod(officer, "2026-10"));
  await load(db, officer.email, "positions", "northmoor-positions-2026-10.csv", "2026-10-31");
  on("2026-11-12", "10:00");
  const run = await startRun(analyst, period.id, { excludeShortHistory: true });
  on("2026-11-12", "10:03");
  const outcome = await executeRun(run.id);
  if (outcome !== "completed") throw new Error(`the demo October run did not complete (${outcome})`);
  on("2026-11-12", "10:20");
  await chooseFilingRun(analyst, run.id);
  on("2026-11-16", "09:15");
  const draft = await prepareFiling(officer, period.id, {
    coverNote: "October 2026 month-end draft for Northmoor Brokerage Ltd, prepared from the chosen run and method statement version 1.",
  });
  on("2026-11-16", "11:40");
  await submitFiling(officer, draft.id, { note: "Ready for review." });
  on("2026-11-18", "14:10");
  await signFiling(head, draft.id, { password: DEMO_PASSWORD, attest: true, signerName: "Helen Marsh", licenceReference: "NMB-CH-0417 (demo)" });
  on("2026-11-19", "10:05");
  await markFiled(officer, draft.id, { filedOn: "2026-11-19", reference: "FMA/2026/10/NMB-0311 (demo)" });
}
