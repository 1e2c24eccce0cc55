/**
 * What the worker read from an upload's file, stored in numbered parts (table upload_parts): the rows that passed
 * and the problems. Written in batches of short transactions while the upload is still "reading" (nobody reads
 * them then), read by the preview a page at a time and by the confirmation part by part.
 */
import "server-only";
import { and, asc, eq, gte, lte } from "drizzle-orm";
import type { Database, Tx } from "@/db/client";
import { uploadParts } from "@/db/schema";

/** Items per stored part. */
export const UPLOAD_PART_SIZE = 1000;
/** Parts written per transaction. */
const PARTS_PER_WRITE = 5;

export type PartName = "rows" | "problems";

/** Delete what was read from an upload before (a re-read, a retried read, a decided upload). */
export async function clearParts(db: Database | Tx, firmId: string, uploadId: string): Promise<void> {
  await db.delete(uploadParts).where(and(eq(uploadParts.firmId, firmId), eq(uploadParts.uploadId, uploadId)));
}

/** Store `items` as numbered parts, a few parts per transaction; `stillOurs` is asked before each write (false stops it). */
export async function writeParts(db: Database, firmId: string, uploadId: string, part: PartName, items: readonly unknown[], stillOurs: () => boolean = () => true): Promise<void> {
  const parts: { firmId: string; uploadId: string; part: PartName; seq: number; items: unknown[] }[] = [];
  for (let i = 0, seq = 0; i < items.length; i += UPLOAD_PART_SIZE, seq++) parts.push({ firmId, uploadId, part, seq, items: items.slice(i, i + UPLOAD_PART_SIZE) });
  for (let i = 0; i < parts.length; i += PARTS_PER_WRITE) {
    if (!stillOurs()) throw new Error("Stopped: the worker no longer holds this job.");
    await db.insert(uploadParts).values(parts.slice(i, i + PARTS_PER_WRITE));
  }
}

/**
 * An item under today's names: position rows read before the parsed row named its instrument code `instrument`
 * (as the engine, the run inputs and the price rows do) carry it as `instrumentId`.
 */
function underCurrentNames(item: unknown): unknown {
  if (item === null || typeof item !== "object" || !("instrumentId" in item) || "instrument" in item) return item;
  return Object.fromEntries(Object.entries(item).map(([k, v]) => [k === "instrumentId" ? "instrument" : k, v]));
}

/** Items [from, to) of a stored part list. */
export async function readItems(db: Database | Tx, firmId: string, uploadId: string, part: PartName, from: number, to: number): Promise<unknown[]> {
  if (to <= from) return [];
  const first = Math.floor(from / UPLOAD_PART_SIZE);
  const last = Math.floor((to - 1) / UPLOAD_PART_SIZE);
  const rows = await db
    .select({ seq: uploadParts.seq, items: uploadParts.items })
    .from(uploadParts)
    .where(and(eq(uploadParts.firmId, firmId), eq(uploadParts.uploadId, uploadId), eq(uploadParts.part, part), gte(uploadParts.seq, first), lte(uploadParts.seq, last)))
    .orderBy(asc(uploadParts.seq));
  const items = rows.flatMap((r) => r.items.map(underCurrentNames));
  const offset = from - first * UPLOAD_PART_SIZE;
  return items.slice(offset, offset + (to - from));
}

/** Every stored part of a list, in order, a few at a time. */
export async function* eachPart(db: Database, firmId: string, uploadId: string, part: PartName): AsyncGenerator<unknown[]> {
  for (let seq = 0; ; seq += PARTS_PER_WRITE) {
    const rows = await db
      .select({ items: uploadParts.items })
      .from(uploadParts)
      .where(and(eq(uploadParts.firmId, firmId), eq(uploadParts.uploadId, uploadId), eq(uploadParts.part, part), gte(uploadParts.seq, seq), lte(uploadParts.seq, seq + PARTS_PER_WRITE - 1)))
      .orderBy(asc(uploadParts.seq));
    for (const r of rows) yield r.items.map(underCurrentNames);
    if (rows.length < PARTS_PER_WRITE) return;
  }
}

/** Every item of a stored list. */
export async function readAll(db: Database, firmId: string, uploadId: string, part: PartName): Promise<unknown[]> {
  const all: unknown[] = [];
  for await (const items of eachPart(db, firmId, uploadId, part)) for (const item of items) all.push(item);
  return all;
}
