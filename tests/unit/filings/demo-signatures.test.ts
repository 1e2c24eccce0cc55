/**
 * The one canonical form (lib/domain/canonical.ts) keeps the demo's stored hashes valid: the signature stored when
 * the seed signed Northmoor's October filing verifies, and equals an independent computation of the same form
 * (key-sorted JSON written with JSON.stringify for each leaf, hashed by node:crypto's SHA-256); each stored
 * run's input hashes are reproduced from its stored inputs.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import { actorFor, PEOPLE, runsDatabase } from "../runs/setup";
import type { Database } from "@/db/client";
import { filings, runInputs, runs, signatures } from "@/db/schema";
import { seedDemoHistory } from "@/db/seed-history";
import type { Actor } from "@/lib/auth/actor";
import { verifyFiling } from "@/lib/data/filings";
import { unpackInputs } from "@/lib/data/runs";
import { inputHashesOf } from "@/lib/runs/compare";
import { signedContent } from "@/reports/canonical";
import type { FilingViewModel } from "@/reports/view-model";
import { referenceJson } from "../helpers/reference-json";

const sha256 = (text: string) => createHash("sha256").update(text, "utf8").digest("hex");

let db: Database;
let officer: Actor;

beforeAll(async () => {
  db = await runsDatabase({ withMethod: true });
  await seedDemoHistory(db); // signs and files Northmoor's October
  officer = await actorFor(PEOPLE.officer);
});

describe("the seeded demo's stored hashes under the one canonical form", () => {
  it("every stored signature verifies, and equals the reference serialisation of the signed content", async () => {
    const rows = await db.select({ s: signatures, f: filings }).from(signatures).innerJoin(filings, eq(filings.id, signatures.filingId)).where(eq(signatures.firmId, officer.firmId));
    expect(rows.length).toBeGreaterThan(0);
    for (const { s, f } of rows) {
      const verified = await verifyFiling(officer, f.id);
      expect(verified.signed).toBe(true);
      expect(verified.storedHash).toBe(s.contentHash);
      expect(verified.matches, verified.message).toBe(true);
      const independent = sha256(referenceJson(signedContent(f.content as unknown as FilingViewModel)));
      expect(independent).toBe(s.contentHash);
    }
  });

  it("a changed figure no longer verifies (the check can fail)", async () => {
    const [{ f }] = await db.select({ f: filings }).from(signatures).innerJoin(filings, eq(filings.id, signatures.filingId)).where(eq(signatures.firmId, officer.firmId));
    const [s] = await db.select().from(signatures).where(eq(signatures.filingId, f.id));
    const content = structuredClone(f.content) as unknown as FilingViewModel;
    content.figures.capital.capital += 1;
    expect(sha256(referenceJson(signedContent(content)))).not.toBe(s.contentHash);
  });

  it("every stored run's input hashes are reproduced from its stored inputs", async () => {
    const rows = await db.select({ hashes: runs.inputHashes, data: runInputs.data }).from(runs).innerJoin(runInputs, eq(runInputs.runId, runs.id)).where(eq(runs.firmId, officer.firmId));
    expect(rows.length).toBeGreaterThan(0);
    for (const row of rows) expect(inputHashesOf(unpackInputs(row.data as Buffer))).toEqual(row.hashes);
  });
});
