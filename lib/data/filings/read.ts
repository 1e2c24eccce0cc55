/** Reading filings: the detail of a version with its signatures and comments, a period's versions, and the period the shell's Filing link goes to. */
import "server-only";
import { firmRow } from "@/lib/data/firm-row";
import { and, desc, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { filings, firms, reportingPeriods, reviewComments, signatures } from "@/db/schema";
import { userNames } from "../people";
import { AppError } from "@/lib/errors";
import type { Actor } from "@/lib/auth/actor";
import { sectionLabel } from "@/lib/validation/filings";
import type { FilingStatus, FilingViewModel } from "@/reports/view-model";
import { formatMonth } from "@/reports/format";
import { filingRunOf } from "../runs";
import { runFreshnessOf } from "../run-freshness";
import { FilingRowStatus, PersonRef, SignatureView, CommentView, FilingDetail, FilingVersionSummary, PeriodFiling, FilingRow, PeriodRow, SignatureRow } from "./types";

const ref = (id: string, byId: Map<string, string>): PersonRef => ({ id, name: byId.get(id) ?? "Former member" });

export async function findRow(actor: Actor, filingId: string): Promise<FilingRow> {
  return firmRow(filings, actor.firmId, filingId, "not_found:filing", "No such filing.");
}

export async function findPeriod(actor: Actor, periodId: string): Promise<PeriodRow> {
  return firmRow(reportingPeriods, actor.firmId, periodId, "not_found:period", "No such reporting period.");
}

export async function firmOf(actor: Actor) {
  const [firm] = await getDb().select().from(firms).where(eq(firms.id, actor.firmId));
  if (!firm) throw new AppError("not_found:firm");
  return firm;
}

export async function signaturesOf(actor: Actor, filingIds: string[]): Promise<SignatureRow[]> {
  if (filingIds.length === 0) return [];
  return getDb()
    .select()
    .from(signatures)
    .where(and(eq(signatures.firmId, actor.firmId), inArray(signatures.filingId, filingIds)))
    .orderBy(signatures.signedAt);
}

function signatureView(s: SignatureRow, version: number, byId: Map<string, string>): SignatureView {
  return {
    id: s.id,
    filingId: s.filingId,
    version,
    signer: ref(s.signerId, byId),
    signerName: s.signerName,
    licenceReference: s.licenceReference,
    contentHash: s.contentHash,
    signedAt: s.signedAt,
    attestation: s.attestation,
    supersededAt: s.supersededAt,
    supersededReason: s.supersededReason,
  };
}

/** The stored content with the fields that change after signing (status, filing date, reference) as they are now. */
export function presentContent(row: Pick<FilingRow, "content" | "status" | "filedAt" | "filingReference">): FilingViewModel {
  const vm = row.content;
  const status: FilingStatus = row.status === "superseded" ? "signed" : (row.status as FilingStatus);
  return { ...vm, filing: { ...vm.filing, status, filedAt: row.filedAt, filingReference: row.filingReference } };
}

async function detail(actor: Actor, row: FilingRow): Promise<FilingDetail> {
  const db = getDb();
  const [period, marked, sigs, comments] = await Promise.all([
    findPeriod(actor, row.periodId),
    filingRunOf(actor, row.periodId, { detail: false }),
    signaturesOf(actor, [row.id]),
    db
      .select()
      .from(reviewComments)
      .where(and(eq(reviewComments.firmId, actor.firmId), eq(reviewComments.filingId, row.id)))
      .orderBy(reviewComments.createdAt, reviewComments.id),
  ]);
  let previousVersion: number | null = null;
  if (row.previousId) {
    const [prev] = await db
      .select({ version: filings.version })
      .from(filings)
      .where(and(eq(filings.id, row.previousId), eq(filings.firmId, actor.firmId)));
    previousVersion = prev?.version ?? null;
  }
  const byId = await userNames([row.preparedBy, row.submittedBy, ...sigs.map((s) => s.signerId), ...comments.map((c) => c.authorId)]);
  const content = presentContent(row);
  return {
    id: row.id,
    periodId: row.periodId,
    periodEnd: period.periodEnd,
    version: row.version,
    previousId: row.previousId,
    previousVersion,
    status: row.status as FilingRowStatus,
    runId: row.runId,
    runIsMarked: marked?.id === row.runId,
    coverNote: row.coverNote,
    reason: row.reason,
    preparedBy: ref(row.preparedBy, byId),
    submittedBy: row.submittedBy ? ref(row.submittedBy, byId) : null,
    filedAt: row.filedAt,
    filingReference: row.filingReference,
    createdAt: row.createdAt,
    content,
    exceptions: content.figures.backtest.exceptionList.map((e) => ({ date: e.date, pnl: e.pnl, var: e.var, excess: e.excess, explanation: e.explanation })),
    signature: (() => {
      const s = sigs.find((x) => x.supersededAt === null);
      return s ? signatureView(s, row.version, byId) : null;
    })(),
    supersededSignatures: sigs.filter((x) => x.supersededAt !== null).map((s) => signatureView(s, row.version, byId)),
    comments: comments.map((c) => ({
      id: c.id,
      section: c.section,
      sectionLabel: sectionLabel(c.section),
      kind: c.kind as CommentView["kind"],
      body: c.body,
      author: ref(c.authorId, byId),
      createdAt: c.createdAt,
    })),
  };
}

/** One filing version of the actor's firm; another firm's filing is not found. */
export async function getFiling(actor: Actor, filingId: string): Promise<FilingDetail> {
  return detail(actor, await findRow(actor, filingId));
}

export async function currentRow(actor: Actor, periodId: string): Promise<FilingRow | null> {
  const [row] = await getDb()
    .select()
    .from(filings)
    .where(and(eq(filings.firmId, actor.firmId), eq(filings.periodId, periodId)))
    .orderBy(desc(filings.version))
    .limit(1);
  return row ?? null;
}

/** The versions of a period's filing, newest first, with their signatures (superseded ones included). */
export async function listFilingVersions(actor: Actor, periodId: string): Promise<FilingVersionSummary[]> {
  await findPeriod(actor, periodId);
  const rows = await getDb()
    .select()
    .from(filings)
    .where(and(eq(filings.firmId, actor.firmId), eq(filings.periodId, periodId)))
    .orderBy(desc(filings.version));
  const sigs = await signaturesOf(
    actor,
    rows.map((r) => r.id),
  );
  const byId = await userNames([...rows.map((r) => r.preparedBy), ...sigs.map((s) => s.signerId)]);
  return rows.map((r) => ({
    id: r.id,
    version: r.version,
    status: r.status as FilingRowStatus,
    reason: r.reason,
    preparedBy: ref(r.preparedBy, byId),
    createdAt: r.createdAt,
    signatures: sigs.filter((s) => s.filingId === r.id).map((s) => signatureView(s, r.version, byId)),
    filedAt: r.filedAt,
    filingReference: r.filingReference,
  }));
}

/** The filing page of a period: the period, its marked run, the current version and every version. */
export async function periodFiling(actor: Actor, periodId: string): Promise<PeriodFiling> {
  const period = await findPeriod(actor, periodId);
  const [marked, row, versions, firm] = await Promise.all([filingRunOf(actor, periodId, { detail: false }), currentRow(actor, periodId), listFilingVersions(actor, periodId), firmOf(actor)]);
  const [last] = await getDb()
    .select({ reference: signatures.licenceReference })
    .from(signatures)
    .where(and(eq(signatures.firmId, actor.firmId), eq(signatures.signerId, actor.userId)))
    .orderBy(desc(signatures.signedAt))
    .limit(1);
  return {
    period: { id: period.id, periodEnd: period.periodEnd, deadline: period.deadline, state: period.state, label: formatMonth(period.periodEnd) },
    markedRun: marked ? { id: marked.id, status: marked.status, startedAt: marked.startedAt, startedByName: marked.startedByName, finishedAt: marked.finishedAt, freshness: await runFreshnessOf(actor, marked.id) } : null,
    current: row ? await detail(actor, row) : null,
    versions,
    lastLicenceReference: last?.reference ?? null,
    licenceLabel: firm.licenceLabel,
  };
}

/**
 * Where the shell's "Filing" link goes: the period that needs filing first (the earliest one not filed yet, whose
 * deadline comes first), or else the newest period.
 */
export async function currentFilingPeriodId(actor: Actor): Promise<string | null> {
  const rows = await getDb()
    .select({ id: reportingPeriods.id, state: reportingPeriods.state })
    .from(reportingPeriods)
    .where(eq(reportingPeriods.firmId, actor.firmId))
    .orderBy(desc(reportingPeriods.periodEnd));
  return (rows.findLast((r) => r.state !== "filed") ?? rows[0])?.id ?? null;
}
