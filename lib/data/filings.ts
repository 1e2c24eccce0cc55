/**
 * The draft filing of a reporting period and its review and sign-off.
 *
 * Assembling: the period's marked filing run (completed), its method statement version, its data-quality report and
 * the firm's profile become one FilingViewModel (reports/view-model.ts), stored as the filing's content. While a
 * version is a draft (or sent back with changes requested) the compliance officer edits the cover note and the
 * explanation of each backtest exception, and the content is rebuilt from the same run.
 *
 * States: draft → in_review → changes_requested → in_review … → signed → filed. A signed version is locked by
 * SQLite triggers (db/migrations/0007_filings_locked.sql): a later change is a new version pointing at it, with a
 * reason, and the old signature is marked superseded (the old version's status becomes "superseded").
 *
 * Signing: the compliance head role; not the preparer, the submitter or the person who started the run (four eyes);
 * the signer's password entered again (a wrong one is refused, audited and rate-limited like sign-in); the
 * attestation ticked with the signer's name and licence or registration reference. The signature stores the
 * SHA-256 of the content's canonical form (reports/canonical.ts), recomputed by `verifyFiling`.
 *
 * Every function takes the Actor first and reads only the actor's firm; every write is one transaction with its
 * audit record.
 */
import "server-only";
import { createHash } from "node:crypto";
import { and, count, desc, eq, gte, inArray, lt, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { auditEvents, filings, firms, memberships, methodStatements, reportingPeriods, reviewComments, signatures, users } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import { can } from "@/lib/auth/permissions";
import { parseRoles } from "@/lib/auth/roles";
import { verifyPassword } from "@/lib/auth/password";
import { MAX_FAILURES_PER_ACCOUNT, RATE_WINDOW_MINUTES } from "@/lib/auth/rate-limit";
import { now, today } from "@/lib/clock";
import type { RunRecord } from "@/lib/runs/types";
import { PACK_KINDS, sectionLabel, type FilingCommentInput, type MarkFiledInput, type NewFilingVersionInput, type PackKind, type PrepareFilingInput, type RequestChangesInput, type SignFilingInput, type SubmitFilingInput, type UpdateFilingInput } from "@/lib/validation/filings";
import { correlationFromRunInputs, filingInputFromRun } from "@/reports/run-adapter";
import { storedCorrelationOf } from "@/lib/runs/stored-state";
import { buildFilingViewModel, contentHash, FILING_STATUS_LABELS, type CorrelationView, type FilingStatus, type FilingViewModel, type SupersededSignature } from "@/reports/view-model";
import { formatAmount, formatConfidence, formatMonth } from "@/reports/format";
import { fragment } from "@/reports/sections";
import { packFileName } from "@/reports/file-names";
import { filingRunOf, getRun, getRunInputs, runChange } from "./runs";
import { enqueuePackRender, packContentKey, storedOrRenderPack, type PackRenderer, type PackSource } from "./packs";
import { assertRunFresh, runFreshnessOf, type RunFreshness } from "./run-freshness";

/** A filing version's stored status: the workflow states, and "superseded" for a signed version a later one replaced. */
export type FilingRowStatus = FilingStatus | "superseded";

export const FILING_ROW_STATUS_LABELS: Record<FilingRowStatus, string> = { ...FILING_STATUS_LABELS, superseded: "Superseded" };

export interface PersonRef {
  id: string;
  name: string;
}

export interface SignatureView {
  id: string;
  filingId: string;
  version: number;
  signer: PersonRef;
  signerName: string;
  licenceReference: string;
  contentHash: string;
  signedAt: string;
  attestation: string;
  supersededAt: string | null;
  supersededReason: string | null;
}

export interface CommentView {
  id: string;
  section: string;
  sectionLabel: string;
  /** "submission_note": the note the compliance officer sent with a submission (older ones are stored as replies) */
  kind: "comment" | "changes_requested" | "reply" | "submission_note";
  body: string;
  author: PersonRef;
  createdAt: string;
}

export interface ExceptionView {
  date: string;
  pnl: number;
  var: number;
  excess: number;
  explanation: string;
}

/** One version of a period's filing, as the filing page shows it. */
export interface FilingDetail {
  id: string;
  periodId: string;
  periodEnd: string;
  version: number;
  previousId: string | null;
  previousVersion: number | null;
  status: FilingRowStatus;
  runId: string;
  /** whether the filing's run is still the run the period marks for its filing */
  runIsMarked: boolean;
  coverNote: string;
  reason: string;
  preparedBy: PersonRef;
  submittedBy: PersonRef | null;
  filedAt: string | null;
  filingReference: string | null;
  createdAt: string;
  /** the stored content, with the workflow fields (status, filing date, reference) as they stand now */
  content: FilingViewModel;
  exceptions: ExceptionView[];
  /** the signature in force (null while unsigned) */
  signature: SignatureView | null;
  /** signatures this version once had that a later version superseded */
  supersededSignatures: SignatureView[];
  comments: CommentView[];
}

export interface FilingVersionSummary {
  id: string;
  version: number;
  status: FilingRowStatus;
  reason: string;
  preparedBy: PersonRef;
  createdAt: string;
  signatures: SignatureView[];
  filedAt: string | null;
  filingReference: string | null;
}

/** Everything the filing page of a period needs. */
export interface PeriodFiling {
  period: { id: string; periodEnd: string; deadline: string; state: string; label: string };
  markedRun: { id: string; status: string; startedAt: string; startedByName: string; finishedAt: string | null; freshness: RunFreshness } | null;
  current: FilingDetail | null;
  versions: FilingVersionSummary[];
  /** the signer's last licence reference at this firm, to fill the sign dialog */
  lastLicenceReference: string | null;
  licenceLabel: string;
}

export interface VerifyResult {
  filingId: string;
  version: number;
  signed: boolean;
  /** the hash stored with the signature (null while unsigned) */
  storedHash: string | null;
  /** the hash recomputed now from the stored content */
  recomputedHash: string;
  /** null while unsigned */
  matches: boolean | null;
  signerName: string | null;
  signedAt: string | null;
  superseded: boolean;
  message: string;
}

export interface PackFile {
  fileName: string;
  contentType: string;
  bytes: Uint8Array;
  /** SHA-256 of the bytes, hex */
  sha256: string;
}

type FilingRow = typeof filings.$inferSelect;
type PeriodRow = typeof reportingPeriods.$inferSelect;
type SignatureRow = typeof signatures.$inferSelect;

const LOCKED: readonly FilingRowStatus[] = ["signed", "filed", "superseded"];
const EDITABLE: readonly FilingRowStatus[] = ["draft", "changes_requested"];
/** The wording of the attestation the signer ticks (stored with the signature). */
export function attestationText(): string {
  return fragment("attestation");
}

// ---------------------------------------------------------------------------------------------------------------
// reading

async function names(ids: (string | null | undefined)[]): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))];
  if (wanted.length === 0) return new Map();
  const rows = await getDb().select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, wanted));
  return new Map(rows.map((r) => [r.id, r.name]));
}
const ref = (id: string, byId: Map<string, string>): PersonRef => ({ id, name: byId.get(id) ?? "Former member" });

async function findRow(actor: Actor, filingId: string): Promise<FilingRow> {
  const [row] = await getDb()
    .select()
    .from(filings)
    .where(and(eq(filings.id, filingId), eq(filings.firmId, actor.firmId)));
  if (!row) throw new AppError("not_found:filing", "No such filing.");
  return row;
}

async function findPeriod(actor: Actor, periodId: string): Promise<PeriodRow> {
  const [row] = await getDb()
    .select()
    .from(reportingPeriods)
    .where(and(eq(reportingPeriods.id, periodId), eq(reportingPeriods.firmId, actor.firmId)));
  if (!row) throw new AppError("not_found:period", "No such reporting period.");
  return row;
}

async function firmOf(actor: Actor) {
  const [firm] = await getDb().select().from(firms).where(eq(firms.id, actor.firmId));
  if (!firm) throw new AppError("not_found:firm");
  return firm;
}

async function signaturesOf(actor: Actor, filingIds: string[]): Promise<SignatureRow[]> {
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
function presentContent(row: Pick<FilingRow, "content" | "status" | "filedAt" | "filingReference">): FilingViewModel {
  const vm = row.content;
  const status: FilingStatus = row.status === "superseded" ? "signed" : (row.status as FilingStatus);
  return { ...vm, filing: { ...vm.filing, status, filedAt: row.filedAt, filingReference: row.filingReference } };
}

async function detail(actor: Actor, row: FilingRow): Promise<FilingDetail> {
  const db = getDb();
  const [period, marked, sigs, comments] = await Promise.all([
    findPeriod(actor, row.periodId),
    filingRunOf(actor, row.periodId),
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
  const byId = await names([row.preparedBy, row.submittedBy, ...sigs.map((s) => s.signerId), ...comments.map((c) => c.authorId)]);
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

async function currentRow(actor: Actor, periodId: string): Promise<FilingRow | null> {
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
  const byId = await names([...rows.map((r) => r.preparedBy), ...sigs.map((s) => s.signerId)]);
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
  const [marked, row, versions, firm] = await Promise.all([filingRunOf(actor, periodId), currentRow(actor, periodId), listFilingVersions(actor, periodId), firmOf(actor)]);
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

// ---------------------------------------------------------------------------------------------------------------
// assembling the content

/** Runs never change, so the correlation recomputed from a run's stored inputs is kept for the few runs last used. */
const correlationCache = new Map<string, Promise<CorrelationView | null>>();

/**
 * The correlation behind the run's parametric figures: the one the run stored; runs stored before the engine returned
 * it are recomputed from their stored inputs (null when that fails).
 */
function correlationOf(actor: Actor, run: RunRecord): Promise<CorrelationView | null> {
  const stored = run.results ? storedCorrelationOf(run.results) : null;
  if (stored) return Promise.resolve(stored);
  const key = `${actor.firmId}:${run.id}`;
  let hit = correlationCache.get(key);
  if (!hit) {
    hit = getRunInputs(actor, run.id)
      .then((inputs) => correlationFromRunInputs(inputs))
      .catch((error: unknown) => {
        console.error("[ballast] filing: the correlation could not be recomputed from the run's stored inputs", error);
        return null;
      });
    correlationCache.set(key, hit);
    while (correlationCache.size > 6) correlationCache.delete(correlationCache.keys().next().value!);
  }
  return hit;
}

interface AssembleArgs {
  period: PeriodRow;
  run: RunRecord;
  version: number;
  previous: { version: number; content: FilingViewModel; runId: string; coverNote: string } | null;
  status: FilingStatus;
  preparedBy: string;
  submittedBy: string | null;
  coverNote: string;
  reason: string;
  explanations: Record<string, string>;
  supersededSignatures: SupersededSignature[];
}

/** The primary method's figures at the capital confidence, for comparisons. */
function headline(vm: FilingViewModel) {
  const primary = vm.figures.totals.find((t) => t.primary) ?? vm.figures.totals[0];
  const at = primary?.byConfidence.find((c) => c.confidence === vm.figures.capitalConfidence) ?? primary?.byConfidence[0];
  return { capital: vm.figures.capital.capital, var1d: at?.oneDay.var ?? 0, esHorizon: at?.horizon.es ?? 0, exceptions: vm.figures.backtest.exceptions, methodVersion: vm.method.version, confidence: at?.confidence ?? vm.figures.capitalConfidence };
}

function signed(n: number): string {
  return n > 0 ? `+${formatAmount(n)}` : formatAmount(n);
}

/** What changed against the previous version of this filing and against the last signed filing of an earlier period. */
async function changesSinceLast(actor: Actor, args: AssembleArgs, draft: FilingViewModel): Promise<string[]> {
  const lines: string[] = [];
  const ccy = draft.figures.currency;
  if (args.previous) {
    const p = args.previous;
    if (p.runId !== args.run.id) lines.push(`The figures come from a different run than version ${p.version}: the run of ${args.run.startedAt.slice(0, 16).replace("T", " ")} UTC by ${args.run.startedByName}.`);
    if (p.coverNote.trim() !== args.coverNote.trim()) lines.push(`The cover note differs from version ${p.version}.`);
    const before = new Map(p.content.filing.exceptionExplanations.map((e) => [e.date, e.text]));
    const changed = Object.keys(args.explanations).filter((d) => (before.get(d) ?? "") !== args.explanations[d]);
    const removed = [...before.keys()].filter((d) => !(d in args.explanations));
    if (changed.length) lines.push(`Exception explanations added or changed for ${changed.sort().join(", ")}.`);
    if (removed.length) lines.push(`Exception explanations removed for ${removed.sort().join(", ")}.`);
    const a = headline(p.content);
    const b = headline(draft);
    if (a.capital !== b.capital) lines.push(`Capital against version ${p.version}: ${formatAmount(a.capital)} → ${formatAmount(b.capital)} ${ccy}.`);
  }
  // the last signed (or filed) filing of an earlier period
  const db = getDb();
  const earlier = await db
    .select({ id: reportingPeriods.id, periodEnd: reportingPeriods.periodEnd })
    .from(reportingPeriods)
    .where(and(eq(reportingPeriods.firmId, actor.firmId), lt(reportingPeriods.periodEnd, args.period.periodEnd)))
    .orderBy(desc(reportingPeriods.periodEnd));
  for (const period of earlier) {
    const [prior] = await db
      .select()
      .from(filings)
      .where(and(eq(filings.firmId, actor.firmId), eq(filings.periodId, period.id), inArray(filings.status, ["signed", "filed"])))
      .orderBy(desc(filings.version))
      .limit(1);
    if (!prior) continue;
    const a = headline(prior.content);
    const b = headline(draft);
    const label = `${formatMonth(period.periodEnd)} (version ${prior.version}, ${prior.status})`;
    lines.push(`Capital: ${formatAmount(a.capital)} ${ccy} in the filing for ${label}, ${formatAmount(b.capital)} ${ccy} now (${signed(b.capital - a.capital)}).`);
    lines.push(`One-day VaR at ${formatConfidence(b.confidence)}: ${formatAmount(a.var1d)} → ${formatAmount(b.var1d)} ${ccy} (${signed(b.var1d - a.var1d)}); ${draft.figures.horizonDays}-day expected shortfall: ${formatAmount(a.esHorizon)} → ${formatAmount(b.esHorizon)} ${ccy}.`);
    if (a.exceptions !== b.exceptions) lines.push(`Backtest exceptions: ${a.exceptions} → ${b.exceptions}.`);
    if (a.methodVersion !== b.methodVersion) lines.push(`Method statement: version ${a.methodVersion} → version ${b.methodVersion}.`);
    try {
      const change = await runChange(actor, args.run.id);
      const e = change.explanation;
      if (e && change.previous?.periodId === period.id) {
        const steps = e.steps.map((s) => `${s.step} ${signed(s.change)}`).join(", ");
        lines.push(`The change in one-day parametric VaR at ${formatConfidence(e.confidence)} against that period's run (${formatAmount(e.previousVar)} → ${formatAmount(e.currentVar)} ${ccy}) splits into ${steps} ${ccy}: ${e.order}.`);
      }
    } catch (error) {
      console.error("[ballast] filing: the change against the earlier period's run could not be explained", error);
    }
    return lines;
  }
  lines.push(earlier.length ? "No earlier period has a signed filing in Ballast to compare with." : "This is the firm's first reporting period in Ballast: there is no earlier filing to compare with.");
  return lines;
}

/** Build the view model of a filing version from its run and the firm's data. Pure apart from the reads. */
async function assemble(actor: Actor, args: AssembleArgs): Promise<FilingViewModel> {
  const { run } = args;
  const results = run.results;
  if (run.status !== "completed" || !results) throw new AppError("conflict:filing_run", "The period's filing run has not completed, so there are no figures to file yet.");
  const db = getDb();
  const [firm, method, people, correlation] = await Promise.all([
    firmOf(actor),
    db
      .select({ rationale: methodStatements.rationale, limitations: methodStatements.limitations })
      .from(methodStatements)
      .where(and(eq(methodStatements.id, results.method.id), eq(methodStatements.firmId, actor.firmId)))
      .then((rows) => rows[0] ?? null),
    names([args.preparedBy, args.submittedBy]),
    correlationOf(actor, run),
  ]);
  const exceptionDates = new Set(results.monthEnd.backtest.exceptionList.map((e) => e.date));
  const explanations = Object.fromEntries(Object.entries(args.explanations).filter(([d, t]) => exceptionDates.has(d) && t.trim() !== ""));
  const filing = {
    version: args.version,
    previousVersion: args.previous?.version ?? null,
    status: args.status,
    preparedBy: people.get(args.preparedBy) ?? "",
    submittedBy: args.submittedBy ? (people.get(args.submittedBy) ?? "") : null,
    coverNote: args.coverNote,
    reason: args.reason,
    changesSinceLast: [] as string[],
    exceptionExplanations: explanations,
  };
  const input = () =>
    filingInputFromRun({
      run,
      method: { rationale: method?.rationale ?? "", limitations: method?.limitations ?? [] },
      firm: { name: firm.name, reportingCurrency: firm.reportingCurrency, regulatorName: firm.regulatorName, licenceLabel: firm.licenceLabel },
      period: { end: args.period.periodEnd, deadline: args.period.deadline },
      filing,
      correlation,
      signature: null,
      supersededSignatures: args.supersededSignatures,
    });
  let vm: FilingViewModel;
  try {
    vm = buildFilingViewModel(input());
    filing.changesSinceLast = await changesSinceLast(actor, args, vm);
    vm = buildFilingViewModel(input());
  } catch (error) {
    if (error instanceof AppError) throw error;
    throw new AppError("unprocessable:filing_content", `The draft filing cannot be assembled from this run: ${error instanceof Error ? error.message : String(error)}`);
  }
  // exactly what is stored: a JSON round trip, and the canonical form must exist
  const stored = JSON.parse(JSON.stringify(vm)) as FilingViewModel;
  contentHash(stored);
  return stored;
}

function explanationsOf(vm: FilingViewModel): Record<string, string> {
  return Object.fromEntries(vm.filing.exceptionExplanations.map((e) => [e.date, e.text]));
}

/** The period's marked filing run, completed, or a clear refusal. */
async function markedCompletedRun(actor: Actor, period: PeriodRow): Promise<RunRecord> {
  const marked = await filingRunOf(actor, period.id);
  if (!marked) {
    throw new AppError(
      "conflict:filing_run",
      `The period ending ${period.periodEnd} has no run marked for its filing. The risk analyst completes a run and chooses "use for the filing" on it first.`,
    );
  }
  const run = marked.results ? marked : await getRun(actor, marked.id);
  if (run.status !== "completed" || !run.results) {
    throw new AppError("conflict:filing_run", `The run marked for the filing of the period ending ${period.periodEnd} has not completed (it is ${run.status}); a draft filing is assembled from a completed run only.`);
  }
  await assertRunFresh(actor, run.id, "be assembled into the draft filing");
  return run;
}

async function previousOf(actor: Actor, row: FilingRow): Promise<AssembleArgs["previous"]> {
  if (!row.previousId) return null;
  const [prev] = await getDb()
    .select()
    .from(filings)
    .where(and(eq(filings.id, row.previousId), eq(filings.firmId, actor.firmId)));
  return prev ? { version: prev.version, content: prev.content, runId: prev.runId, coverNote: prev.coverNote } : null;
}

async function supersededOf(actor: Actor, periodId: string): Promise<SupersededSignature[]> {
  const rows = await getDb()
    .select({ s: signatures, version: filings.version })
    .from(signatures)
    .innerJoin(filings, and(eq(filings.id, signatures.filingId), eq(filings.firmId, actor.firmId)))
    .where(and(eq(signatures.firmId, actor.firmId), eq(filings.periodId, periodId)))
    .orderBy(signatures.signedAt);
  return rows
    .filter((r) => r.s.supersededAt !== null)
    .map((r) => ({ version: r.version, signerName: r.s.signerName, licenceReference: r.s.licenceReference, signedAt: r.s.signedAt, contentHash: r.s.contentHash, supersededAt: r.s.supersededAt!, reason: r.s.supersededReason ?? "" }));
}

/** Rebuild an editable version's content from its run with changed fields. */
async function rebuild(actor: Actor, row: FilingRow, changes: { run?: RunRecord; coverNote?: string; explanations?: Record<string, string>; status?: FilingStatus; submittedBy?: string | null }) {
  const period = await findPeriod(actor, row.periodId);
  const run = changes.run ?? (await getRun(actor, row.runId));
  const current = row.content;
  return assemble(actor, {
    period,
    run,
    version: row.version,
    previous: await previousOf(actor, row),
    status: changes.status ?? (row.status as FilingStatus),
    preparedBy: row.preparedBy,
    submittedBy: changes.submittedBy !== undefined ? changes.submittedBy : row.submittedBy,
    coverNote: changes.coverNote ?? row.coverNote,
    reason: row.reason,
    explanations: changes.explanations ?? explanationsOf(current),
    supersededSignatures: await supersededOf(actor, row.periodId),
  });
}

function lockedMessage(row: FilingRow): string {
  if (row.status === "superseded") return `Version ${row.version} was signed and has been superseded by a later version; it cannot be changed.`;
  if (row.status === "filed") return `Version ${row.version} was signed and filed (reference ${row.filingReference}); it cannot be changed.`;
  return `Version ${row.version} is signed and locked. A change makes a new version: start version ${row.version + 1} with the reason for the change.`;
}

/** A conditional update that lost a race (the status moved underneath it). */
function raced(): AppError {
  return new AppError("conflict:filing", "The filing changed while this was being saved; reload the page and try again.");
}

// ---------------------------------------------------------------------------------------------------------------
// preparing and editing

/**
 * Assemble the period's draft filing from its marked, completed run (version 1), or rebuild the open draft from the
 * marked run as it stands now (explanations for days that are no longer exceptions are dropped and listed).
 */
export async function prepareFiling(actor: Actor, periodId: string, input: PrepareFilingInput = {}): Promise<FilingDetail> {
  const period = await findPeriod(actor, periodId);
  const existing = await currentRow(actor, periodId);
  if (existing && !EDITABLE.includes(existing.status as FilingRowStatus)) {
    if (existing.status === "in_review") throw new AppError("conflict:filing", `Version ${existing.version} is in review with the compliance head; it can be rebuilt once changes are requested.`);
    throw new AppError("conflict:filing", lockedMessage(existing));
  }
  const run = await markedCompletedRun(actor, period);

  if (!existing) {
    const coverNote = input.coverNote ?? "";
    const content = await assemble(actor, { period, run, version: 1, previous: null, status: "draft", preparedBy: actor.userId, submittedBy: null, coverNote, reason: "", explanations: {}, supersededSignatures: [] });
    const id = await getDb().transaction(async (tx) => {
      const [clash] = await tx
        .select({ id: filings.id })
        .from(filings)
        .where(and(eq(filings.firmId, actor.firmId), eq(filings.periodId, periodId)))
        .limit(1);
      if (clash) throw raced();
      const [row] = await tx
        .insert(filings)
        .values({ firmId: actor.firmId, periodId, runId: run.id, version: 1, status: "draft", content, coverNote, preparedBy: actor.userId })
        .returning({ id: filings.id });
      await enqueuePackRender(tx, actor.firmId, [row.id]);
      await recordAudit(tx, actor, {
        action: "filing.prepare",
        entityType: "filing",
        entityId: row.id,
        summary: `Assembled the draft filing for the period ending ${period.periodEnd} (version 1) from the run of ${run.startedAt.slice(0, 16).replace("T", " ")} UTC`,
        detail: { periodId, runId: run.id, version: 1, methodVersion: content.method.version, contentHash: contentHash(content) },
      });
      return row.id;
    });
    return getFiling(actor, id);
  }

  const before = existing.content;
  const exceptionDates = new Set(run.results!.monthEnd.backtest.exceptionList.map((e) => e.date));
  const kept = Object.fromEntries(Object.entries(explanationsOf(before)).filter(([d]) => exceptionDates.has(d)));
  const dropped = Object.keys(explanationsOf(before)).filter((d) => !exceptionDates.has(d));
  const coverNote = input.coverNote ?? existing.coverNote;
  const content = await rebuild(actor, existing, { run, coverNote, explanations: kept });
  await getDb().transaction(async (tx) => {
    await enqueuePackRender(tx, actor.firmId, [existing.id]);
    const updated = await tx
      .update(filings)
      .set({ runId: run.id, content, coverNote })
      .where(and(eq(filings.id, existing.id), eq(filings.firmId, actor.firmId), eq(filings.status, existing.status)))
      .returning({ id: filings.id });
    if (!updated.length) throw raced();
    await recordAudit(tx, actor, {
      action: "filing.rebuild",
      entityType: "filing",
      entityId: existing.id,
      summary: `Rebuilt version ${existing.version} of the draft filing for the period ending ${period.periodEnd} from the run of ${run.startedAt.slice(0, 16).replace("T", " ")} UTC${dropped.length ? ` (explanations for ${dropped.join(", ")} dropped: no longer exceptions)` : ""}`,
      detail: { runId: run.id, previousRunId: existing.runId, droppedExplanations: dropped, contentHash: contentHash(content) },
    });
  });
  return getFiling(actor, existing.id);
}

/** The compliance officer's cover note and exception explanations, while the version is a draft or sent back. */
export async function updateFiling(actor: Actor, filingId: string, input: UpdateFilingInput): Promise<FilingDetail> {
  const row = await findRow(actor, filingId);
  if (LOCKED.includes(row.status as FilingRowStatus)) throw new AppError("conflict:filing_locked", lockedMessage(row));
  if (row.status === "in_review") throw new AppError("conflict:filing", `Version ${row.version} is in review; the compliance head requests changes before it can be edited again.`);
  const current = row.content;
  const exceptionDates = new Set(current.figures.backtest.exceptionList.map((e) => e.date));
  const explanations = explanationsOf(current);
  if (input.explanations) {
    const fields: Record<string, string> = {};
    for (const [date, text] of Object.entries(input.explanations)) {
      if (!exceptionDates.has(date)) fields[`explanations.${date}`] = `${date} is not a backtest exception of this filing's run.`;
      else if (text.trim() === "") delete explanations[date];
      else explanations[date] = text.trim();
    }
    if (Object.keys(fields).length) throw new AppError("unprocessable:filing_explanations", `Explanations are given for backtest exceptions only: ${Object.values(fields)[0]}`, fields);
  }
  const coverNote = input.coverNote !== undefined ? input.coverNote.trim() : row.coverNote;
  const content = await rebuild(actor, row, { coverNote, explanations });
  await getDb().transaction(async (tx) => {
    await enqueuePackRender(tx, actor.firmId, [row.id]);
    const updated = await tx
      .update(filings)
      .set({ coverNote, content })
      .where(and(eq(filings.id, row.id), eq(filings.firmId, actor.firmId), eq(filings.status, row.status)))
      .returning({ id: filings.id });
    if (!updated.length) throw raced();
    const what = [input.coverNote !== undefined ? "the cover note" : null, input.explanations ? `explanations for ${Object.keys(input.explanations).sort().join(", ")}` : null].filter(Boolean).join(" and ");
    await recordAudit(tx, actor, {
      action: "filing.edit",
      entityType: "filing",
      entityId: row.id,
      summary: `Edited ${what} of version ${row.version} of the draft filing`,
      detail: { coverNoteChanged: input.coverNote !== undefined && coverNote !== row.coverNote, explanationDates: Object.keys(input.explanations ?? {}), contentHash: contentHash(content) },
    });
  });
  return getFiling(actor, row.id);
}

// ---------------------------------------------------------------------------------------------------------------
// review

/** Send a draft (or a version sent back) to the compliance head; refused when its run is not the period's marked run. */
export async function submitFiling(actor: Actor, filingId: string, input: SubmitFilingInput = { note: "" }): Promise<FilingDetail> {
  const row = await findRow(actor, filingId);
  if (!EDITABLE.includes(row.status as FilingRowStatus)) {
    if (row.status === "in_review") throw new AppError("conflict:filing", `Version ${row.version} is already in review.`);
    throw new AppError("conflict:filing_locked", lockedMessage(row));
  }
  const period = await findPeriod(actor, row.periodId);
  const marked = await filingRunOf(actor, row.periodId);
  if (!marked || marked.id !== row.runId) {
    throw new AppError(
      "conflict:filing_run",
      marked
        ? `This draft was assembled from a run that is no longer the one marked for the period's filing. Rebuild the draft from the marked run (started ${marked.startedAt.slice(0, 16).replace("T", " ")} UTC by ${marked.startedByName}) before submitting it.`
        : `The period ending ${period.periodEnd} no longer has a run marked for its filing; the risk analyst marks one, then rebuild the draft before submitting it.`,
    );
  }
  await assertRunFresh(actor, marked.id, "be submitted for review");
  const content = await rebuild(actor, row, { run: marked, status: "in_review", submittedBy: actor.userId });
  const note = input.note.trim();
  await getDb().transaction(async (tx) => {
    await enqueuePackRender(tx, actor.firmId, [row.id]);
    const updated = await tx
      .update(filings)
      .set({ status: "in_review", submittedBy: actor.userId, content })
      .where(and(eq(filings.id, row.id), eq(filings.firmId, actor.firmId), eq(filings.status, row.status)))
      .returning({ id: filings.id });
    if (!updated.length) throw raced();
    if (note) await tx.insert(reviewComments).values({ firmId: actor.firmId, filingId: row.id, section: "general", body: note, kind: "submission_note", authorId: actor.userId });
    await tx.update(reportingPeriods).set({ state: "in_review" }).where(and(eq(reportingPeriods.id, row.periodId), eq(reportingPeriods.firmId, actor.firmId)));
    await recordAudit(tx, actor, {
      action: "filing.submit",
      entityType: "filing",
      entityId: row.id,
      summary: `${row.status === "changes_requested" ? "Resubmitted" : "Submitted"} version ${row.version} of the filing for the period ending ${period.periodEnd} for review`,
      detail: { fromStatus: row.status, runId: row.runId, note: note || null, contentHash: contentHash(content) },
    });
  });
  return getFiling(actor, row.id);
}

async function addComment(actor: Actor, filingId: string, input: FilingCommentInput, kind: "comment" | "reply", allowed: readonly FilingRowStatus[]): Promise<FilingDetail> {
  const row = await findRow(actor, filingId);
  if (!allowed.includes(row.status as FilingRowStatus)) {
    if (LOCKED.includes(row.status as FilingRowStatus)) throw new AppError("conflict:filing_locked", lockedMessage(row));
    throw new AppError("conflict:filing", kind === "comment" ? `Version ${row.version} is a draft that has not been submitted for review yet.` : `Version ${row.version} is in a state that takes no replies.`);
  }
  await getDb().transaction(async (tx) => {
    await tx.insert(reviewComments).values({ firmId: actor.firmId, filingId: row.id, section: input.section, body: input.body.trim(), kind, authorId: actor.userId });
    await recordAudit(tx, actor, {
      action: kind === "comment" ? "filing.comment" : "filing.reply",
      entityType: "filing",
      entityId: row.id,
      summary: `${kind === "comment" ? "Commented on" : "Answered on"} "${sectionLabel(input.section)}" of version ${row.version} of the filing`,
      detail: { section: input.section, body: input.body.trim() },
    });
  });
  return getFiling(actor, row.id);
}

/** The compliance head's comment on one section, while the version is in review (or sent back). */
export function commentOnFiling(actor: Actor, filingId: string, input: FilingCommentInput): Promise<FilingDetail> {
  return addComment(actor, filingId, input, "comment", ["in_review", "changes_requested"]);
}

/** The compliance officer's answer on one section, while the version is open. */
export function replyOnFiling(actor: Actor, filingId: string, input: FilingCommentInput): Promise<FilingDetail> {
  return addComment(actor, filingId, input, "reply", ["draft", "in_review", "changes_requested"]);
}

/** Send a version in review back to the compliance officer, with the reason (kept as a comment on the section). */
export async function requestChanges(actor: Actor, filingId: string, input: RequestChangesInput): Promise<FilingDetail> {
  const row = await findRow(actor, filingId);
  if (row.status !== "in_review") {
    if (LOCKED.includes(row.status as FilingRowStatus)) throw new AppError("conflict:filing_locked", lockedMessage(row));
    throw new AppError("conflict:filing", row.status === "changes_requested" ? `Changes to version ${row.version} are already requested.` : `Version ${row.version} has not been submitted for review.`);
  }
  await getDb().transaction(async (tx) => {
    await enqueuePackRender(tx, actor.firmId, [row.id]);
    const updated = await tx
      .update(filings)
      .set({ status: "changes_requested" })
      .where(and(eq(filings.id, row.id), eq(filings.firmId, actor.firmId), eq(filings.status, "in_review")))
      .returning({ id: filings.id });
    if (!updated.length) throw raced();
    await tx.insert(reviewComments).values({ firmId: actor.firmId, filingId: row.id, section: input.section, body: input.reason.trim(), kind: "changes_requested", authorId: actor.userId });
    await recordAudit(tx, actor, {
      action: "filing.request_changes",
      entityType: "filing",
      entityId: row.id,
      summary: `Requested changes to version ${row.version} of the filing ("${sectionLabel(input.section)}")`,
      detail: { section: input.section, reason: input.reason.trim() },
    });
  });
  return getFiling(actor, row.id);
}

// ---------------------------------------------------------------------------------------------------------------
// signing

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
  return fourEyesRefusal(actor, row, await getRun(actor, row.runId));
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
  const run = await getRun(actor, row.runId);
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

  const marked = await filingRunOf(actor, row.periodId);
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
    const moved = await tx
      .update(filings)
      .set({ status: "superseded" })
      .where(and(eq(filings.id, row.id), eq(filings.firmId, actor.firmId), eq(filings.status, "signed")))
      .returning({ id: filings.id });
    if (!moved.length) throw raced();
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
    const updated = await tx
      .update(filings)
      .set({ status: "filed", filedAt: input.filedOn, filingReference: reference })
      .where(and(eq(filings.id, row.id), eq(filings.firmId, actor.firmId), eq(filings.status, "signed")))
      .returning({ id: filings.id });
    if (!updated.length) throw raced();
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

// ---------------------------------------------------------------------------------------------------------------
// packs

/** The file name of a pack (reports/file-names.ts), e.g. northmoor-2026-11-v2-draft.docx. */
export { packFileName };

/**
 * What a filing version's packs are rendered from, as it is now (lib/data/packs.ts); another firm's is not found.
 * The content is read as stored text and keyed by its SHA-256 with the fields a read overlays (status, filing date,
 * reference); it is parsed only when a pack must be rendered.
 */
export async function packSource(actor: Actor, filingId: string): Promise<PackSource> {
  const [row] = await getDb()
    .select({ id: filings.id, periodId: filings.periodId, version: filings.version, status: filings.status, filedAt: filings.filedAt, filingReference: filings.filingReference, text: sql<string>`${filings.content}` })
    .from(filings)
    .where(and(eq(filings.id, filingId), eq(filings.firmId, actor.firmId)));
  if (!row) throw new AppError("not_found:filing", "No such filing.");
  const [firm, period] = await Promise.all([firmOf(actor), findPeriod(actor, row.periodId)]);
  const status = row.status as FilingRowStatus;
  return {
    firmId: actor.firmId,
    filingId: row.id,
    version: row.version,
    status,
    state: status === "signed" || status === "filed" || status === "superseded" ? status : "draft",
    contentKey: packContentKey(row.text, { status, filedAt: row.filedAt, filingReference: row.filingReference }),
    content: () => presentContent({ content: JSON.parse(row.text) as FilingViewModel, status, filedAt: row.filedAt, filingReference: row.filingReference }),
    fileName: (kind) => packFileName(firm.slug, period.periodEnd, row.version, status, kind),
  };
}

/**
 * One of the two packs of a filing version for download: the stored bytes of this version, state and content, or
 * rendered once, stored and served (lib/data/packs.ts); each download is recorded in the audit trail.
 */
export async function downloadPack(actor: Actor, filingId: string, kind: PackKind, render?: PackRenderer): Promise<PackFile> {
  const source = await packSource(actor, filingId);
  const pack = await storedOrRenderPack(source, kind, render);
  await getDb().transaction(async (tx) => {
    await recordAudit(tx, actor, {
      action: "filing.download",
      entityType: "filing",
      entityId: source.filingId,
      summary: `Downloaded the ${PACK_KINDS[kind].label} pack ${pack.fileName}`,
      detail: { kind, fileName: pack.fileName, version: source.version, status: source.status, bytes: pack.bytes.byteLength, sha256: pack.sha256 },
    });
  });
  return { fileName: pack.fileName, contentType: PACK_KINDS[kind].contentType, bytes: pack.bytes, sha256: pack.sha256 };
}
