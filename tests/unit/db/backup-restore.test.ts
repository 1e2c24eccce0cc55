import { describe, expect, it } from "vitest";
import { writeFileSync } from "node:fs";
import path from "node:path";
import { freshDatabase, snapshot } from "../helpers/db";
import { backupDatabase } from "@/db/backup";
import { restoreDatabase, checkIntegrity } from "@/db/restore";
import { openDatabase } from "@/db/client";

describe("backup and restore", () => {
  it("round-trips every table, and the live database can be written during the backup", async () => {
    const db = await freshDatabase();
    const url = process.env.DATABASE_URL!;
    const dir = path.dirname(url.slice("file:".length));
    const before = await snapshot(db);
    // A write in flight while the copy is taken (WAL mode: readers and one writer at once).
    const [file] = await Promise.all([
      backupDatabase(path.join(dir, "copy.db"), url),
      db.$client.execute("INSERT INTO holidays (id, firm_id, date, name, created_at) VALUES ('h-during', 'f', '2030-01-01', 'x', '2026-12-01')"),
    ]);
    await checkIntegrity(file);
    const copy = openDatabase(`file:${file}`);
    const copied = await snapshot(copy);
    copy.$client.close();
    // The copy is the database at one moment: before the insert, or after it, never half of it.
    const withInsert = (await snapshot(db)) as Record<string, unknown[]>;
    expect([JSON.stringify(before), JSON.stringify(withInsert)]).toContain(JSON.stringify(copied));

    // Change the live database, then restore the copy and find it exactly as copied.
    await db.$client.execute("DELETE FROM holidays");
    db.$client.close();
    await restoreDatabase(file, url);
    const restored = openDatabase(url);
    expect(await snapshot(restored)).toEqual(copied);
    restored.$client.close();
  });

  it("refuses a damaged backup and leaves the live database alone", async () => {
    const db = await freshDatabase();
    const url = process.env.DATABASE_URL!;
    const bad = path.join(path.dirname(url.slice("file:".length)), "damaged.db");
    writeFileSync(bad, "SQLite format 3\u0000 but not really a database");
    const before = await snapshot(db);
    await expect(restoreDatabase(bad, url)).rejects.toThrow(/damaged\.db/);
    expect(await snapshot(db)).toEqual(before);
  });
});
