/**
 * Child process of the crash test: receives a large positions file for the demo period and confirms it, printing
 * "confirming" just before the confirmation. The parent kills it with SIGKILL while the transaction writes.
 */
import { readFileSync } from "node:fs";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { firms, memberships, reportingPeriods, users } from "@/db/schema";
import { parseRoles } from "@/lib/auth/roles";
import { confirmUpload, receiveUploadBytes } from "@/lib/data/uploads";

(async () => {
  const [file, ufsUrl] = process.argv.slice(2);
  const db = getDb();
  const [row] = await db
    .select({ user: users, membership: memberships, firm: firms })
    .from(users)
    .innerJoin(memberships, eq(memberships.userId, users.id))
    .innerJoin(firms, eq(firms.id, memberships.firmId))
    .where(eq(users.email, "tomas.reyne@northmoor.example"));
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
  const [period] = await db.select().from(reportingPeriods).where(eq(reportingPeriods.firmId, actor.firmId));
  const { uploadId } = await receiveUploadBytes(
    { firmId: actor.firmId, userId: actor.userId, userName: actor.name, periodId: period.id, kind: "positions", numberFormat: "plain" },
    { key: "crash", name: "large.csv", ufsUrl },
    new Uint8Array(readFileSync(file)),
  );
  process.stdout.write(`confirming ${uploadId}\n`);
  await confirmUpload(actor, uploadId, { acknowledgeWarnings: true });
  process.stdout.write("confirmed\n");
})();
