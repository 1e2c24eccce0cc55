import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { getDb, type Database, type Tx } from "@/db/client";
import { methodStatements } from "@/db/schema";

/**
 * The firm's approved method statement version, the one runs use (the newest, should there be more than one), read
 * through `db` (a transaction or the database); null when none is approved yet.
 */
export async function approvedMethodRow(firmId: string, db: Database | Tx = getDb()): Promise<typeof methodStatements.$inferSelect | null> {
  const [row] = await db
    .select()
    .from(methodStatements)
    .where(and(eq(methodStatements.firmId, firmId), eq(methodStatements.status, "approved")))
    .orderBy(desc(methodStatements.version))
    .limit(1);
  return row ?? null;
}
