import { beforeAll, describe, expect, it } from "vitest";
import { freshDatabase } from "../helpers/db";
import type { Database } from "@/db/client";

describe("audit events are permanent", () => {
  let db: Database;
  beforeAll(async () => {
    db = await freshDatabase();
  });

  it("refuses UPDATE at the database, whoever asks", async () => {
    await expect(db.$client.execute("UPDATE audit_events SET summary = 'rewritten'")).rejects.toThrow(/audit events cannot be changed/);
  });

  it("refuses DELETE at the database", async () => {
    await expect(db.$client.execute("DELETE FROM audit_events")).rejects.toThrow(/audit events cannot be deleted/);
    const { rows } = await db.$client.execute("SELECT count(*) AS n FROM audit_events");
    expect(Number(rows[0].n)).toBeGreaterThan(0);
  });
});
