/** The demo database with the demo price history and positions loaded, and (when asked) the approved demo method. */
import { and, eq } from "drizzle-orm";
import { worldDatabase } from "./db";
import { actorsFor } from "./people";
import type { Database } from "@/db/client";
import { reportingPeriods } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";

/** A private copy of the loaded demo world (clock pinned to 2026-12-01), with or without the seeded method. */
export function demoDatabase(options: { withMethod: boolean }): Promise<Database> {
  return worldDatabase(options.withMethod ? "method" : "loaded", { clock: "2026-12-01" });
}

/** The open demo period (ending 2026-11-30) of the actor's firm. */
export async function demoPeriodId(db: Database, actor: Actor): Promise<string> {
  const [row] = await db
    .select({ id: reportingPeriods.id })
    .from(reportingPeriods)
    .where(and(eq(reportingPeriods.firmId, actor.firmId), eq(reportingPeriods.periodEnd, "2026-11-30")));
  return row.id;
}

/**
 * The loaded demo world (with or without the method), the actors of `people` and `periodId`: the open November
 * period of the firm of the first person named.
 */
export async function demoWorldAs<K extends string>(
  options: { withMethod: boolean },
  people: Record<K, string>,
): Promise<{ db: Database; periodId: string } & Record<K, Actor>> {
  const db = await demoDatabase(options);
  const actors = await actorsFor(people);
  const first = Object.keys(people)[0] as K;
  return { db, periodId: await demoPeriodId(db, actors[first]), ...actors };
}
