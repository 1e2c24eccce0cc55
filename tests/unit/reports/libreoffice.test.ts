import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { checkPacksInLibreOffice, findProgram } from "@/scripts/check-packs-in-libreoffice";

const soffice = findProgram("soffice", "libreoffice");
const reason = soffice ? "" : " (skipped: LibreOffice's soffice is not installed on this machine; apt-get install libreoffice-writer-nogui libreoffice-calc-nogui)";
const outDir = mkdtempSync(path.join(os.tmpdir(), "ballast-packs-"));

afterAll(() => rmSync(outDir, { recursive: true, force: true }));

describe(`LibreOffice opens both packs${reason}`, () => {
  it.skipIf(!soffice)(
    "converts the draft and the signed Word and workbook packs to PDF",
    async () => {
      const checks = await checkPacksInLibreOffice({ outDir, images: false });
      expect(checks.map((c) => path.basename(c.pack).split("-").slice(0, 2).join("-"))).toEqual(["draft-word", "draft-workbook", "signed-word", "signed-workbook"]);
      for (const c of checks) expect(c.pages, path.basename(c.pdf)).toBeGreaterThan(1);
    },
    300_000,
  );
});
