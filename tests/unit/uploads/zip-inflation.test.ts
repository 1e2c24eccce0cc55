import { describe, expect, it } from "vitest";
import XlsxPopulate from "xlsx-populate";
import { checkZipInflation, checkZipProportions, expansionCap } from "@/lib/uploads/zip-guard";
import { readTables } from "@/lib/uploads/read-table";
import { lyingZip } from "../helpers/lying-zip";

describe("zip inflation under a hard cap", () => {
  it("refuses an archive that declares 1,000 bytes but expands to 400 MB, without inflating it all", async () => {
    const bomb = await lyingZip([{ name: "xl/worksheets/sheet1.xml", realBytes: 400 * 1024 * 1024 }]);
    // The declared sizes look harmless, so the directory check alone lets it through.
    expect(() => checkZipProportions(bomb)).not.toThrow();
    expect(bomb.length).toBeLessThan(1024 * 1024);
    const rss = process.memoryUsage().rss;
    await expect(checkZipInflation(bomb)).rejects.toThrow(/out of proportion/);
    await expect(readTables(bomb)).rejects.toThrow(/out of proportion/);
    // The cap for this archive is 150 × its size; the inflated bytes were counted, never kept.
    expect(expansionCap(bomb.length)).toBeLessThan(100 * 1024 * 1024);
    expect(process.memoryUsage().rss - rss).toBeLessThan(200 * 1024 * 1024);
  });

  it("counts the real bytes across entries against one cap", async () => {
    // Ten entries, each small enough alone, together past the cap of the archive.
    const parts = await lyingZip(Array.from({ length: 10 }, (_, i) => ({ name: `part${i}.xml`, realBytes: 8 * 1024 * 1024 })));
    expect(10 * 8 * 1024 * 1024).toBeGreaterThan(expansionCap(parts.length));
    await expect(checkZipInflation(parts)).rejects.toThrow(/out of proportion/);
  });

  it("measures a real workbook and lets it through", async () => {
    const wb = await XlsxPopulate.fromBlankAsync();
    wb.sheet(0)!.cell("A1").value([["date", "instrument", "close"], ["2026-11-27", "EQ-A", 5]] as never);
    const bytes = new Uint8Array((await wb.outputAsync()) as Buffer);
    const measured = await checkZipInflation(bytes);
    expect(measured.inflatedBytes).toBe(checkZipProportions(bytes).expandedBytes);
    expect((await readTables(bytes))[0].header).toEqual(["date", "instrument", "close"]);
  });
});
