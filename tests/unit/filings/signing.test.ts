/**
 * Signing: four eyes (the preparer, the submitter and the person who started the run cannot sign; a firm with nobody
 * else is told why), the attestation (ticked, the signer's own name, a reference), the password entered again (a
 * wrong one refused, audited and rate-limited like sign-in), and what a signature stores.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { actorFor, auditRecords } from "../helpers/db";
import { attestation, NORTHMOOR, preparedFilingWorld, setActive, withRoles, type FilingWorld } from "./setup";
import { filings, reportingPeriods, signatures } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { MAX_FAILURES_PER_ACCOUNT } from "@/lib/auth/rate-limit";
import { contentHash, type FilingViewModel } from "@/reports/view-model";
import type { Actor } from "@/lib/auth/actor";

let w: FilingWorld;
let filingId: string;
let nia: Actor;
const data = () => import("@/lib/data/filings");

async function fingerprint() {
  const out: Record<string, unknown[]> = {};
  for (const table of ["filings", "signatures", "review_comments", "reporting_periods", "audit_events"]) {
    out[table] = (await w.db.$client.execute(`SELECT * FROM ${table} ORDER BY rowid`)).rows.map((r) => ({ ...r }));
  }
  return out;
}

async function refusedUnchanged(call: () => Promise<unknown>): Promise<AppError> {
  const before = await fingerprint();
  const error = await call().then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(AppError);
  expect(await fingerprint()).toEqual(before);
  return error as AppError;
}

const refusedAudits = async (userId: string) => auditRecords("filing.sign_refused", { actorId: userId });

beforeAll(async () => {
  // Priya (risk analyst) starts the run; Tomas prepares; Nia (compliance officer + risk analyst) submits.
  ({ filingId, ...w } = await preparedFilingWorld());
  nia = await actorFor(NORTHMOOR.analystOfficer);
  const { submitFiling } = await data();
  await submitFiling(nia, filingId);
});

describe("four eyes", () => {
  it("refuses the preparer, naming the rule and who else can sign", async () => {
    const { signFiling } = await data();
    const tomas = await withRoles(NORTHMOOR.officer, ["compliance_officer", "compliance_head"]);
    const error = await refusedUnchanged(() => signFiling(tomas, filingId, attestation(tomas)));
    expect(error.code).toBe("forbidden:four_eyes");
    expect(error.status).toBe(403);
    expect(error.message).toBe(
      "You prepared this filing, so you cannot also sign it. A filing is signed by a compliance head who did not prepare it, submit it or start its run, so that two people have looked at it. Ask Helen Marsh to sign it.",
    );
    await withRoles(NORTHMOOR.officer, ["compliance_officer"]);
  });

  it("refuses the submitter", async () => {
    const { signFiling } = await data();
    const submitter = await withRoles(NORTHMOOR.analystOfficer, ["compliance_officer", "risk_analyst", "compliance_head"]);
    const error = await refusedUnchanged(() => signFiling(submitter, filingId, attestation(submitter)));
    expect(error.message).toMatch(/^You submitted this filing, so you cannot also sign it\./);
    await withRoles(NORTHMOOR.analystOfficer, ["compliance_officer", "risk_analyst"]);
  });

  it("refuses the person who started the run", async () => {
    const { signFiling } = await data();
    const starter = await withRoles(NORTHMOOR.analyst, ["risk_analyst", "compliance_head"]);
    const error = await refusedUnchanged(() => signFiling(starter, filingId, attestation(starter)));
    expect(error.message).toMatch(/^You started the run of this filing, so you cannot also sign it\./);
    await withRoles(NORTHMOOR.analyst, ["risk_analyst"]);
  });

  it("tells a firm where nobody else holds the role why it cannot sign at all", async () => {
    const { signFiling } = await data();
    // the one compliance head is also the compliance officer who prepared it; the other head has left
    await setActive(NORTHMOOR.head, false);
    const both = await withRoles(NORTHMOOR.officer, ["compliance_officer", "compliance_head"]);
    const error = await refusedUnchanged(() => signFiling(both, filingId, attestation(both)));
    expect(error.message).toContain("You prepared this filing, so you cannot also sign it.");
    expect(error.message).toContain("No one else at Northmoor Brokerage Ltd can sign it: the firm has no other active compliance head who was not involved.");
    expect(error.message).toContain("Settings → Members");
    await withRoles(NORTHMOOR.officer, ["compliance_officer"]);
    await setActive(NORTHMOOR.head, true);
  });

  it("is said on the page before anyone tries: a note for the involved, none for the head who may sign", async () => {
    const { fourEyesNote } = await data();
    expect(await fourEyesNote(w.head, filingId)).toBeNull();
    const starter = await withRoles(NORTHMOOR.analyst, ["risk_analyst", "compliance_head"]);
    expect(await fourEyesNote(starter, filingId)).toMatch(/^You started the run of this filing, so you cannot also sign it\..* Ask Helen Marsh to sign it\.$/);
    await withRoles(NORTHMOOR.analyst, ["risk_analyst"]);
  });

  it("checks four eyes before the password, so nothing is counted against the person", async () => {
    const { signFiling } = await data();
    const starter = await withRoles(NORTHMOOR.analyst, ["risk_analyst", "compliance_head"]);
    await refusedUnchanged(() => signFiling(starter, filingId, attestation(starter, "wrong")));
    expect(await refusedAudits(starter.userId)).toHaveLength(0);
    await withRoles(NORTHMOOR.analyst, ["risk_analyst"]);
  });
});

describe("attestation", () => {
  it("refuses without the box ticked, naming the field", async () => {
    const { signFiling } = await data();
    const error = await refusedUnchanged(() => signFiling(w.head, filingId, { ...attestation(w.head), attest: false as unknown as true }));
    expect(error.code).toBe("unprocessable:attestation");
    expect(error.fields).toEqual({ attest: "Tick the attestation to sign." });
  });

  it("refuses a name other than the signer's own, and an empty reference", async () => {
    const { signFiling } = await data();
    const error = await refusedUnchanged(() => signFiling(w.head, filingId, { ...attestation(w.head), signerName: "Tomas Reyne", licenceReference: " " }));
    expect(error.fields).toEqual({ signerName: "Type your name as Ballast knows it: Helen Marsh.", licenceReference: "Enter your licence or registration reference." });
  });
});

describe("password", () => {
  it("refuses a wrong password with a field message and records the refusal, changing nothing else", async () => {
    const { signFiling } = await data();
    const before = await fingerprint();
    const error = await signFiling(w.head, filingId, attestation(w.head, "not-my-password")).catch((e: AppError) => e);
    expect(error).toBeInstanceOf(AppError);
    expect((error as AppError).code).toBe("unprocessable:sign_password");
    expect((error as AppError).fields).toEqual({ password: "The password is not correct." });
    const after = await fingerprint();
    expect({ ...after, audit_events: after.audit_events.slice(0, before.audit_events.length) }).toEqual(before);
    const added = after.audit_events.slice(before.audit_events.length) as { action: string; actor_name: string; entity_id: string }[];
    expect(added.map((a) => [a.action, a.actor_name, a.entity_id])).toEqual([["filing.sign_refused", "Helen Marsh", filingId]]);
  });
});

describe("a signature", () => {
  it("stores the signer, the time, the reference, the attestation and the SHA-256 of the content exactly as signed", async () => {
    const { signFiling, getFiling, verifyFiling } = await data();
    const [stored] = await w.db.select().from(filings).where(eq(filings.id, filingId));
    const expected = contentHash(stored.content as unknown as FilingViewModel);
    const before = Date.now();
    const signed = await signFiling(w.head, filingId, { ...attestation(w.head), signerName: "  helen   MARSH " });
    expect(signed.status).toBe("signed");
    const [sig] = await w.db.select().from(signatures).where(eq(signatures.filingId, filingId));
    expect(sig).toMatchObject({ signerId: w.head.userId, signerName: "Helen Marsh", licenceReference: "FMA-CH-2291", contentHash: expected, supersededAt: null });
    // the real time of the act (not the pinned business day), the same instant as the audit record
    expect(Date.parse(sig.signedAt)).toBeGreaterThanOrEqual(before);
    expect(Date.parse(sig.signedAt)).toBeLessThanOrEqual(Date.now());
    const [signEvent] = await auditRecords("filing.sign", { entityId: filingId });
    expect(signEvent.at).toBe(sig.signedAt);
    expect(sig.attestation).toContain("By signing, the compliance head confirms");
    // the sign-off block is in the stored content, and the hash of the stored content is unchanged by it
    const after = await getFiling(w.head, filingId);
    expect(after.content.signOff).toEqual({ signerName: "Helen Marsh", licenceReference: "FMA-CH-2291", signedAt: sig.signedAt, contentHash: expected });
    expect(contentHash(after.content)).toBe(expected);
    expect(after.signature?.contentHash).toBe(expected);
    expect((await verifyFiling(await actorFor(NORTHMOOR.auditor), filingId)).matches).toBe(true);
    const [period] = await w.db.select().from(reportingPeriods).where(eq(reportingPeriods.id, w.periodId));
    expect(period.state).toBe("signed");
    const [event] = await auditRecords("filing.sign", { entityId: filingId });
    expect((event.detail as { contentHash: string }).contentHash).toBe(expected);
  });
});

describe("rate limit", () => {
  it(`refuses signing after ${MAX_FAILURES_PER_ACCOUNT} wrong passwords in the window, even with the right one`, async () => {
    const { signFiling, newFilingVersion, submitFiling } = await data();
    // a new version to sign (the signed one is locked)
    const v2 = await newFilingVersion(w.officer, filingId, { reason: "The cover note needs the fund's name." });
    await submitFiling(w.officer, v2.id);
    // one wrong password is already recorded above
    for (let i = 1; i < MAX_FAILURES_PER_ACCOUNT; i++) {
      const error = await signFiling(w.head, v2.id, attestation(w.head, `wrong-${i}`)).catch((e: AppError) => e);
      expect((error as AppError).code).toBe("unprocessable:sign_password");
    }
    expect(await refusedAudits(w.head.userId)).toHaveLength(MAX_FAILURES_PER_ACCOUNT);
    const error = await refusedUnchanged(() => signFiling(w.head, v2.id, attestation(w.head)));
    expect(error.code).toBe("rate_limited:sign");
    expect(error.status).toBe(429);
    expect(error.message).toBe("Too many wrong passwords at signing. Wait 15 minutes and try again.");
  });
});
