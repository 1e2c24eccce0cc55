/** A fresh demo database with the demo price history and positions loaded, and optionally the seeded method. */
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { freshDatabase } from "../helpers/db";
import { seedDemoUploads } from "@/db/seed-uploads";
import { seedDemoMethod } from "@/db/seed-method";
import type { Database } from "@/db/client";

export async function methodDatabase(options: { withMethod: boolean }): Promise<Database> {
  process.env.BALLAST_CLOCK = "2026-12-01";
  process.env.UPLOAD_STANDIN_DIR = mkdtempSync(path.join(tmpdir(), "ballast-method-files-"));
  const db = await freshDatabase();
  await seedDemoUploads(db, "2026-11-30");
  if (options.withMethod) await seedDemoMethod(db);
  return db;
}

export const NORTHMOOR = {
  analyst: "priya.castell@northmoor.example",
  head: "helen.marsh@northmoor.example",
  officer: "tomas.reyne@northmoor.example",
  auditor: "oskar.lind@northmoor.example",
  analystOfficer: "nia.dorrance@northmoor.example",
};
export const PELLAM = { analyst: "june.okafor@pellam.example", head: "rafe.pellam@pellam.example" };
