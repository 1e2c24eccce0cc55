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
import { firms, memberships, reportingPeriods, users } from "@/db/schema";
import { parseRoles } from "@/lib/auth/roles";
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
  const [row] = await db
    .select({ user: users, membership: memberships, firm: firms })
    .from(users)
    .innerJoin(memberships, eq(memberships.userId, users.id))
    .innerJoin(firms, eq(firms.id, memberships.firmId))
    .where(eq(users.email, email));
  const [period] = await db.select().from(reportingPeriods).where(eq(reportingPeriods.firmId, row.firm.id));
  return {
    actor: {
      userId: row.user.id,
      name: row.user.name,
      email,
      firmId: row.firm.id,
      firmName: row.firm.name,
      reportingCurrency: row.firm.reportingCurrency,
      roles: parseRoles(row.membership.roles),
      firms: [{ id: row.firm.id, name: row.firm.name }],
    },
    periodId: period.id,
  };
}

/** Peak resident memory of this process so far, in MiB. */
export function peakRssMiB(): number {
  return process.resourceUsage().maxRSS / 1024;
}
