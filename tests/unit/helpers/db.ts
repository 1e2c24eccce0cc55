/**
 * A fresh, migrated and seeded database file for one test file, and actors built from it the way the gate
 * builds them. Sets DATABASE_URL before any data function opens the database.
 */
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { migrateDatabase } from "@/db/migrate";
import { openDatabase, getDb, type Database } from "@/db/client";
import { seedDemo } from "@/db/seed";
import type { Actor } from "@/lib/auth/actor";
import { actorForEmail } from "@/db/actor-for";

/** Create a database for this test file; returns the handle data functions will use. */
export async function freshDatabase(): Promise<Database> {
  const dir = mkdtempSync(path.join(tmpdir(), "ballast-test-"));
  const url = `file:${path.join(dir, "test.db")}`;
  process.env.DATABASE_URL = url;
  await migrateDatabase(url);
  const seedDb = openDatabase(url);
  await seedDemo(seedDb, new Date("2026-12-01T09:00:00Z"));
  seedDb.$client.close();
  return getDb();
}

/** The actor for a seeded person, as lib/auth/actor.ts would resolve it. */
export async function actorFor(email: string): Promise<Actor> {
  return actorForEmail(getDb(), email);
}

/** Every row of every table, for "nothing changed" checks. */
export async function snapshot(db: Database): Promise<Record<string, unknown[]>> {
  const tables = await db.$client.execute("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE '__drizzle%' ORDER BY name");
  const result: Record<string, unknown[]> = {};
  for (const { name } of tables.rows) {
    result[String(name)] = (await db.$client.execute(`SELECT * FROM "${String(name)}" ORDER BY rowid`)).rows.map((r) => ({ ...r }));
  }
  return result;
}
