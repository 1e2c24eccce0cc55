/**
 * The actor a worker job acts as for one firm: the firm's scope and reporting currency, no person and no role, so
 * it can read the firm's data through lib/data (every query filtered by this firmId) but passes no permission check.
 * For jobs that compute and store derived results only (the data-quality report, pack rendering); they write no
 * audit record, as no person acted.
 */
import "server-only";
import { eq } from "drizzle-orm";
import type { Database } from "@/db/client";
import { firms } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";

export async function firmWorkerActor(db: Database, firmId: string | null): Promise<Actor> {
  if (!firmId) throw new Error("This job needs a firm.");
  const [firm] = await db.select({ id: firms.id, name: firms.name, reportingCurrency: firms.reportingCurrency }).from(firms).where(eq(firms.id, firmId));
  if (!firm) throw new Error(`No firm ${firmId}.`);
  return { userId: "worker", name: "Ballast worker", email: "", firmId: firm.id, firmName: firm.name, reportingCurrency: firm.reportingCurrency, roles: [], firms: [{ id: firm.id, name: firm.name }] };
}
