/**
 * The demo firms' data, loaded the way a person would load it: each file is stored with the upload service (the
 * local stand-in's folder), received, checked and confirmed through lib/data/uploads. Files come from
 * templates/demo (made by scripts/generate-demo-data.ts).
 */
import { readFileSync, rmSync } from "node:fs";
import path from "node:path";
import { randomBytes } from "node:crypto";
import { and, eq } from "drizzle-orm";
import type { Database } from "./client";
import { reportingPeriods } from "./schema";
import { receiveUploadBytes, confirmUpload } from "../lib/data/uploads";
import { actorForEmail } from "./actor-for";
import { storeFileInStandIn } from "../scripts/upload-standin";
import { setStampClock } from "../lib/clock";

const DEMO_DIR = path.join(__dirname, "..", "templates", "demo");

/** The actor for a demo person (see db/actor-for.ts). */
export const actorFor = actorForEmail;

/** Where the stand-in keeps files, and the URL it serves them from. */
function storeSettings() {
  return {
    dir: process.env.UPLOAD_STANDIN_DIR ?? path.join("data", "uploads"),
    base: process.env.UPLOADTHING_INGEST_URL ?? "http://127.0.0.1:4010",
  };
}

/** Empty the local stand-in's folder (the demo starts from fresh files as from a fresh database). */
export function resetLocalFileStore(): void {
  const { dir } = storeSettings();
  if (path.resolve(dir).startsWith(path.resolve("data"))) rmSync(dir, { recursive: true, force: true });
}

export async function load(db: Database, email: string, kind: "positions" | "prices", fileName: string, periodEnd?: string): Promise<string> {
  const actor = await actorFor(db, email);
  const bytes = new Uint8Array(readFileSync(path.join(DEMO_DIR, fileName)));
  const { dir, base } = storeSettings();
  const key = randomBytes(12).toString("hex");
  storeFileInStandIn(dir, key, fileName, bytes);
  const [period] = periodEnd
    ? await db.select().from(reportingPeriods).where(and(eq(reportingPeriods.firmId, actor.firmId), eq(reportingPeriods.periodEnd, periodEnd)))
    : [];
  const { uploadId } = await receiveUploadBytes(
    { firmId: actor.firmId, userId: actor.userId, userName: actor.name, periodId: period?.id ?? null, kind, numberFormat: "plain" },
    { key, name: fileName, ufsUrl: `${base}/f/${key}` },
    bytes,
  );
  await confirmUpload(actor, uploadId, { acknowledgeWarnings: true });
  return uploadId;
}

/**
 * Load the demo firms' price history and this month's positions, stamped in the past: the price history the day
 * before the method statement's evidence was computed (mid-September; the demo keeps one history file, which runs
 * on to 20 November), the month's positions at the evening of the period end.
 */
export async function seedDemoUploads(db: Database, periodEnd: string): Promise<void> {
  try {
    setStampClock("2026-09-14T15:00:00.000Z");
    await load(db, "priya.castell@northmoor.example", "prices", "northmoor-prices.csv");
    setStampClock("2026-09-14T15:20:00.000Z");
    await load(db, "june.okafor@pellam.example", "prices", "pellam-prices.csv");
    setStampClock(`${periodEnd}T17:30:00.000Z`);
    await load(db, "tomas.reyne@northmoor.example", "positions", "northmoor-positions-2026-11.csv", periodEnd);
    setStampClock(`${periodEnd}T17:50:00.000Z`);
    await load(db, "june.okafor@pellam.example", "positions", "pellam-positions-2026-11.csv", periodEnd);
  } finally {
    setStampClock(null);
  }
}
