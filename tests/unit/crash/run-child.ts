/** Child process of the run crash test: starts a run for the demo period and executes it in this process. */
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { firms, memberships, reportingPeriods, users } from "@/db/schema";
import { parseRoles } from "@/lib/auth/roles";
import { startRun } from "@/lib/data/runs";
import { executeRun } from "@/lib/runs/execute";

(async () => {
  const db = getDb();
  const [row] = await db
    .select({ user: users, membership: memberships, firm: firms })
    .from(users)
    .innerJoin(memberships, eq(memberships.userId, users.id))
    .innerJoin(firms, eq(firms.id, memberships.firmId))
    .where(eq(users.email, "priya.castell@northmoor.example"));
  const actor = {
    userId: row.user.id,
    name: row.user.name,
    email: row.user.email,
    firmId: row.firm.id,
    firmName: row.firm.name,
    reportingCurrency: row.firm.reportingCurrency,
    roles: parseRoles(row.membership.roles),
    firms: [{ id: row.firm.id, name: row.firm.name }],
  };
  const [period] = await db.select().from(reportingPeriods).where(and(eq(reportingPeriods.firmId, actor.firmId), eq(reportingPeriods.periodEnd, "2026-11-30")));
  const run = await startRun(actor, period.id, { excludeShortHistory: true });
  process.stdout.write(`started ${run.id}\n`);
  await executeRun(run.id);
  process.stdout.write("finished\n");
})();
