/**
 * A fresh demo database (price history, November positions, approved method statement) with, on request, a
 * completed run of Northmoor's November period started by the risk analyst and marked for the filing. Roles of
 * the seeded people can be changed for a test (the gate reads them from the database on every request).
 */
import { and, eq } from "drizzle-orm";
import { methodDatabase, NORTHMOOR, PELLAM } from "../method/setup";
import { actorFor } from "../helpers/db";
import { getDb, type Database } from "@/db/client";
import { memberships, users } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";

export { NORTHMOOR, PELLAM };
export const PELLAM_OFFICER = "june.okafor@pellam.example";
export const DEMO_PASSWORD = "ballast-demo-2026";

export interface FilingWorld {
  db: Database;
  periodId: string;
  runId: string;
  officer: Actor;
  head: Actor;
  analyst: Actor;
}

/** Complete a run of the period as `starter` and, unless told not to, mark it for the filing. */
export async function completedRun(starter: Actor, periodId: string, mark = true): Promise<string> {
  const runs = await import("@/lib/data/runs");
  const { executeRun } = await import("@/lib/data/run-execution");
  const run = await runs.startRun(starter, periodId, { excludeShortHistory: true });
  const outcome = await executeRun(run.id);
  if (outcome !== "completed") throw new Error(`the test run did not complete (${outcome})`);
  if (mark) await runs.useForFiling(starter, run.id);
  return run.id;
}

/** The demo database and, with `run`, Northmoor's November run marked for the filing. */
export async function filingWorld(options: { run: boolean } = { run: true }): Promise<FilingWorld> {
  const db = await methodDatabase({ withMethod: true });
  const analyst = await actorFor(NORTHMOOR.analyst);
  const { listPeriods } = await import("@/lib/data/periods");
  const [period] = await listPeriods(analyst);
  const runId = options.run ? await completedRun(analyst, period.id) : "";
  return { db, periodId: period.id, runId, officer: await actorFor(NORTHMOOR.officer), head: await actorFor(NORTHMOOR.head), analyst };
}

/** filingWorld and the draft filing the compliance officer prepares from its run. */
export async function preparedFilingWorld(): Promise<FilingWorld & { filingId: string }> {
  const w = await filingWorld();
  const { prepareFiling } = await import("@/lib/data/filings");
  return { ...w, filingId: (await prepareFiling(w.officer, w.periodId)).id };
}

/** Give a seeded person exactly these roles at their firm, and return their actor as the gate would build it. */
export async function withRoles(email: string, roles: string[]): Promise<Actor> {
  const [user] = await getDb().select({ id: users.id }).from(users).where(eq(users.email, email));
  await getDb().update(memberships).set({ roles }).where(eq(memberships.userId, user.id));
  return actorFor(email);
}

/** Deactivate (or reactivate) a seeded person's membership. */
export async function setActive(email: string, active: boolean): Promise<void> {
  const [user] = await getDb().select({ id: users.id }).from(users).where(eq(users.email, email));
  await getDb()
    .update(memberships)
    .set({ active })
    .where(and(eq(memberships.userId, user.id)));
}

/** The attestation as the sign dialog sends it. */
export function attestation(actor: Actor, password = DEMO_PASSWORD) {
  return { password, attest: true as const, signerName: actor.name, licenceReference: "FMA-CH-2291" };
}
