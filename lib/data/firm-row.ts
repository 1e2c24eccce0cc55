import "server-only";
import { and, eq } from "drizzle-orm";
import type { SQLiteColumn, SQLiteTable } from "drizzle-orm/sqlite-core";
import { getDb, type Database, type Tx } from "@/db/client";
import { AppError } from "@/lib/errors";

/** A table whose rows belong to one firm: an `id` and a `firm_id`. */
type FirmTable = SQLiteTable & { id: SQLiteColumn; firmId: SQLiteColumn };

/**
 * One row of a firm's table by id, with the firm in its WHERE (read through `db`, a transaction or the database);
 * another firm's row looks absent: both throw `AppError(notFound, message)`.
 */
export async function firmRow<T extends FirmTable>(
  table: T,
  firmId: string,
  id: string,
  notFound: `not_found:${string}`,
  message?: string,
  db: Database | Tx = getDb(),
): Promise<T["$inferSelect"]> {
  const [row] = await db.select().from(table).where(and(eq(table.id, id), eq(table.firmId, firmId)));
  if (!row) throw new AppError(notFound, message);
  return row;
}
