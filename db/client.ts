/**
 * The database: SQLite through @libsql/client. A `file:` URL (the default, under ./data) for one machine;
 * a libSQL server URL (DATABASE_URL + DATABASE_AUTH_TOKEN) to run several app instances against one store.
 */
import { createClient, type Client } from "@libsql/client";
import { drizzle, type LibSQLDatabase } from "drizzle-orm/libsql";
import { mkdirSync } from "node:fs";
import path from "node:path";
import * as schema from "./schema";

export type Database = LibSQLDatabase<typeof schema> & { $client: Client };

/** The database URL in force: DATABASE_URL, or the embedded default file. */
export function databaseUrl(): string {
  return process.env.DATABASE_URL || "file:./data/ballast.db";
}

/** Open a database at a URL, creating the folder of a local file and setting WAL mode and a busy timeout. */
export function openDatabase(url = databaseUrl()): Database {
  if (url.startsWith("file:")) {
    const file = url.slice("file:".length);
    if (file && file !== ":memory:") mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  }
  // `timeout` is SQLite's busy timeout for every pooled connection; WAL mode is set once by the migration
  // script and persists in the file.
  const client = createClient({ url, authToken: process.env.DATABASE_AUTH_TOKEN, timeout: 5000 });
  return drizzle(client, { schema }) as Database;
}

const globalForDb = globalThis as unknown as { ballastDb?: Database; ballastDbUrl?: string };

/** The process-wide database handle for the configured URL. */
export function getDb(): Database {
  const url = databaseUrl();
  if (!globalForDb.ballastDb || globalForDb.ballastDbUrl !== url) {
    globalForDb.ballastDb = openDatabase(url);
    globalForDb.ballastDbUrl = url;
  }
  return globalForDb.ballastDb;
}

/** A transaction handle or the database itself: data functions accept either. */
export type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];
