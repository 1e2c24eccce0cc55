/**
 * `npm run db:backup [-- FILE]`: a consistent copy of the live SQLite database, taken while the app runs, with
 * SQLite's `VACUUM INTO` (one read transaction: the copy is the database as of one moment). Default file:
 * data/backups/ballast-<UTC time>.db.
 */
import { mkdirSync, existsSync } from "node:fs";
import path from "node:path";
import { createClient } from "@libsql/client";
import { databaseUrl } from "./client";

/** The local file behind a `file:` URL; backups of a libSQL server are the server's own business. */
export function localFile(url = databaseUrl()): string {
  if (!url.startsWith("file:")) throw new Error(`backups here copy a local SQLite file; ${url} is a server (use its own backup tools)`);
  return path.resolve(url.slice("file:".length));
}

/** Write a consistent copy of the database to `target` (which must not exist yet). Returns the path. */
export async function backupDatabase(target?: string, url = databaseUrl()): Promise<string> {
  localFile(url);
  const file = path.resolve(target ?? path.join("data", "backups", `ballast-${new Date().toISOString().replace(/[:.]/g, "-")}.db`));
  if (existsSync(file)) throw new Error(`${file} already exists; choose another name`);
  mkdirSync(path.dirname(file), { recursive: true });
  const client = createClient({ url, timeout: 5000 });
  try {
    await client.execute({ sql: "VACUUM INTO ?", args: [file] });
  } finally {
    client.close();
  }
  return file;
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(__filename)) {
  backupDatabase(process.argv[2])
    .then((file) => console.log(`backup written to ${file}`))
    .catch((error) => {
      console.error(`backup failed: ${error instanceof Error ? error.message : error}`);
      process.exit(1);
    });
}
