/**
 * A fresh, migrated and seeded database file for one test file, and actors built from it the way the gate
 * builds them. Sets DATABASE_URL before any data function opens the database. The worlds are copies of templates
 * built once per run (tests/unit/helpers/template-worlds.ts), not migrated and seeded again in every file.
 */
import { and, eq } from "drizzle-orm";
import { getDb, type Database } from "@/db/client";
import { auditEvents } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { actorForEmail } from "@/db/actor-for";
import { copyOfWorld, type World } from "./template-worlds";

/** Open a private copy of a template world as this file's database (and its stand-in folder, when it has one). */
export async function worldDatabase(world: World, options: { clock?: string } = {}): Promise<Database> {
  const { file, filesDir } = await copyOfWorld(world);
  if (options.clock) process.env.BALLAST_CLOCK = options.clock;
  if (filesDir) process.env.UPLOAD_STANDIN_DIR = filesDir;
  process.env.DATABASE_URL = `file:${file}`;
  return getDb();
}

/** Create a database for this test file (migrated and seeded with the demo firms); returns the handle data functions will use. */
export function freshDatabase(): Promise<Database> {
  return worldDatabase("seeded");
}

/** The actor for a seeded person, as lib/auth/actor.ts would resolve it. */
export async function actorFor(email: string): Promise<Actor> {
  return actorForEmail(getDb(), email);
}

/** The audit records of one action about one entity, or by one person. */
export function auditRecords(action: string, match: { entityId: string } | { actorId: string }) {
  const [column, value] = "entityId" in match ? [auditEvents.entityId, match.entityId] : [auditEvents.actorId, match.actorId];
  return getDb()
    .select()
    .from(auditEvents)
    .where(and(eq(auditEvents.action, action), eq(column, value)));
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
