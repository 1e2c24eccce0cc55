import { describe, expect, it } from "vitest";
import { getTableConfig, SQLiteTable } from "drizzle-orm/sqlite-core";
import * as schema from "@/db/schema";

/** Tables that exist before or across firms (jobs: the queue holds work for one firm or, like the reminder round, for all). Everything else belongs to one firm. */
const GLOBAL_TABLES = new Set(["firms", "users", "sign_in_attempts", "account_tokens", "account_requests", "install_steps", "jobs"]);

describe("tenant scope in the schema", () => {
  const tables = (Object.values(schema) as unknown[]).filter((value): value is SQLiteTable => value instanceof SQLiteTable);

  it("finds the tables", () => {
    expect(tables.length).toBeGreaterThanOrEqual(18);
  });

  it("gives every tenant table a non-null firm_id", () => {
    const missing = tables
      .map((table) => getTableConfig(table))
      .filter((config) => !GLOBAL_TABLES.has(config.name))
      .filter((config) => !config.columns.some((c) => c.name === "firm_id" && c.notNull))
      .map((config) => config.name);
    expect(missing).toEqual([]);
  });
});
