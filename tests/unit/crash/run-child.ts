/** Child process of the run crash test: starts a run for the demo period and executes it in this process. */
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { reportingPeriods } from "@/db/schema";
import { actorForEmail } from "@/db/actor-for";
import { startRun } from "@/lib/data/runs";
import { executeRun } from "@/lib/runs/execute";

(async () => {
  const db = getDb();
  const actor = await actorForEmail(db, "priya.castell@northmoor.example");
  const [period] = await db.select().from(reportingPeriods).where(and(eq(reportingPeriods.firmId, actor.firmId), eq(reportingPeriods.periodEnd, "2026-11-30")));
  const run = await startRun(actor, period.id, { excludeShortHistory: true });
  process.stdout.write(`started ${run.id}\n`);
  await executeRun(run.id);
  process.stdout.write("finished\n");
})();
