/**
 * Child process of the crash test: receives a large positions file for the demo period and confirms it, printing
 * "confirming" just before the confirmation. The parent kills it with SIGKILL while the transaction writes.
 */
import { readFileSync } from "node:fs";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { reportingPeriods } from "@/db/schema";
import { actorForEmail } from "@/db/actor-for";
import { confirmUpload, receiveUploadBytes } from "@/lib/data/uploads";

(async () => {
  const [file, ufsUrl] = process.argv.slice(2);
  const db = getDb();
  const actor = await actorForEmail(db, "tomas.reyne@northmoor.example");
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
