/** Signing a filing (four eyes, password, attestation), a new version after signing, recording it as filed, and verifying the signature. */
import "server-only";
import { createHash } from "node:crypto";
import { and, count, eq, gte } from "drizzle-orm";
import { getDb } from "@/db/client";
import { auditEvents, filings, memberships, reportingPeriods, signatures, users } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import { can } from "@/lib/auth/permissions";
import { parseRoles } from "@/lib/auth/roles";
import { verifyPassword } from "@/lib/auth/password";
import { MAX_FAILURES_PER_ACCOUNT, RATE_WINDOW_MINUTES } from "@/lib/auth/rate-limit";
import { now, today } from "@/lib/clock";
import type { RunRecord } from "@/lib/runs/types";
import type { MarkFiledInput, NewFilingVersionInput, SignFilingInput } from "@/lib/validation/filings";
import { contentHash, type FilingViewModel, type SupersededSignature } from "@/reports/view-model";
import { filingRunOf, getRun } from "../runs";
import { enqueuePackRender } from "../packs";
import { assertRunFresh } from "../run-freshness";
import { FilingRowStatus, FilingDetail, VerifyResult, FilingRow, LOCKED, attestationText } from "./types";
import { findRow, findPeriod, signaturesOf, getFiling } from "./read";
import { assemble, explanationsOf, markedCompletedRun, supersededOf, lockedMessage, raced, updateFilingWhile } from "./assemble";

const normaliseName = (s: string) => s.trim().replace(/\s+/g, " ").toLocaleLowerCase("en");

/** Why this person may not sign this version under the four-eyes rule, or null when they may. */
async function fourEyesRefusal(actor: Actor, row: FilingRow, run: RunRecord): Promise<string | null> {
  const roles: string[] = [];
  if (row.preparedBy === actor.userId) roles.push("prepared");
  if (row.submittedBy === actor.userId) roles.push("submitted");
  if (run.startedBy === actor.userId) roles.push("started the run of");
  if (!roles.length) return null;
  const involved = new Set([row.preparedBy, row.submittedBy, run.startedBy].filter((x): x is string => !!x));
  const members = await getDb()
    .select({ userId: memberships.userId, roles: memberships.roles, name: users.name })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.firmId, actor.firmId), eq(memberships.active, true), eq(users.active, true)));
  const others = members.filter((m) => !involved.has(m.userId) && parseRoles(m.roles).includes("compliance_head")).map((m) => m.name);
  const what = roles.length === 1 ? roles[0] : `${roles.slice(0, -1).join(", ")} and ${roles[roles.length - 1]}`;
  const rule = "A filing is signed by a compliance head who did not prepare it, submit it or start its run, so that two people have looked at it.";
  const way = others.length
    ? `Ask ${others.length === 1 ? others[0] : `${others.slice(0, -1).join(", ")} or ${others[others.length - 1]}`} to sign it.`
    : `No one else at ${actor.firmName} can sign it: the firm has no other active compliance head who was not involved. An administrator can give a second person the compliance head role (Settings → Members), or another compliance officer can prepare and submit the filing.`;
  return `You ${what} this filing, so you cannot also sign it. ${rule} ${way}`;
}

/** Why this person cannot sign this version under the four-eyes rule (the page says so before they try), or null. */
export async function fourEyesNote(actor: Actor, filingId: string): Promise<string | null> {
  const row = await findRow(actor, filingId);
  return fourEyesRefusal(actor, row, await getRun(actor, row.runId, { detail: false }));
}

/** Failed signing passwords of this person in the rate window (the same window and limit as sign-in). */
async function recentPasswordFailures(actor: Actor): Promise<number> {
  const since = new Date(Date.now() - RATE_WINDOW_MINUTES * 60_000).toISOString();
  const [row] = await getDb()
    .select({ n: count() })
    .from(auditEvents)
    .where(and(eq(auditEvents.firmId, actor.firmId), eq(auditEvents.actorId, actor.userId), eq(auditEvents.action, "filing.sign_refused"), gte(auditEvents.at, since)));
  return row?.n ?? 0;
}

/**
 * Sign a version in review: compliance head; four eyes; attestation with the signer's own name and reference; the
 * password entered again. Stores the signature with the SHA-256 of the canonical content, locks the version and moves
 * the period to signed.
 */
export async function signFiling(actor: Actor, filingId: string, input: SignFilingInput): Promise<FilingDetail> {
  if (!can(actor, "filing.sign")) throw new AppError("forbidden:filing_sign", "Only a compliance head can sign a filing.");
  const row = await findRow(actor, filingId);
  if (row.status !== "in_review") {
    if (LOCKED.includes(row.status as FilingRowStatus)) throw new AppError("conflict:filing_locked", row.status === "signed" ? `Version ${row.version} is already signed.` : lockedMessage(row));
    throw new AppError("conflict:filing", row.status === "changes_requested" ? `Changes to version ${row.version} were requested; it can be signed once it is resubmitted.` : `Version ${row.version} has not been submitted for review yet.`);
  }
  const run = await getRun(actor, row.runId, { detail: false });
  const refusal = await fourEyesRefusal(actor, row, run);
  if (refusal) throw new AppError("forbidden:four_eyes", refusal);

  // the attestation
  const fields: Record<string, string> = {};
  if (input.attest !== true) fields.attest = "Tick the attestation to sign.";
  if (normaliseName(input.signerName ?? "") !== normaliseName(actor.name)) fields.signerName = `Type your name as Ballast knows it: ${actor.name}.`;
  if (!input.licenceReference || input.licenceReference.trim().length < 2) fields.licenceReference = "Enter your licence or registration reference.";
  if (Object.keys(fields).length) throw new AppError("unprocessable:attestation", `The attestation is not complete: ${Object.values(fields)[0]}`, fields);

  // the password, entered again, rate-limited like sign-in
  if ((await recentPasswordFailures(actor)) >= MAX_FAILURES_PER_ACCOUNT) {
    throw new AppError("rate_limited:sign", `Too many wrong passwords at signing. Wait ${RATE_WINDOW_MINUTES} minutes and try again.`);
  }
  const [user] = await getDb().select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, actor.userId));
  const ok = !!user && (await verifyPassword(input.password, user.passwordHash));
  if (!ok) {
    await getDb().transaction(async (tx) => {
      await recordAudit(tx, actor, {
        action: "filing.sign_refused",
        entityType: "filing",
        entityId: row.id,
        summary: `Signing version ${row.version} of the filing was refused: the password was wrong`,
        detail: { reason: "wrong_password", version: row.version },
      });
    });
    throw new AppError("unprocessable:sign_password", "The password is not correct. Nothing was signed.", { password: "The password is not correct." });
  }

  const marked = await filingRunOf(actor, row.periodId, { detail: false });
  if (!marked || marked.id !== row.runId) {
    throw new AppError("conflict:filing_run", "The run marked for the period's filing changed after this version was submitted. Request changes so that the compliance officer rebuilds it from the marked run.");
  }
  await assertRunFresh(actor, marked.id, "be signed");

  // the content exactly as stored, signed over its canonical form
  const stored = row.content;
  const hash = contentHash(stored);
  const signedAt = now().toISOString();
  const signOff = { signerName: actor.name, licenceReference: input.licenceReference.trim(), signedAt, contentHash: hash };
  const signedContent: FilingViewModel = { ...stored, filing: { ...stored.filing, status: "signed" }, signOff };
  if (contentHash(signedContent) !== hash) throw new AppError("internal:filing_hash", "The signed content does not hash as the content reviewed.");
  const attestation = attestationText();
  const period = await findPeriod(actor, row.periodId);
  await getDb().transaction(async (tx) => {
    await enqueuePackRender(tx, actor.firmId, [row.id]);
    // the stored content is checked unchanged since it was read, then signed
    const [now] = await tx.select({ content: filings.content, status: filings.status }).from(filings).where(and(eq(filings.id, row.id), eq(filings.firmId, actor.firmId)));
    if (!now || now.status !== "in_review" || contentHash(now.content) !== hash) throw raced();
    await tx.insert(signatures).values({ firmId: actor.firmId, filingId: row.id, signerId: actor.userId, signerName: actor.name, licenceReference: signOff.licenceReference, contentHash: hash, signedAt, attestation });
    await tx
      .update(filings)
      .set({ status: "signed", content: signedContent })
      .where(and(eq(filings.id, row.id), eq(filings.firmId, actor.firmId)));
    await tx.update(reportingPeriods).set({ state: "signed" }).where(and(eq(reportingPeriods.id, row.periodId), eq(reportingPeriods.firmId, actor.firmId)));
    await recordAudit(tx, actor, {
      action: "filing.sign",
      entityType: "filing",
      entityId: row.id,
      summary: `Signed version ${row.version} of the filing for the period ending ${period.periodEnd} (SHA-256 ${hash.slice(0, 16)}…)`,
      detail: { version: row.version, contentHash: hash, licenceReference: signOff.licenceReference, attestation, runId: row.runId },
      at: signedAt,
    });
  });
  return getFiling(actor, row.id);
}

/**
 * A change after signing: a new draft version pointing at the signed one, with the reason; the old signature is
 * marked superseded (it stays visible) and the old version's status becomes superseded. The period reopens.
 */
export async function newFilingVersion(actor: Actor, filingId: string, input: NewFilingVersionInput): Promise<FilingDetail> {
  const row = await findRow(actor, filingId);
  if (row.status !== "signed") {
    if (row.status === "filed") throw new AppError("conflict:filing_locked", `Version ${row.version} has been filed with the regulator (reference ${row.filingReference}); Ballast keeps it as filed. A correction to a filed return is taken up with the regulator.`);
    if (row.status === "superseded") throw new AppError("conflict:filing", `Version ${row.version} is already superseded by a later version.`);
    throw new AppError("conflict:filing", `Version ${row.version} is not signed; edit it directly.`);
  }
  const period = await findPeriod(actor, row.periodId);
  const reason = input.reason.trim();
  const run = await markedCompletedRun(actor, period);
  const old = row.content;
  const supersededAt = now().toISOString();
  const [sig] = (await signaturesOf(actor, [row.id])).filter((s) => s.supersededAt === null);
  const earlier = await supersededOf(actor, row.periodId);
  const superseded: SupersededSignature[] = [
    ...earlier,
    ...(sig ? [{ version: row.version, signerName: sig.signerName, licenceReference: sig.licenceReference, signedAt: sig.signedAt, contentHash: sig.contentHash, supersededAt, reason }] : []),
  ];
  const exceptionDates = new Set(run.results!.monthEnd.backtest.exceptionList.map((e) => e.date));
  const explanations = Object.fromEntries(Object.entries(explanationsOf(old)).filter(([d]) => exceptionDates.has(d)));
  const content = await assemble(actor, {
    period,
    run,
    version: row.version + 1,
    previous: { version: row.version, content: old, runId: row.runId, coverNote: row.coverNote },
    status: "draft",
    preparedBy: actor.userId,
    submittedBy: null,
    coverNote: row.coverNote,
    reason,
    explanations,
    supersededSignatures: superseded,
  });
  const id = await getDb().transaction(async (tx) => {
    await updateFilingWhile(tx, actor, row.id, "signed", { status: "superseded" });
    if (sig) {
      await tx
        .update(signatures)
        .set({ supersededAt, supersededReason: reason })
        .where(and(eq(signatures.id, sig.id), eq(signatures.firmId, actor.firmId)));
    }
    const [created] = await tx
      .insert(filings)
      .values({
        firmId: actor.firmId,
        periodId: row.periodId,
        runId: run.id,
        version: row.version + 1,
        previousId: row.id,
        status: "draft",
        content,
        coverNote: row.coverNote,
        reason,
        preparedBy: actor.userId,
      })
      .returning({ id: filings.id });
    await enqueuePackRender(tx, actor.firmId, [row.id, created.id]);
    await tx.update(reportingPeriods).set({ state: "open" }).where(and(eq(reportingPeriods.id, row.periodId), eq(reportingPeriods.firmId, actor.firmId)));
    await recordAudit(tx, actor, {
      action: "filing.new_version",
      entityType: "filing",
      entityId: created.id,
      summary: `Started version ${row.version + 1} of the filing for the period ending ${period.periodEnd}; the signature on version ${row.version} is superseded. Reason: ${reason}`,
      detail: { previousId: row.id, previousVersion: row.version, reason, supersededSignatureId: sig?.id ?? null, supersededHash: sig?.contentHash ?? null },
    });
    return created.id;
  });
  return getFiling(actor, id);
}

/** Record that a signed version was filed with the regulator: the date and the regulator's reference. */
export async function markFiled(actor: Actor, filingId: string, input: MarkFiledInput): Promise<FilingDetail> {
  const row = await findRow(actor, filingId);
  if (row.status !== "signed") {
    if (row.status === "filed") throw new AppError("conflict:filing_locked", `Version ${row.version} is already recorded as filed (reference ${row.filingReference}).`);
    if (row.status === "superseded") throw new AppError("conflict:filing", `Version ${row.version} is superseded; file the current version.`);
    throw new AppError("conflict:filing", `Version ${row.version} is not signed yet; only a signed filing can be filed.`);
  }
  const [sig] = (await signaturesOf(actor, [row.id])).filter((s) => s.supersededAt === null);
  const fields: Record<string, string> = {};
  // The signature's day, as a business day: under a pinned business clock (tests, demos) a signature stamped at the
  // real time can fall after the pinned today; that today is then the signature's business day.
  const signedOn = sig ? (sig.signedAt.slice(0, 10) > today() ? today() : sig.signedAt.slice(0, 10)) : null;
  if (input.filedOn > today()) fields.filedOn = "The filing date cannot be in the future.";
  else if (signedOn && input.filedOn < signedOn) fields.filedOn = `The filing date cannot be before the signature (${signedOn}).`;
  if (Object.keys(fields).length) throw new AppError("unprocessable:filed", fields.filedOn, fields);
  const reference = input.reference.trim();
  const period = await findPeriod(actor, row.periodId);
  await getDb().transaction(async (tx) => {
    await enqueuePackRender(tx, actor.firmId, [row.id]);
    await updateFilingWhile(tx, actor, row.id, "signed", { status: "filed", filedAt: input.filedOn, filingReference: reference });
    await tx
      .update(reportingPeriods)
      .set({ state: "filed", filedAt: input.filedOn, filingReference: reference })
      .where(and(eq(reportingPeriods.id, row.periodId), eq(reportingPeriods.firmId, actor.firmId)));
    await recordAudit(tx, actor, {
      action: "filing.filed",
      entityType: "filing",
      entityId: row.id,
      summary: `Recorded version ${row.version} of the filing for the period ending ${period.periodEnd} as filed on ${input.filedOn} (reference ${reference})`,
      detail: { filedOn: input.filedOn, reference, version: row.version },
    });
  });
  return getFiling(actor, row.id);
}

/** Recompute the SHA-256 of the stored content and compare it with the hash stored at signing. */
export async function verifyFiling(actor: Actor, filingId: string): Promise<VerifyResult> {
  const row = await findRow(actor, filingId);
  const [sig] = (await signaturesOf(actor, [row.id])).sort((a, b) => (a.supersededAt === null ? -1 : b.supersededAt === null ? 1 : 0));
  let recomputed: string;
  try {
    recomputed = contentHash(row.content);
  } catch {
    recomputed = createHash("sha256").update(JSON.stringify(row.content)).digest("hex");
  }
  if (!sig) {
    return { filingId: row.id, version: row.version, signed: false, storedHash: null, recomputedHash: recomputed, matches: null, signerName: null, signedAt: null, superseded: false, message: `Version ${row.version} is not signed; there is no signature to check.` };
  }
  const matches = recomputed === sig.contentHash;
  return {
    filingId: row.id,
    version: row.version,
    signed: true,
    storedHash: sig.contentHash,
    recomputedHash: recomputed,
    matches,
    signerName: sig.signerName,
    signedAt: sig.signedAt,
    superseded: sig.supersededAt !== null,
    message: matches
      ? `The content of version ${row.version} is exactly what ${sig.signerName} signed: the hash recomputed now equals the hash stored at signing.`
      : `The content of version ${row.version} is NOT what ${sig.signerName} signed: the hash recomputed now differs from the hash stored at signing.`,
  };
}
