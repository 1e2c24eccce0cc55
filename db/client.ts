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
  // WAL mode is set once by the migration script and persists in the file; writes of this process take turns
  // (serialiseWrites) and SQLite's busy timeout covers writers in other processes.
  const client = url.startsWith("file:")
    ? serialiseWrites(createClient({ url, authToken: process.env.DATABASE_AUTH_TOKEN, timeout: 5000 }))
    : createClient({ url, authToken: process.env.DATABASE_AUTH_TOKEN });
  return drizzle(client, { schema }) as Database;
}

/** Whether an error (or its cause) is SQLite saying the database is locked by another writer. */
export function isDatabaseBusy(error: unknown): boolean {
  for (let e: unknown = error, depth = 0; e && depth < 5; e = (e as { cause?: unknown }).cause, depth++) {
    const { code, message } = e as { code?: unknown; message?: unknown };
    if (typeof code === "string" && code.startsWith("SQLITE_BUSY")) return true;
    if (typeof message === "string" && /SQLITE_BUSY|database is locked/.test(message)) return true;
  }
  return false;
}

/** How long a write waits for this process's other writes before giving up. */
export const WRITE_WAIT_MS = 15_000;

const READ_ONLY = /^\s*(select|with|pragma\s+(?!journal_mode|wal_checkpoint)|explain)\b/i;

/** One write at a time in this process, in arrival order. */
export class WriteQueue {
  private tail: Promise<void> = Promise.resolve();

  /** Wait for the turn; resolves with the function that ends it. */
  acquire(): Promise<() => void> {
    let release!: () => void;
    const turn = new Promise<void>((resolve) => (release = resolve));
    const previous = this.tail;
    this.tail = previous.then(() => turn);
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error("SQLITE_BUSY: the database stayed busy with other writes for too long")), WRITE_WAIT_MS);
      void previous.then(() => {
        clearTimeout(timer);
        let done = false;
        resolve(() => {
          if (!done) {
            done = true;
            release();
          }
        });
      });
    });
  }

  async run<T>(operation: () => Promise<T>): Promise<T> {
    const release = await this.acquire();
    try {
      return await operation();
    } finally {
      release();
    }
  }
}

/**
 * The local SQLite driver waits for a busy database synchronously, which inside one Node process would stall the
 * very transaction it waits for. So writes from this process take turns here (reads never wait: WAL readers do
 * not block), and SQLite's busy timeout is left for writers in other processes (scripts, a second server).
 */
export function serialiseWrites(client: Client, queue = new WriteQueue()): Client {
  return new Proxy(client, {
    get(target, property, receiver) {
      if (property === "execute") {
        const execute = target.execute.bind(target) as (...args: unknown[]) => Promise<unknown>;
        return (...args: unknown[]) => {
          const statement = args[0] as string | { sql: string };
          const sql = typeof statement === "string" ? statement : statement.sql;
          return READ_ONLY.test(sql) ? execute(...args) : queue.run(() => execute(...args));
        };
      }
      if (property === "batch" || property === "executeMultiple" || property === "migrate") {
        const method = Reflect.get(target, property, receiver) as (...args: unknown[]) => Promise<unknown>;
        return (...args: unknown[]) => queue.run(() => method.apply(target, args));
      }
      if (property === "transaction") {
        return async (mode?: "write" | "read" | "deferred") => {
          if (mode === "read") return target.transaction(mode);
          const release = await queue.acquire();
          try {
            const tx = await target.transaction(mode ?? "write");
            for (const end of ["commit", "rollback"] as const) {
              const original = tx[end].bind(tx);
              tx[end] = async () => {
                try {
                  await original();
                } finally {
                  release();
                }
              };
            }
            const close = tx.close.bind(tx);
            tx.close = () => {
              try {
                close();
              } finally {
                release();
              }
            };
            return tx;
          } catch (error) {
            release();
            throw error;
          }
        };
      }
      const value = Reflect.get(target, property, receiver);
      // The client keeps private fields: its own methods must run with the client itself as `this`.
      return typeof value === "function" ? value.bind(target) : value;
    },
  });
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
