/**
 * Status, state and kind columns refuse a value the code does not know (db/migrations/0016_enum_checks.sql and
 * 0018_upload_status_checks.sql), naming
 * the column and the allowed values. The lists in the migration are checked against the code's own types: the
 * `Exactly` lines fail the type check when a value is added to a type and not to the migration, or the other way round.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { freshDatabase } from "../helpers/db";
import type { Database } from "@/db/client";
import type { JobState } from "@/lib/jobs/queue";
import type { ReminderStatus } from "@/lib/data/reminder-log";
import type { MethodStatus } from "@/lib/data/method";
import type { CommentView, FilingRowStatus } from "@/lib/data/filings";
import type { RunStatus } from "@/lib/runs/types";
import type { UploadKind, UploadStatus } from "@/lib/data/uploads";
import type { PartName } from "@/lib/data/uploads/parts";
import type { CapitalRegime, RegimeChoice } from "@/lib/validation/capital-profile";

/** A list holding every member of the union T and nothing else (a missing or stray value is a type error). */
function exactly<T extends string>() {
  return <L extends readonly T[]>(list: L & ([T] extends [L[number]] ? unknown : { missing: Exclude<T, L[number]> })) => list;
}

const EXPECTED: Record<string, readonly string[]> = {
  "reporting_periods.state": ["open", "in_review", "signed", "filed"],
  "runs.status": exactly<RunStatus>()(["queued", "running", "completed", "failed"]),
  "filings.status": exactly<FilingRowStatus>()(["draft", "in_review", "changes_requested", "signed", "filed", "superseded"]),
  "review_comments.kind": exactly<CommentView["kind"]>()(["comment", "changes_requested", "reply", "submission_note"]),
  "method_statements.status": exactly<MethodStatus>()(["draft", "approved", "superseded", "discarded"]),
  "capital_rule_profiles.regimes": exactly<RegimeChoice>()(["internal_models", "standardised", "both"]),
  "capital_rule_profiles.filed_regime": exactly<CapitalRegime>()(["internal_models", "standardised"]),
  "reminder_log.status": exactly<ReminderStatus>()(["pending", "sending", "sent", "retry", "failed", "skipped"]),
  "jobs.state": exactly<JobState>()(["queued", "running", "completed", "failed", "interrupted"]),
  "pack_files.state": exactly<Exclude<FilingRowStatus, "in_review" | "changes_requested">>()(["draft", "signed", "filed", "superseded"]),
  "pack_files.format": ["docx", "xlsx"],
  "uploads.kind": exactly<UploadKind>()(["positions", "prices"]),
  "uploads.status": exactly<UploadStatus>()(["reading", "pending", "duplicate", "failed", "confirming", "confirmed", "cancelled", "superseded"]),
  "upload_parts.part": exactly<PartName>()(["rows", "problems"]),
};

const migration = ["0016_enum_checks.sql", "0018_upload_status_checks.sql"].map((f) => readFileSync(path.join(__dirname, "../../../db/migrations", f), "utf8")).join("\n");

/** The allowed lists written in the migration's insert triggers, by table.column. */
function migrationLists(): Record<string, string[]> {
  const lists: Record<string, string[]> = {};
  for (const m of migration.matchAll(/CREATE TRIGGER (\w+)_allowed_insert BEFORE INSERT ON (\w+)\nWHEN NEW\.(\w+) NOT IN \(([^)]*)\)/g)) {
    lists[`${m[2]}.${m[3]}`] = m[4].split(",").map((v) => v.trim().replace(/^'|'$/g, ""));
  }
  return lists;
}

let db: Database;
beforeAll(async () => {
  db = await freshDatabase();
});

describe("status, state and kind columns", () => {
  it("allow exactly the values the code's types name", () => {
    expect(migrationLists()).toEqual(EXPECTED);
  });

  it("refuse an unknown value on insert, naming the column and the allowed values, and store nothing", async () => {
    for (const [column, allowed] of Object.entries(EXPECTED)) {
      const [table, name] = column.split(".");
      const before = Number((await db.$client.execute(`SELECT count(*) AS n FROM "${table}"`)).rows[0].n);
      // the trigger runs before the row's other constraints are checked, so the one column is enough
      await expect(db.$client.execute(`INSERT INTO "${table}" ("${name}") VALUES ('not-a-value')`), column).rejects.toThrow(`${column} must be one of: ${allowed.join(", ")}`);
      expect(Number((await db.$client.execute(`SELECT count(*) AS n FROM "${table}"`)).rows[0].n)).toBe(before);
    }
  });

  it("refuse an unknown value on update, and leave the row as it was", async () => {
    const open = await db.$client.execute(`SELECT id FROM reporting_periods WHERE state = 'open' LIMIT 1`);
    const id = String(open.rows[0].id);
    await expect(db.$client.execute({ sql: `UPDATE reporting_periods SET state = 'closed' WHERE id = ?`, args: [id] })).rejects.toThrow("reporting_periods.state must be one of: open, in_review, signed, filed");
    const after = await db.$client.execute({ sql: `SELECT state FROM reporting_periods WHERE id = ?`, args: [id] });
    expect(after.rows[0].state).toBe("open");
  });
});
