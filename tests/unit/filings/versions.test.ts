/**
 * After signing: a change makes version 2 (pointing at version 1, with the reason), the old signature is marked
 * superseded and stays visible; the hash of each version verifies against its stored content, and a tampered copy
 * does not; "filed" records the date and the regulator's reference and the period follows.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { attestation, filingWorld, type FilingWorld } from "./setup";
import { reportingPeriods } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { contentHash, type FilingViewModel } from "@/reports/view-model";
import { getPeriod } from "@/lib/data/periods";

let w: FilingWorld;
let v1: string;
let v1Hash: string;
let v2: string;
const data = () => import("@/lib/data/filings");
const period = async () => (await w.db.select().from(reportingPeriods).where(eq(reportingPeriods.id, w.periodId)))[0];

beforeAll(async () => {
  w = await filingWorld();
  const { prepareFiling, submitFiling, signFiling } = await data();
  v1 = (await prepareFiling(w.officer, w.periodId, { coverNote: "Version one." })).id;
  await submitFiling(w.officer, v1);
  v1Hash = (await signFiling(w.head, v1, attestation(w.head))).signature!.contentHash;
});

describe("a change after signing", () => {
  it("makes version 2, a draft pointing at version 1 with the reason, and supersedes version 1's signature", async () => {
    const { newFilingVersion, getFiling, listFilingVersions } = await data();
    expect((await period()).state).toBe("signed");
    const created = await newFilingVersion(w.officer, v1, { reason: "The cover note must name the new bond fund." });
    v2 = created.id;
    expect(created).toMatchObject({ version: 2, status: "draft", previousId: v1, previousVersion: 1, reason: "The cover note must name the new bond fund.", coverNote: "Version one.", signature: null });
    // the new version's content says so, and lists the superseded signature
    expect(created.content.filing.previousVersion).toBe(1);
    expect(created.content.filing.reason).toBe("The cover note must name the new bond fund.");
    const [{ signedAt, supersededAt }] = created.content.supersededSignatures;
    expect(created.content.supersededSignatures).toEqual([
      { version: 1, signerName: "Helen Marsh", licenceReference: "FMA-CH-2291", signedAt, contentHash: v1Hash, supersededAt, reason: "The cover note must name the new bond fund." },
    ]);
    // real times of the acts: superseded after it was signed, neither in the future
    expect(supersededAt >= signedAt).toBe(true);
    expect(Date.parse(supersededAt)).toBeLessThanOrEqual(Date.now());
    // version 1 is superseded, its signature visible as superseded, its content untouched
    const old = await getFiling(w.officer, v1);
    expect(old.status).toBe("superseded");
    expect(old.signature).toBeNull();
    expect(old.supersededSignatures).toHaveLength(1);
    expect(old.supersededSignatures[0]).toMatchObject({ contentHash: v1Hash, supersededReason: "The cover note must name the new bond fund.", supersededAt });
    expect(contentHash(old.content)).toBe(v1Hash);
    const versions = await listFilingVersions(w.head, w.periodId);
    expect(versions.map((v) => [v.version, v.status, v.signatures.map((s) => s.supersededAt !== null)])).toEqual([
      [2, "draft", []],
      [1, "superseded", [true]],
    ]);
    // the period is open again: its filing is a draft
    expect((await period()).state).toBe("open");
    expect((await getPeriod(w.officer, w.periodId)).steps.find((s) => s.key === "signoff")?.done).toBe(false);
  });

  it("is edited, reviewed and signed like the first; both signatures stay on record", async () => {
    const { updateFiling, submitFiling, signFiling, periodFiling } = await data();
    await updateFiling(w.officer, v2, { coverNote: "Version two: the book added the Northmoor bond fund." });
    await submitFiling(w.officer, v2);
    const signed = await signFiling(w.head, v2, { ...attestation(w.head), licenceReference: "FMA-CH-2291" });
    expect(signed.status).toBe("signed");
    expect(signed.signature!.contentHash).not.toBe(v1Hash);
    expect(signed.content.filing.changesSinceLast).toContain("The cover note differs from version 1.");
    const page = await periodFiling(w.head, w.periodId);
    expect(page.current?.id).toBe(v2);
    expect(page.versions.flatMap((v) => v.signatures.map((s) => [v.version, s.supersededAt === null]))).toEqual([
      [2, true],
      [1, false],
    ]);
    expect(page.lastLicenceReference).toBe("FMA-CH-2291");
  });

  it("cannot be started from a version that is not signed, or from the superseded one", async () => {
    const { newFilingVersion } = await data();
    const error = await newFilingVersion(w.officer, v1, { reason: "Again." }).catch((e: AppError) => e);
    expect((error as AppError).message).toBe("Version 1 is already superseded by a later version.");
  });
});

describe("verifying the hash", () => {
  it("recomputes each version's hash from its stored content and finds it equal to the signed one", async () => {
    const { verifyFiling } = await data();
    const current = await verifyFiling(w.officer, v2);
    expect(current).toMatchObject({ signed: true, matches: true, superseded: false, signerName: "Helen Marsh" });
    expect(current.recomputedHash).toBe(current.storedHash);
    expect(current.message).toContain("is exactly what Helen Marsh signed");
    const old = await verifyFiling(w.officer, v1);
    expect(old).toMatchObject({ signed: true, matches: true, superseded: true, storedHash: v1Hash });
  });

  it("finds a tampered copy different: one figure, one word", async () => {
    const { getFiling } = await data();
    const f = await getFiling(w.officer, v2);
    const stored = f.signature!.contentHash;
    const figure: FilingViewModel = { ...f.content, figures: { ...f.content.figures, capital: { ...f.content.figures.capital, capital: f.content.figures.capital.capital + 1 } } };
    const word: FilingViewModel = { ...f.content, filing: { ...f.content.filing, coverNote: f.content.filing.coverNote.replace("bond", "equity") } };
    expect(contentHash(figure)).not.toBe(stored);
    expect(contentHash(word)).not.toBe(stored);
    // the workflow fields outside the signed content do not change the hash
    expect(contentHash({ ...f.content, filing: { ...f.content.filing, status: "filed", filedAt: "2026-12-01", filingReference: "X" } })).toBe(stored);
  });

  it("reports a mismatch when the stored content is changed behind Ballast's back (the lock lifted to do it)", async () => {
    const { verifyFiling } = await data();
    await w.db.$client.execute("DROP TRIGGER filings_locked_no_update");
    await w.db.$client.execute({ sql: "UPDATE filings SET content = json_set(content, '$.figures.capital.capital', 1) WHERE id = ?", args: [v1] });
    const result = await verifyFiling(w.officer, v1);
    expect(result.matches).toBe(false);
    expect(result.recomputedHash).not.toBe(v1Hash);
    expect(result.message).toContain("is NOT what Helen Marsh signed");
  });
});

describe("filed", () => {
  it("refuses a date in the future or before the signature, naming the field, and changes nothing", async () => {
    const { markFiled } = await data();
    const future = await markFiled(w.officer, v2, { filedOn: "2026-12-02", reference: "R" }).catch((e: AppError) => e);
    expect((future as AppError).fields).toEqual({ filedOn: "The filing date cannot be in the future." });
    const early = await markFiled(w.officer, v2, { filedOn: "2026-11-30", reference: "R" }).catch((e: AppError) => e);
    expect((early as AppError).fields).toEqual({ filedOn: "The filing date cannot be before the signature (2026-12-01)." });
    expect((await period()).state).toBe("signed");
  });

  it("records the date and the regulator's reference on the version and the period", async () => {
    const { markFiled, verifyFiling, getFiling } = await data();
    const filed = await markFiled(w.officer, v2, { filedOn: "2026-12-01", reference: " FMA/2026/11/0042 " });
    expect(filed).toMatchObject({ status: "filed", filedAt: "2026-12-01", filingReference: "FMA/2026/11/0042" });
    expect(filed.content.filing).toMatchObject({ status: "filed", filedAt: "2026-12-01", filingReference: "FMA/2026/11/0042" });
    expect(await period()).toMatchObject({ state: "filed", filedAt: "2026-12-01", filingReference: "FMA/2026/11/0042" });
    const summary = await getPeriod(w.officer, w.periodId);
    expect(summary.nextStep).toBeNull();
    // filing does not change what was signed
    expect((await verifyFiling(w.officer, v2)).matches).toBe(true);
    expect((await getFiling(w.officer, v2)).signature?.supersededAt).toBeNull();
  });
});
