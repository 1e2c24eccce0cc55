/** Child process of the run crash test: starts a run for the demo period, and a worker in this process computes it. */
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { reportingPeriods } from "@/db/schema";
import { actorForEmail } from "@/db/actor-for";
import { startRun } from "@/lib/data/runs";
import { runJob } from "@/lib/jobs/kinds/run";
import { Worker } from "@/lib/jobs/worker";

(async () => {
  const db = getDb();
  const actor = await actorForEmail(db, "priya.castell@northmoor.example");
  const [period] = await db.select().from(reportingPeriods).where(and(eq(reportingPeriods.firmId, actor.firmId), eq(reportingPeriods.periodEnd, "2026-11-30")));
  await startRun(actor, period.id, { excludeShortHistory: true });
  const worker = new Worker({
    db,
    owner: "crash-child",
    log: () => undefined,
    kinds: {
      run: {
        ...runJob,
        async handle(context) {
          // the job is claimed (its lease held by this process) and the run about to compute
          process.stdout.write(`started ${(context.job.payload as { runId: string }).runId}\n`);
          return runJob.handle(context);
        },
      },
    },
  });
  await worker.runOne();
  process.stdout.write("finished\n");
})();
