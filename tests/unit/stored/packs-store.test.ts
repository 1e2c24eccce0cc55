/**
 * Stored filing packs: rendered once per filing version, state and content (renders counted through an injected
 * renderer, never timed), the second download the identical stored bytes; a cover-note edit, a signature and a new
 * version each give a new stored pack; stored packs cannot be changed; another firm's pack is not found; each
 * change enqueues a render job for the worker.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { and, eq, like } from "drizzle-orm";
import { actorFor } from "../helpers/db";
import { attestation, PELLAM, preparedFilingWorld, type FilingWorld } from "./../filings/setup";
import { jobs, packFiles } from "@/db/schema";
import { AppError } from "@/lib/errors";
import type { PackRenderer } from "@/lib/data/packs";
import type { PackKind } from "@/lib/validation/filings";

let w: FilingWorld;
let filingId: string;
const data = () => import("@/lib/data/filings");
const packs = () => import("@/lib/data/packs");

/** The real renderer, counted per call. */
async function countingRenderer(): Promise<{ render: PackRenderer; calls: { kind: PackKind; status: string }[] }> {
  const { renderPack } = await packs();
  const calls: { kind: PackKind; status: string }[] = [];
  return {
    calls,
    render: async (content, kind) => {
      calls.push({ kind, status: content.filing.status });
      return renderPack(content, kind);
    },
  };
}
const sha = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");
const storedOf = (id: string) => w.db.select().from(packFiles).where(eq(packFiles.filingId, id));

beforeAll(async () => {
  ({ filingId, ...w } = await preparedFilingWorld());
});

describe("stored packs", () => {
  it("assembling a draft enqueues its render job", async () => {
    const [job] = await w.db.select().from(jobs).where(and(eq(jobs.kind, "pack-render"), like(jobs.dedupeKey, `pack-render:${filingId}%`)));
    expect(job).toMatchObject({ state: "queued", firmId: w.officer.firmId, payload: { filingId } });
  });

  it("renders a pack once per version and state; the second download serves the identical stored bytes", async () => {
    const { downloadPack } = await data();
    const { render, calls } = await countingRenderer();
    const first = await downloadPack(w.officer, filingId, "docx", render);
    const second = await downloadPack(w.analyst, filingId, "docx", render);
    expect(calls).toEqual([{ kind: "docx", status: "draft" }]);
    expect(Buffer.from(second.bytes).equals(Buffer.from(first.bytes))).toBe(true);
    expect(second.sha256).toBe(sha(first.bytes));
    const rows = await storedOf(filingId);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ version: 1, state: "draft", format: "docx", sha256: first.sha256, sizeBytes: first.bytes.byteLength, fileName: "northmoor-2026-11-v1-draft.docx" });
    await downloadPack(w.officer, filingId, "xlsx", render);
    await downloadPack(w.officer, filingId, "xlsx", render);
    expect(calls.map((c) => c.kind)).toEqual(["docx", "xlsx"]);
  });

  it("renders again after the draft's content changed (a cover note), never serving the earlier rendering", async () => {
    const { downloadPack, updateFiling } = await data();
    const { render, calls } = await countingRenderer();
    const before = (await storedOf(filingId)).find((r) => r.format === "docx")!;
    await updateFiling(w.officer, filingId, { coverNote: "November pack with the new bond fund." });
    const after = await downloadPack(w.officer, filingId, "docx", render);
    expect(calls).toHaveLength(1);
    expect(after.sha256).not.toBe(before.sha256);
    const drafts = (await storedOf(filingId)).filter((r) => r.format === "docx");
    expect(drafts.map((r) => r.sha256)).toEqual([after.sha256]);
  });

  it("a signature produces a new stored pack; the draft's stays as it was", async () => {
    const { downloadPack, submitFiling, signFiling } = await data();
    const { render, calls } = await countingRenderer();
    await submitFiling(w.officer, filingId);
    await signFiling(w.head, filingId, attestation(w.head));
    const signed = await downloadPack(w.officer, filingId, "docx", render);
    const again = await downloadPack(w.analyst, filingId, "docx", render);
    expect(calls).toEqual([{ kind: "docx", status: "signed" }]);
    expect(signed.fileName).toBe("northmoor-2026-11-v1-signed.docx");
    expect(again.sha256).toBe(signed.sha256);
    const states = (await storedOf(filingId)).filter((r) => r.format === "docx").map((r) => r.state).sort();
    expect(states).toEqual(["draft", "signed"]);
  });

  it("stored packs cannot be changed, and a signed version's pack cannot be deleted", async () => {
    const [row] = (await storedOf(filingId)).filter((r) => r.state === "signed");
    await expect(w.db.update(packFiles).set({ sha256: "0".repeat(64) }).where(eq(packFiles.id, row.id))).rejects.toThrow();
    await expect(w.db.update(packFiles).set({ bytes: Buffer.from("other") }).where(eq(packFiles.id, row.id))).rejects.toThrow();
    await expect(w.db.delete(packFiles).where(eq(packFiles.id, row.id))).rejects.toThrow();
    const [still] = await w.db.select().from(packFiles).where(eq(packFiles.id, row.id));
    expect(still.sha256).toBe(row.sha256);
  });

  it("a new version produces its own stored pack, and the superseded version's pack says so", async () => {
    const { downloadPack, newFilingVersion } = await data();
    const { render, calls } = await countingRenderer();
    const created = await newFilingVersion(w.officer, filingId, { reason: "The cover note must name the new bond fund." });
    const v2 = await downloadPack(w.officer, created.id, "docx", render);
    const old = await downloadPack(w.officer, filingId, "docx", render);
    expect(v2.fileName).toBe("northmoor-2026-11-v2-draft.docx");
    expect(old.fileName).toBe("northmoor-2026-11-v1-superseded.docx");
    expect(calls.map((c) => c.kind)).toEqual(["docx", "docx"]);
    expect((await storedOf(created.id)).map((r) => [r.version, r.state])).toEqual([[2, "draft"]]);
    const keys = (await w.db.select({ key: jobs.dedupeKey }).from(jobs).where(eq(jobs.kind, "pack-render"))).map((j) => j.key);
    expect(keys).toContain(`pack-render:${created.id}`);
  });

  it("another firm's pack is not found, rendered for nobody and not stored", async () => {
    const { downloadPack } = await data();
    const { render, calls } = await countingRenderer();
    const before = (await storedOf(filingId)).length;
    for (const kind of ["docx", "xlsx"] as const) {
      const error = await downloadPack(await actorFor(PELLAM.head), filingId, kind, render).catch((e: AppError) => e);
      expect(error).toBeInstanceOf(AppError);
      expect((error as AppError).code).toBe("not_found:filing");
    }
    expect(calls).toHaveLength(0);
    expect(await storedOf(filingId)).toHaveLength(before);
  });

  it("the page's pack states: stored with the SHA-256, or waiting for the render job", async () => {
    const { packSource } = await data();
    const { packStates } = await packs();
    const states = await packStates(await packSource(w.officer, filingId));
    const docx = states.find((s) => s.kind === "docx")!;
    const [row] = (await storedOf(filingId)).filter((r) => r.state === "superseded" && r.format === "docx");
    expect(docx).toEqual({ kind: "docx", stored: true, sha256: row.sha256, sizeBytes: row.sizeBytes });
    const xlsx = states.find((s) => s.kind === "xlsx")!;
    expect(xlsx.stored).toBe(false);
  });
});
