/** A fresh demo database with the demo price history and positions, and (when asked) the approved demo method. */
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { actorFor, freshDatabase } from "../helpers/db";
import { seedDemoUploads } from "@/db/seed-uploads";
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

export async function runsDatabase(options: { withMethod: boolean }): Promise<Database> {
  process.env.BALLAST_CLOCK = "2026-12-01";
  process.env.UPLOAD_STANDIN_DIR = mkdtempSync(path.join(tmpdir(), "ballast-runs-files-"));
  const db = await freshDatabase();
  await seedDemoUploads(db, "2026-11-30");
  if (options.withMethod) await seedDemoMethod(db);
  return db;
}

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
