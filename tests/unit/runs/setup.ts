/** A fresh demo database with the demo price history and positions, and (when asked) the approved demo method. */
import { and, eq } from "drizzle-orm";
import { actorFor } from "../helpers/db";
import { demoDatabase } from "../helpers/demo-world";
import { seedDemoMethod } from "@/db/seed-method";
import type { Database } from "@/db/client";
import { reportingPeriods } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";

export const PEOPLE = {
  analyst: "priya.castell@northmoor.example",
  officer: "tomas.reyne@northmoor.example",
  auditor: "oskar.lind@northmoor.example",
  pellamAnalyst: "june.okafor@pellam.example",
};

export const runsDatabase = demoDatabase;

export { seedDemoMethod };

/** The open demo period (ending 2026-11-30) of the actor's firm. */
export async function demoPeriodId(db: Database, actor: Actor): Promise<string> {
  const [row] = await db
    .select({ id: reportingPeriods.id })
    .from(reportingPeriods)
    .where(and(eq(reportingPeriods.firmId, actor.firmId), eq(reportingPeriods.periodEnd, "2026-11-30")));
  return row.id;
}

export { actorFor };
