/**
 * A signed filing is locked at the database (db/migrations/0007_filings_locked.sql): statements sent straight to
 * SQLite cannot change or delete a signed version's content or its signature; the status moves only signed → filed
 * (with date and reference) or signed → superseded; a signature is marked superseded once and never otherwise
 * changed; review comments are permanent; a version is created as a draft and signed only from review with a
 * signature in force. Through the data layer, a change to a signed version is refused with nothing changed.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { attestation, filingWorld, type FilingWorld } from "./setup";
import { snapshot } from "../helpers/db";
import { AppError } from "@/lib/errors";

let w: FilingWorld;
let filingId: string;
let signatureId: string;
const data = () => import("@/lib/data/filings");
const row = async (table: string, id: string) => (await w.db.$client.execute({ sql: `SELECT * FROM ${table} WHERE id = ?`, args: [id] })).rows[0];

beforeAll(async () => {
  w = await filingWorld();
  const { prepareFiling, submitFiling, commentOnFiling, signFiling } = await data();
  filingId = (await prepareFiling(w.officer, w.periodId, { coverNote: "As signed." })).id;
  await submitFiling(w.officer, filingId);
  await commentOnFiling(w.head, filingId, { section: "capital", body: "Fine." });
  signatureId = (await signFiling(w.head, filingId, attestation(w.head))).signature!.id;
});

/** `UPDATE table SET column = value` on the row `id` is refused with `message`, and the row is as it was. */
async function expectUpdateRefused(table: string, id: string, column: string, value: string, message: RegExp) {
  const before = await row(table, id);
  await expect(w.db.$client.execute({ sql: `UPDATE ${table} SET ${column} = ${value} WHERE id = ?`, args: [id] }), column).rejects.toThrow(message);
  expect(await row(table, id)).toEqual(before);
}

/** A signed version's columns, each with a change to it (SQL literals). */
const FILING_CHANGES = { content: `'{"figures":{}}'`, cover_note: "'rewritten'", reason: "'a reason'", run_id: "'another run'", version: "7",
  previous_id: "'x'", prepared_by: "'someone'", submitted_by: "NULL", period_id: "'another period'", firm_id: "'another firm'" };
/** A signature's columns but its superseding, each with a change to it. */
const SIGNATURE_CHANGES = { content_hash: `'${"0".repeat(64)}'`, signer_name: "'Someone Else'", signer_id: "'x'", licence_reference: "'X'",
  signed_at: "'2020-01-01'", attestation: "''", superseded_reason: "'no time given'" };

describe("a signed version at the database", () => {
  for (const [column, value] of Object.entries(FILING_CHANGES)) {
    it(`refuses UPDATE of ${column}`, async () => {
      await expectUpdateRefused("filings", filingId, column, value, /a signed filing cannot be changed: a change makes a new version/);
    });
  }

  it("refuses a content change even when it rides along a legal status move", async () => {
    await expect(w.db.$client.execute({ sql: `UPDATE filings SET status = 'filed', filed_at = '2026-12-01', filing_reference = 'R', cover_note = 'x' WHERE id = ?`, args: [filingId] })).rejects.toThrow(/cannot be changed/);
    expect((await row("filings", filingId)).status).toBe("signed");
  });

  it("refuses moving back to draft or review, and filing without a date and reference", async () => {
    for (const sql of [
      "UPDATE filings SET status = 'draft' WHERE id = ?",
      "UPDATE filings SET status = 'in_review' WHERE id = ?",
      "UPDATE filings SET status = 'filed' WHERE id = ?",
      "UPDATE filings SET status = 'filed', filed_at = '2026-12-01' WHERE id = ?",
      "UPDATE filings SET status = 'filed', filed_at = '2026-12-01', filing_reference = '  ' WHERE id = ?",
      "UPDATE filings SET filing_reference = 'R' WHERE id = ?",
    ]) {
      await expect(w.db.$client.execute({ sql, args: [filingId] }), sql).rejects.toThrow(/can only be filed \(with its date and reference\) or superseded/);
    }
    expect((await row("filings", filingId)).status).toBe("signed");
  });

  it("refuses DELETE of the filing and of its signature", async () => {
    await expect(w.db.$client.execute({ sql: "DELETE FROM filings WHERE id = ?", args: [filingId] })).rejects.toThrow(/a signed filing cannot be deleted/);
    await expect(w.db.$client.execute({ sql: "DELETE FROM signatures WHERE id = ?", args: [signatureId] })).rejects.toThrow(/a signature cannot be deleted/);
    expect(await row("filings", filingId)).toBeDefined();
    expect(await row("signatures", signatureId)).toBeDefined();
  });

  it("refuses any change to a signature but marking it superseded", async () => {
    for (const [column, value] of Object.entries(SIGNATURE_CHANGES)) await expectUpdateRefused("signatures", signatureId, column, value, /a signature cannot be changed/);
  });

  it("refuses a second signature while one is in force, and a signature on a version not in review", async () => {
    await expect(
      w.db.$client.execute({
        sql: `INSERT INTO signatures (id, firm_id, filing_id, signer_id, signer_name, licence_reference, content_hash, signed_at, created_at) VALUES ('s2', ?, ?, 'u', 'n', 'r', 'h', 't', 't')`,
        args: [w.officer.firmId, filingId],
      }),
    ).rejects.toThrow(/only a filing in review can be signed/);
  });

  it("keeps review comments: no change, no deletion", async () => {
    const [comment] = (await w.db.$client.execute({ sql: "SELECT id FROM review_comments WHERE filing_id = ?", args: [filingId] })).rows;
    await expect(w.db.$client.execute({ sql: "UPDATE review_comments SET body = 'x' WHERE id = ?", args: [comment.id] })).rejects.toThrow(/a review comment cannot be changed/);
    await expect(w.db.$client.execute({ sql: "DELETE FROM review_comments WHERE id = ?", args: [comment.id] })).rejects.toThrow(/a review comment cannot be deleted/);
  });
});

describe("versions start as drafts and are signed only from review", () => {
  it("refuses inserting a version that is not a draft", async () => {
    await expect(
      w.db.$client.execute({
        sql: `INSERT INTO filings (id, firm_id, period_id, run_id, version, status, content, prepared_by, created_at) VALUES ('f9', ?, 'p9', 'r', 1, 'signed', '{}', 'u', 't')`,
        args: [w.officer.firmId],
      }),
    ).rejects.toThrow(/a filing version starts as a draft/);
  });

  it("refuses moving a draft straight to signed, and a version in review to signed without a signature", async () => {
    // the filing's period and run are declared references (0019_foreign_keys.sql): a period of its own, one of the firm's runs
    await w.db.$client.execute({
      sql: "INSERT INTO reporting_periods (id, firm_id, period_end, deadline, state, created_at) VALUES ('p8', ?, '2099-01-31', '2099-02-20', 'open', 't')",
      args: [w.officer.firmId],
    });
    await w.db.$client.execute({
      sql: `INSERT INTO filings (id, firm_id, period_id, run_id, version, status, content, prepared_by, created_at)
            VALUES ('f8', ?1, 'p8', (SELECT id FROM runs WHERE firm_id = ?1 LIMIT 1), 1, 'draft', '{}', 'u', 't')`,
      args: [w.officer.firmId],
    });
    await expect(w.db.$client.execute("UPDATE filings SET status = 'signed' WHERE id = 'f8'")).rejects.toThrow(/becomes signed only from review and only with a signature in force/);
    await w.db.$client.execute("UPDATE filings SET status = 'in_review' WHERE id = 'f8'");
    await expect(w.db.$client.execute("UPDATE filings SET status = 'signed' WHERE id = 'f8'")).rejects.toThrow(/only with a signature in force/);
    // an unsigned draft can still be changed and deleted
    await w.db.$client.execute("UPDATE filings SET status = 'draft', cover_note = 'edited' WHERE id = 'f8'");
    await w.db.$client.execute("DELETE FROM filings WHERE id = 'f8'");
    expect(await row("filings", "f8")).toBeUndefined();
    await w.db.$client.execute("DELETE FROM reporting_periods WHERE id = 'p8'");
  });
});

describe("through the data layer", () => {
  it("refuses editing the signed version with a clear message, and nothing changes", async () => {
    const { updateFiling } = await data();
    const before = await snapshot(w.db);
    const error = await updateFiling(w.officer, filingId, { coverNote: "A quiet change." }).catch((e: AppError) => e);
    expect(error).toBeInstanceOf(AppError);
    expect((error as AppError).code).toBe("conflict:filing_locked");
    expect((error as AppError).message).toBe("Version 1 is signed and locked. A change makes a new version: start version 2 with the reason for the change.");
    expect(await snapshot(w.db)).toEqual(before);
  });

  it("lets the signature be marked superseded once, then never again", async () => {
    await w.db.$client.execute({ sql: "UPDATE signatures SET superseded_at = '2026-12-01T10:00:00.000Z', superseded_reason = 'test' WHERE id = ?", args: [signatureId] });
    await expect(w.db.$client.execute({ sql: "UPDATE signatures SET superseded_at = '2026-12-02T10:00:00.000Z', superseded_reason = 'again' WHERE id = ?", args: [signatureId] })).rejects.toThrow(/a signature cannot be changed/);
    expect((await row("signatures", signatureId)).superseded_reason).toBe("test");
  });
});
