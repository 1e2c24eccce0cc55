import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { getDb, type Database, type Tx } from "@/db/client";
import { methodStatements } from "@/db/schema";

/** The firm's approved method statement versions (runs use the newest, should there be more than one). */
const approvedOf = (firmId: string) => and(eq(methodStatements.firmId, firmId), eq(methodStatements.status, "approved"));
const newestFirst = desc(methodStatements.version);

/**
 * The firm's approved method statement version, the one runs use, read through `db` (a transaction or the
 * database); null when none is approved yet.
 */
export async function approvedMethodRow(firmId: string, db: Database | Tx = getDb()): Promise<typeof methodStatements.$inferSelect | null> {
  const [row] = await db.select().from(methodStatements).where(approvedOf(firmId)).orderBy(newestFirst).limit(1);
  return row ?? null;
}

/** The approved version's id and number only (its content and evidence, tens of KB, are not read): what runs are compared to. */
export async function approvedMethodVersion(firmId: string, db: Database | Tx = getDb()): Promise<{ id: string; version: number } | null> {
  const [row] = await db.select({ id: methodStatements.id, version: methodStatements.version }).from(methodStatements).where(approvedOf(firmId)).orderBy(newestFirst).limit(1);
  return row ?? null;
}
