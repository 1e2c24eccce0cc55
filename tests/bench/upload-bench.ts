/**
 * Shared set-up of the upload benchmarks: a fresh database with the demo firms, and timing of receive + confirm
 * (parse, validate and store) for a generated file, with the process's peak memory.
 */
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { migrateDatabase } from "@/db/migrate";
import { openDatabase, getDb } from "@/db/client";
import { seedDemo } from "@/db/seed";
import { eq } from "drizzle-orm";
import { reportingPeriods } from "@/db/schema";
import { actorForEmail } from "@/db/actor-for";
import type { Actor } from "@/lib/auth/actor";

/** A fresh seeded database for this process; returns the actor for an e-mail and the open period id. */
export async function benchDatabase(email: string): Promise<{ actor: Actor; periodId: string }> {
  const dir = mkdtempSync(path.join(tmpdir(), "ballast-bench-"));
  const url = `file:${path.join(dir, "bench.db")}`;
  process.env.DATABASE_URL = url;
  process.env.BALLAST_CLOCK = "2026-12-01";
  await migrateDatabase(url);
  const seedDb = openDatabase(url);
  await seedDemo(seedDb, new Date("2026-12-01T09:00:00Z"));
  seedDb.$client.close();
  const db = getDb();
  const actor = await actorForEmail(db, email);
  const [period] = await db.select().from(reportingPeriods).where(eq(reportingPeriods.firmId, actor.firmId));
  return { actor, periodId: period.id };
}

/** Peak resident memory of this process so far, in MiB. */
export function peakRssMiB(): number {
  return process.resourceUsage().maxRSS / 1024;
}
