import { beforeAll, describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import XlsxPopulate from "xlsx-populate";
import { snapshot } from "./helpers/db";
import { SEEDED, worldAs } from "./helpers/people";
import { receiveUploadBytes, confirmUpload, getUploadPreview } from "@/lib/data/uploads";
import { listPeriods } from "@/lib/data/periods";
import type { Database } from "@/db/client";
import type { Actor } from "@/lib/auth/actor";
import { lyingZip, outOfProportionZip } from "./helpers/lying-zip";

/**
 * The malformed-file corpus (tests/fixtures/bad-input/files.json): each file, received as an upload, must produce
 * its stated problem, must not be confirmable, and must leave the period's positions, the price history and the
 * instruments exactly as they were (the upload itself is recorded as received, with its problems, so a person
 * can see why it was refused).
 */
const dir = path.join(__dirname, "..", "fixtures", "bad-input");
const corpus = JSON.parse(readFileSync(path.join(dir, "files.json"), "utf8")) as {
  cases: { file?: string; generated?: string; kind: "positions" | "prices"; expect: string; row?: number }[];
};

async function generated(name: string): Promise<Uint8Array> {
  if (name === "workbook-without-positions-sheet") {
    const wb = await XlsxPopulate.fromBlankAsync();
    wb.sheet(0)!.name("Summary");
    wb.sheet(0)!.cell("A1").value([["Quarter", "Result"], ["Q3", 5]] as never);
    return new Uint8Array((await wb.outputAsync()) as Buffer);
  }
  if (name === "workbook-lying-about-its-sizes") return lyingZip([{ name: "xl/worksheets/sheet1.xml", realBytes: 64 * 1024 * 1024 }]);
  return outOfProportionZip();
}

let db: Database;
let officer: Actor;
let analyst: Actor;
let periodId: string;

beforeAll(async () => {
  ({ db, officer, analyst } = await worldAs({ officer: SEEDED.northmoorOfficer, analyst: SEEDED.northmoorAnalyst }));
  periodId = (await listPeriods(officer))[0].id;
});

const DATA_TABLES = ["positions", "price_points", "instruments"];

describe("malformed upload files", () => {
  it("holds at least 30 cases", () => {
    expect(corpus.cases.length).toBeGreaterThanOrEqual(30);
  });

  for (const [index, c] of corpus.cases.entries()) {
    it(`${c.file ?? c.generated}: ${c.expect}`, async () => {
      const bytes = c.file ? new Uint8Array(readFileSync(path.join(dir, "files", c.file))) : await generated(c.generated!);
      const actor = c.kind === "positions" ? officer : analyst;
      const before = await snapshot(db);
      const { uploadId } = await receiveUploadBytes(
        { firmId: actor.firmId, userId: actor.userId, userName: actor.name, periodId: c.kind === "positions" ? periodId : null, kind: c.kind, numberFormat: "plain" },
        { key: `bad-${index}`, name: c.file ?? `${c.generated}.xlsx`, ufsUrl: `http://127.0.0.1:9/f/bad-${index}` },
        bytes,
      );
      const preview = await getUploadPreview(actor, uploadId);
      const match = preview.problems.find((p) => p.message.includes(c.expect));
      expect(match, JSON.stringify(preview.problems.slice(0, 3))).toBeDefined();
      expect(match!.severity).toBe("error");
      if (c.row) expect(match!.row).toBe(c.row);
      await expect(confirmUpload(actor, uploadId, { acknowledgeWarnings: true })).rejects.toMatchObject({ kind: "unprocessable" });
      const after = await snapshot(db);
      for (const table of DATA_TABLES) expect(after[table], table).toEqual(before[table]);
    });
  }
});
