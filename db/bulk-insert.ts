/**
 * Fast multi-row INSERTs for large confirmed uploads (hundreds of thousands of rows), written as SQL literals in
 * chunks inside the caller's transaction. Values are escaped here; callers pass only validated data.
 */
import { sql } from "drizzle-orm";
import type { Tx } from "./client";

import { randomBytes } from "node:crypto";

let sequence = 0;
const processTag = randomBytes(8).toString("hex");
/**
 * An id that sorts by creation (time, then a counter), so that large batches append to the primary-key index
 * instead of splitting pages all over it; a random per-process tag keeps ids from different processes apart.
 */
export function orderedId(): string {
  sequence = (sequence + 1) % 0x100000000;
  return `${Date.now().toString(16).padStart(12, "0")}-${sequence.toString(16).padStart(8, "0")}-${processTag}`;
}

export type SqlValue = string | number | boolean | null;

/** One value as an SQLite literal: numbers must be finite, strings are quoted with doubled single quotes. */
export function sqlLiteral(value: SqlValue): string {
  if (value === null) return "NULL";
  if (typeof value === "boolean") return value ? "1" : "0";
  if (typeof value === "number") {
    if (!Number.isFinite(value)) throw new RangeError(`bulkInsert: ${value} is not a finite number`);
    return String(value);
  }
  return `'${value.replace(/'/g, "''").replace(/\u0000/g, "")}'`;
}

/** Insert rows (arrays in column order) into `table` in chunks of `chunkSize`. */
export async function bulkInsert(tx: Tx, table: string, columns: readonly string[], rows: Iterable<readonly SqlValue[]>, chunkSize = 500): Promise<number> {
  const head = `INSERT INTO "${table}" (${columns.map((c) => `"${c}"`).join(", ")}) VALUES `;
  let buffer: string[] = [];
  let count = 0;
  const flush = async () => {
    if (buffer.length === 0) return;
    await tx.run(sql.raw(head + buffer.join(",")));
    buffer = [];
  };
  for (const row of rows) {
    if (row.length !== columns.length) throw new RangeError(`bulkInsert: a row has ${row.length} values for ${columns.length} columns`);
    buffer.push(`(${row.map(sqlLiteral).join(",")})`);
    count++;
    if (buffer.length >= chunkSize) await flush();
  }
  await flush();
  return count;
}
