/**
 * `npm run db:restore -- FILE`: bring a backup back as the live database. The backup must pass SQLite's
 * `PRAGMA integrity_check` first; the current database is kept beside it as <name>.before-restore-<time>.
 * Stop the app before restoring, and start it again afterwards.
 */
import { copyFileSync, existsSync, renameSync, rmSync } from "node:fs";
import path from "node:path";
import { createClient } from "@libsql/client";
import { databaseUrl } from "./client";
import { localFile } from "./backup";

/** Check a database file with PRAGMA integrity_check; throws with SQLite's findings when it is not "ok". */
export async function checkIntegrity(file: string): Promise<void> {
  if (!existsSync(file)) throw new Error(`${file} does not exist`);
  const client = createClient({ url: `file:${file}` });
  try {
    const { rows } = await client.execute("PRAGMA integrity_check");
    const findings = rows.map((r) => String(Object.values(r)[0]));
    if (findings.length !== 1 || findings[0] !== "ok") throw new Error(`${file} failed the integrity check: ${findings.slice(0, 5).join("; ")}`);
  } catch (error) {
    if (error instanceof Error && error.message.includes("integrity check")) throw error;
    throw new Error(`${file} is not a readable SQLite database (${error instanceof Error ? error.message : error})`);
  } finally {
    client.close();
  }
}

/** Replace the live database with a checked backup; returns where the previous database was kept. */
export async function restoreDatabase(backup: string, url = databaseUrl()): Promise<string> {
  const source = path.resolve(backup);
  await checkIntegrity(source);
  const live = localFile(url);
  const kept = `${live}.before-restore-${new Date().toISOString().replace(/[:.]/g, "-")}`;
  // Fold any WAL content into the current file so the kept copy is complete, then set it aside.
  if (existsSync(live)) {
    const client = createClient({ url: `file:${live}` });
    await client.execute("PRAGMA wal_checkpoint(TRUNCATE)");
    client.close();
    renameSync(live, kept);
  }
  for (const suffix of ["-wal", "-shm"]) rmSync(live + suffix, { force: true });
  const staging = `${live}.restoring`;
  copyFileSync(source, staging);
  renameSync(staging, live);
  return kept;
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(__filename)) {
  const file = process.argv[2];
  if (!file) {
    console.error("usage: npm run db:restore -- BACKUP_FILE");
    process.exit(1);
  }
  restoreDatabase(file)
    .then((kept) => console.log(`restored ${file}; the previous database is kept as ${kept}`))
    .catch((error) => {
      console.error(`restore failed: ${error instanceof Error ? error.message : error}`);
      process.exit(1);
    });
}
