/**
 * Downloading the packs of a filing version: the right content type, a file name with the firm, the period, the
 * version and the state, each download in the audit trail with the file's SHA-256; the Word pack unzips and carries
 * the DRAFT marking until signed and the content hash after; the workbook opens with xlsx-populate; another firm's
 * filing is not found.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import JSZip from "jszip";
import XlsxPopulate from "xlsx-populate";
import { actorFor, auditRecords } from "../helpers/db";
import { attestation, NORTHMOOR, PELLAM, preparedFilingWorld, type FilingWorld } from "./setup";
import { AppError } from "@/lib/errors";

let w: FilingWorld;
let filingId: string;
const data = () => import("@/lib/data/filings");

/** All the text of the Word document's body, headers and footers. */
async function wordText(bytes: Uint8Array): Promise<string> {
  const zip = await JSZip.loadAsync(bytes);
  const parts = Object.keys(zip.files).filter((name) => /^word\/(document|header\d*|footer\d*)\.xml$/.test(name));
  expect(parts).toContain("word/document.xml");
  let text = "";
  for (const part of parts) text += (await zip.file(part)!.async("string")).replace(/<[^>]+>/g, "") + "\n";
  return text;
}

const downloads = async () => auditRecords("filing.download", { entityId: filingId });

beforeAll(async () => {
  ({ filingId, ...w } = await preparedFilingWorld());
});

describe("packs of a draft", () => {
  it("serves the Word pack with its content type and name, marked DRAFT, and records the download", async () => {
    const { downloadPack } = await data();
    const auditor = await actorFor(NORTHMOOR.auditor);
    const pack = await downloadPack(auditor, filingId, "docx");
    expect(pack.contentType).toBe("application/vnd.openxmlformats-officedocument.wordprocessingml.document");
    expect(pack.fileName).toBe("northmoor-2026-11-v1-draft.docx");
    const text = await wordText(pack.bytes);
    expect(text).toContain("DRAFT");
    expect(text).toContain("Northmoor Brokerage Ltd");
    expect(text).toContain("Draft computed under the stated method");
    const [event] = await downloads();
    expect(event).toMatchObject({ actorName: "Oskar Lind", summary: "Downloaded the Word pack northmoor-2026-11-v1-draft.docx" });
    expect(event.detail).toMatchObject({ kind: "docx", fileName: pack.fileName, version: 1, bytes: pack.bytes.byteLength, sha256: createHash("sha256").update(pack.bytes).digest("hex") });
  });

  it("serves the workbook, which opens with xlsx-populate, and records that download too", async () => {
    const { downloadPack } = await data();
    const pack = await downloadPack(w.analyst, filingId, "xlsx");
    expect(pack.contentType).toBe("application/vnd.openxmlformats-officedocument.spreadsheetml.sheet");
    expect(pack.fileName).toBe("northmoor-2026-11-v1-draft.xlsx");
    const book = await XlsxPopulate.fromDataAsync(Buffer.from(pack.bytes));
    expect(book.sheets().length).toBeGreaterThan(3);
    expect((await downloads()).map((e) => (e.detail as { kind: string }).kind)).toEqual(["docx", "xlsx"]);
  });
});

describe("packs of a signed version", () => {
  it("carry the sign-off block with the content hash and are named as signed", async () => {
    const { submitFiling, signFiling, downloadPack } = await data();
    await submitFiling(w.officer, filingId);
    const signed = await signFiling(w.head, filingId, attestation(w.head));
    const pack = await downloadPack(w.officer, filingId, "docx");
    expect(pack.fileName).toBe("northmoor-2026-11-v1-signed.docx");
    const text = await wordText(pack.bytes);
    expect(text).toContain(signed.signature!.contentHash);
    expect(text).toContain("Helen Marsh");
    expect(text).not.toContain("DRAFT — NOT SIGNED");
  });
});

describe("another firm", () => {
  it("gets not found for a pack of this firm's filing, and no download is recorded", async () => {
    const { downloadPack } = await data();
    const before = (await downloads()).length;
    for (const kind of ["docx", "xlsx"] as const) {
      const error = await downloadPack(await actorFor(PELLAM.head), filingId, kind).catch((e: AppError) => e);
      expect(error).toBeInstanceOf(AppError);
      expect((error as AppError).code).toBe("not_found:filing");
    }
    expect(await downloads()).toHaveLength(before);
  });
});
