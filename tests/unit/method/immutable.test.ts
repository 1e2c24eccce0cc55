/** The database itself refuses to change or delete an approved method statement version (0003_method_immutable.sql). */
import { beforeAll, describe, expect, it } from "vitest";
import { freshDatabase } from "../helpers/db";
import type { Database } from "@/db/client";

let db: Database;
const FIRM = "00000000-0000-4000-8000-00000000f111";

async function insert(id: string, version: number, status: string) {
  await db.$client.execute({
    sql: `INSERT INTO method_statements (id, firm_id, version, status, content, rationale, limitations, evidence, reason, created_by, approved_by, approved_at, created_at)
          VALUES (?, ?, ?, ?, '{"minHistory":250}', 'A rationale', '["a limitation"]', '{"classes":[]}', '', 'u1', ?, ?, '2026-12-01T09:00:00Z')`,
    args: [id, FIRM, version, status, status === "draft" ? null : "u1", status === "draft" ? null : "2026-12-01T09:00:00Z"],
  });
}
const row = async (id: string) => (await db.$client.execute({ sql: "SELECT * FROM method_statements WHERE id = ?", args: [id] })).rows[0];

beforeAll(async () => {
  db = await freshDatabase();
  await insert("approved-1", 1, "approved");
  await insert("draft-2", 2, "draft");
});

describe("an approved version at the database", () => {
  for (const [column, value] of [
    ["content", "'{\"minHistory\":500}'"],
    ["rationale", "'rewritten'"],
    ["limitations", "'[]'"],
    ["evidence", "NULL"],
    ["reason", "'changed'"],
    ["approved_by", "'someone else'"],
    ["approved_at", "'2027-01-01'"],
    ["version", "9"],
    ["firm_id", "'another firm'"],
  ] as const) {
    it(`refuses UPDATE of ${column}`, async () => {
      const before = await row("approved-1");
      await expect(db.$client.execute(`UPDATE method_statements SET ${column} = ${value} WHERE id = 'approved-1'`)).rejects.toThrow(/approved method statement version cannot be changed/);
      expect(await row("approved-1")).toEqual(before);
    });
  }

  it("refuses a status other than superseded", async () => {
    for (const status of ["draft", "discarded"]) {
      await expect(db.$client.execute(`UPDATE method_statements SET status = '${status}' WHERE id = 'approved-1'`)).rejects.toThrow(/can only be superseded/);
    }
    expect((await row("approved-1")).status).toBe("approved");
  });

  it("refuses DELETE", async () => {
    await expect(db.$client.execute("DELETE FROM method_statements WHERE id = 'approved-1'")).rejects.toThrow(/cannot be deleted/);
    expect(await row("approved-1")).toBeDefined();
  });

  it("lets the status move to superseded, and then never back, and a superseded version is as fixed", async () => {
    await db.$client.execute("UPDATE method_statements SET status = 'superseded' WHERE id = 'approved-1'");
    expect((await row("approved-1")).status).toBe("superseded");
    await expect(db.$client.execute("UPDATE method_statements SET status = 'approved' WHERE id = 'approved-1'")).rejects.toThrow(/can only be superseded/);
    await expect(db.$client.execute("UPDATE method_statements SET rationale = 'x' WHERE id = 'approved-1'")).rejects.toThrow(/cannot be changed/);
    await expect(db.$client.execute("DELETE FROM method_statements WHERE id = 'approved-1'")).rejects.toThrow(/cannot be deleted/);
  });
});

describe("a draft at the database", () => {
  it("can be changed, approved, and (while a draft) deleted", async () => {
    await db.$client.execute("UPDATE method_statements SET rationale = 'edited', evidence = NULL WHERE id = 'draft-2'");
    expect((await row("draft-2")).rationale).toBe("edited");
    await insert("draft-3", 3, "draft");
    await db.$client.execute("DELETE FROM method_statements WHERE id = 'draft-3'");
    expect(await row("draft-3")).toBeUndefined();
    await db.$client.execute("UPDATE method_statements SET status = 'approved', approved_by = 'u1', approved_at = '2026-12-01' WHERE id = 'draft-2'");
    expect((await row("draft-2")).status).toBe("approved");
    await expect(db.$client.execute("UPDATE method_statements SET rationale = 'again' WHERE id = 'draft-2'")).rejects.toThrow(/cannot be changed/);
  });
});
