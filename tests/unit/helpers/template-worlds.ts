/**
 * Template worlds for the unit suite: built once per `vitest run` by tests/unit/helpers/global-setup.ts, copied per
 * test file by tests/unit/helpers/db.ts. A file copy takes milliseconds; migrating and seeding takes seconds, and the
 * same seconds again in every file that needs the world (several times that on a busy machine).
 *
 *   migrated  the schema only (all migrations applied)
 *   seeded    + db/seed.ts (the two demo firms, their people, periods and holidays; clock 2026-12-01 09:00 UTC)
 *   loaded    + db/seed-uploads.ts (price history and November positions through the upload path; BALLAST_CLOCK
 *             2026-12-01), with the stand-in's folder of stored files beside it
 *   method    + db/seed-method.ts (version 1 of each firm's method statement, approved)
 */
import { copyFileSync, cpSync, existsSync, mkdirSync, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { migrateDatabase } from "@/db/migrate";
import { getDb, openDatabase, type Database } from "@/db/client";
import { seedDemo } from "@/db/seed";
import { seedDemoUploads } from "@/db/seed-uploads";
import { seedDemoMethod } from "@/db/seed-method";

export const WORLDS = ["migrated", "seeded", "loaded", "method"] as const;
export type World = (typeof WORLDS)[number];

/** The environment variable through which the global set-up tells the test files where the templates are. */
export const TEMPLATE_DIR_VAR = "BALLAST_TEST_TEMPLATES";

/** The pinned instant the demo is seeded at (the clock every unit test runs on). */
export const SEED_TODAY = new Date("2026-12-01T09:00:00Z");

function templateFile(dir: string, world: World): string {
  return path.join(dir, `${world}.db`);
}
function templateFiles(dir: string, world: World): string {
  return path.join(dir, `${world}-files`);
}

/** Fold the WAL into the main file and close, so that the file alone is the whole database. */
async function closeWhole(db: Database): Promise<void> {
  await db.$client.execute("PRAGMA wal_checkpoint(TRUNCATE)");
  db.$client.close();
}

/** Build every template world in `dir` (each step on a copy of the one before). */
export async function buildTemplates(dir: string): Promise<void> {
  const previousClock = process.env.BALLAST_CLOCK;
  const previousStandIn = process.env.UPLOAD_STANDIN_DIR;
  const previousUrl = process.env.DATABASE_URL;
  /** The data functions the seeds call open the database at DATABASE_URL themselves. */
  const open = (world: World): Database => {
    process.env.DATABASE_URL = `file:${templateFile(dir, world)}`;
    return getDb();
  };
  try {
    await migrateDatabase(`file:${templateFile(dir, "migrated")}`);
    await closeWhole(openDatabase(`file:${templateFile(dir, "migrated")}`));

    copyFileSync(templateFile(dir, "migrated"), templateFile(dir, "seeded"));
    const seeded = open("seeded");
    await seedDemo(seeded, SEED_TODAY);
    await closeWhole(seeded);

    copyFileSync(templateFile(dir, "seeded"), templateFile(dir, "loaded"));
    process.env.BALLAST_CLOCK = "2026-12-01";
    process.env.UPLOAD_STANDIN_DIR = templateFiles(dir, "loaded");
    mkdirSync(templateFiles(dir, "loaded"), { recursive: true });
    const loaded = open("loaded");
    await seedDemoUploads(loaded, "2026-11-30");
    await closeWhole(loaded);

    copyFileSync(templateFile(dir, "loaded"), templateFile(dir, "method"));
    cpSync(templateFiles(dir, "loaded"), templateFiles(dir, "method"), { recursive: true });
    process.env.UPLOAD_STANDIN_DIR = templateFiles(dir, "method");
    const method = open("method");
    await seedDemoMethod(method);
    await closeWhole(method);
  } finally {
    restore("BALLAST_CLOCK", previousClock);
    restore("UPLOAD_STANDIN_DIR", previousStandIn);
    restore("DATABASE_URL", previousUrl);
  }
}

function restore(name: string, value: string | undefined): void {
  if (value === undefined) delete process.env[name];
  else process.env[name] = value;
}

/**
 * A private copy of a template world for one test file: the database file in a fresh temporary folder and, for the
 * worlds with uploads, the stand-in's stored files in a folder of their own. Without the global set-up (a file run by
 * another runner) the templates are built here first, in a folder of this process.
 */
export async function copyOfWorld(world: World, label = "ballast-test-"): Promise<{ file: string; filesDir?: string }> {
  let dir = process.env[TEMPLATE_DIR_VAR];
  if (!dir || !existsSync(templateFile(dir, "method"))) {
    dir = mkdtempSync(path.join(tmpdir(), "ballast-templates-"));
    await buildTemplates(dir);
    process.env[TEMPLATE_DIR_VAR] = dir;
  }
  const target = mkdtempSync(path.join(tmpdir(), label));
  const file = path.join(target, "test.db");
  copyFileSync(templateFile(dir, world), file);
  if (world !== "loaded" && world !== "method") return { file };
  const filesDir = path.join(target, "files");
  cpSync(templateFiles(dir, world), filesDir, { recursive: true });
  return { file, filesDir };
}
