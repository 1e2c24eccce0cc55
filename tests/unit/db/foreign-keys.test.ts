/**
 * Foreign keys where a row refers to another row (db/migrations/0019_foreign_keys.sql and, for the instruments,
 * 0021_instrument_references.sql), and the triggers kept:
 * libSQL changes most columns in place, but run_inputs had to be rebuilt (its primary key is the reference), and a
 * dropped table takes its triggers with it, so 0020_foreign_keys_triggers_again.sql re-creates them. Checked here:
 * every trigger any migration creates still exists on its table after all migrations, the declared references name
 * the expected parents, the connection enforces them (libSQL's default), and a row pointing at a missing parent is
 * refused without changing anything.
 */
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { snapshot, worldDatabase } from "../helpers/db";
import type { Database } from "@/db/client";

const MIGRATIONS = path.join(__dirname, "../../../db/migrations");

/** Every trigger a migration file creates, with the table it is on, read from the files themselves. */
function triggersInMigrations(): Map<string, string> {
  const triggers = new Map<string, string>();
  for (const file of readdirSync(MIGRATIONS).filter((f) => f.endsWith(".sql")).sort()) {
    const text = readFileSync(path.join(MIGRATIONS, file), "utf8");
    for (const m of text.matchAll(/CREATE\s+TRIGGER\s+(?:IF\s+NOT\s+EXISTS\s+)?[`"]?(\w+)[`"]?\s+(?:BEFORE|AFTER|INSTEAD\s+OF)\s+[\s\S]*?\bON\s+[`"]?(\w+)[`"]?/gi)) {
      triggers.set(m[1], m[2]);
    }
  }
  return triggers;
}

async function rows(db: Database, sql: string): Promise<Record<string, unknown>[]> {
  return (await db.$client.execute(sql)).rows.map((r) => ({ ...r }));
}

/** table → "from column → parent table.column" for each declared reference. */
async function references(db: Database, table: string): Promise<string[]> {
  return (await rows(db, `PRAGMA foreign_key_list("${table}")`)).map((r) => `${r.from} → ${r.table}.${r.to}`).sort();
}

describe("triggers after all migrations", () => {
  let db: Database;
  beforeAll(async () => {
    db = await worldDatabase("migrated");
  });

  it("every trigger created in any migration still exists, on the same table", async () => {
    const expected = triggersInMigrations();
    // the migrations create the immutability and allowed-value triggers: far more than a handful
    expect(expected.size).toBeGreaterThan(40);
    expect(expected.get("run_inputs_no_update")).toBe("run_inputs");
    const present = new Map((await rows(db, "SELECT name, tbl_name FROM sqlite_master WHERE type = 'trigger'")).map((r) => [String(r.name), String(r.tbl_name)]));
    const missing = [...expected.keys()].filter((name) => !present.has(name));
    expect(missing).toEqual([]);
    for (const [name, table] of expected) expect(`${name} on ${present.get(name)}`).toBe(`${name} on ${table}`);
  });
});

describe("declared references", () => {
  let db: Database;
  beforeAll(async () => {
    db = await worldDatabase("method");
  });

  it("name the expected parents", async () => {
    const firm = "firm_id → firms.id";
    expect(await references(db, "uploads")).toEqual([firm, "period_id → reporting_periods.id"]);
    expect(await references(db, "positions")).toEqual([firm, "period_id → reporting_periods.id", "upload_id → uploads.id"]);
    expect(await references(db, "upload_parts")).toEqual([firm, "upload_id → uploads.id"]);
    expect(await references(db, "price_points")).toEqual([firm, "instrument_id → instruments.id", "upload_id → uploads.id"]);
    expect(await references(db, "instruments")).toEqual([firm, "pending_upload → uploads.id"]);
    expect(await references(db, "runs")).toEqual([
      "capital_profile_id → capital_rule_profiles.id",
      firm,
      "method_statement_id → method_statements.id",
      "period_id → reporting_periods.id",
      "positions_upload_id → uploads.id",
    ]);
    expect(await references(db, "run_inputs")).toEqual([firm, "run_id → runs.id"]);
    expect(await references(db, "run_details")).toEqual([firm, "run_id → runs.id"]);
    expect(await references(db, "filings")).toEqual([firm, "period_id → reporting_periods.id", "run_id → runs.id"]);
    for (const table of ["review_comments", "signatures", "pack_files"]) expect(await references(db, table)).toEqual(["filing_id → filings.id", firm]);
    expect(await references(db, "memberships")).toEqual([firm, "user_id → users.id"]);
  });

  it("are enforced on the app's connection, and the seeded demo data keeps them", async () => {
    expect(await rows(db, "PRAGMA foreign_keys")).toEqual([{ foreign_keys: 1 }]);
    expect(await rows(db, "PRAGMA foreign_key_check")).toEqual([]);
  });

  it("refuse a row pointing at a missing parent, and nothing changes", async () => {
    const [{ firm_id: firmId, period_id: periodId, upload_id: uploadId }] = await rows(db, "SELECT firm_id, period_id, upload_id FROM positions LIMIT 1");
    const before = await snapshot(db);
    const position = (firm: unknown, period: unknown, upload: unknown) => ({
      sql: `INSERT INTO positions (id, firm_id, period_id, upload_id, row_number, as_of, book, instrument_code, instrument_name, asset_class, currency, quantity, price, market_value)
            VALUES ('fk-test-position', ?, ?, ?, 1, '2026-11-30', 'Trading', 'X', 'X', 'equity', 'EUR', 1, 1, 1)`,
      args: [firm as string, period as string, upload as string],
    });
    await expect(db.$client.execute(position(firmId, periodId, "no-such-upload"))).rejects.toThrow(/FOREIGN KEY constraint failed/);
    await expect(db.$client.execute(position(firmId, "no-such-period", uploadId))).rejects.toThrow(/FOREIGN KEY constraint failed/);
    await expect(db.$client.execute(position("no-such-firm", periodId, uploadId))).rejects.toThrow(/FOREIGN KEY constraint failed/);
    await expect(
      db.$client.execute({ sql: "INSERT INTO upload_parts (id, firm_id, upload_id, part, seq, items) VALUES ('fk-test-part', ?, 'no-such-upload', 'rows', 0, '[]')", args: [firmId as string] }),
    ).rejects.toThrow(/FOREIGN KEY constraint failed/);
    await expect(
      db.$client.execute({ sql: "INSERT INTO price_points (id, firm_id, instrument_id, date, close, created_at) VALUES ('fk-test-close', ?, 'no-such-instrument', '2026-11-30', 1, '2026-12-01T09:00:00Z')", args: [firmId as string] }),
    ).rejects.toThrow(/FOREIGN KEY constraint failed/);
    await expect(db.$client.execute({ sql: "DELETE FROM instruments WHERE id = (SELECT instrument_id FROM price_points LIMIT 1)" })).rejects.toThrow(/FOREIGN KEY constraint failed/);
    await expect(
      db.$client.execute({ sql: "INSERT INTO run_inputs (run_id, firm_id, data, bytes, created_at) VALUES ('no-such-run', ?, x'00', 1, '2026-12-01T09:00:00Z')", args: [firmId as string] }),
    ).rejects.toThrow(/FOREIGN KEY constraint failed/);
    expect(await snapshot(db)).toEqual(before);
  });
});
