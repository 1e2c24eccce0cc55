/**
 * The firm's method statement: versions, drafts, evidence, approval (with the firm's optional co-approval by a
 * compliance head), discarding, and the differences between two versions. Approved versions never change (SQLite
 * triggers in db/migrations/0003_method_immutable.sql); a change is a new draft pointing at the approved one, with
 * a reason.
 */
import "server-only";
import { approvedMethodRow } from "@/lib/data/approved-method";
import { firmRow } from "@/lib/data/firm-row";
import { and, desc, eq, isNull, max } from "drizzle-orm";
import { getDb, type Database, type Tx } from "@/db/client";
import { firms, instruments, methodStatements, positions, reportingPeriods, uploads } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import { userNames } from "./people";
import type { Actor } from "@/lib/auth/actor";
import { now, today } from "@/lib/clock";
import { DEFAULT_METHOD_CONTENT, methodDraftSchema, readMethodContent, type MethodContent, type MethodDraft } from "@/lib/validation/method";
import { combineLimitations, diffContent, splitLimitations, type FieldChange } from "@/lib/method/describe";
import { buildEvidence, type MethodEvidence } from "@/lib/method/evidence";
import { priceSeries } from "./prices";
import { latestBookInputs, methodCheckOnLatestBook } from "./runs";
import { bookEvidenceOf } from "@/lib/method/book-evidence";
import { infeasibilityMessage } from "@/lib/runs/feasibility";

/** Set fields of this firm's draft version `id` in the transaction; a version that is no longer a draft is a conflict. */
async function updateDraft(tx: Tx, actor: Actor, id: string, values: Partial<typeof methodStatements.$inferInsert>): Promise<void> {
  const updated = await tx
    .update(methodStatements)
    .set(values)
    .where(and(eq(methodStatements.id, id), eq(methodStatements.firmId, actor.firmId), eq(methodStatements.status, "draft")))
    .returning({ id: methodStatements.id });
  if (updated.length === 0) throw new AppError("conflict:method_status", "This version is no longer a draft; reload the page.");
}

export type MethodStatus = "draft" | "approved" | "superseded" | "discarded";

export interface PersonRef {
  id: string;
  name: string;
}

/** A version as pages and routes show it. */
export interface MethodVersion {
  id: string;
  version: number;
  status: MethodStatus;
  /** approved by the analyst, waiting for a compliance head (firms that require co-approval) */
  awaitingCoApproval: boolean;
  content: MethodContent;
  rationale: string;
  /** every stored limitation, the engine's first */
  limitations: string[];
  engineLimitations: string[];
  analystLimitations: string[];
  evidence: MethodEvidence | null;
  reason: string;
  previousId: string | null;
  previousVersion: number | null;
  createdBy: PersonRef;
  approvedBy: PersonRef | null;
  coApprovedBy: PersonRef | null;
  approvedAt: string | null;
  createdAt: string;
}

/** A version in the history list. */
export interface MethodVersionSummary {
  id: string;
  version: number;
  status: MethodStatus;
  awaitingCoApproval: boolean;
  reason: string;
  createdBy: PersonRef;
  approvedBy: PersonRef | null;
  coApprovedBy: PersonRef | null;
  approvedAt: string | null;
  createdAt: string;
  hasEvidence: boolean;
}

type Row = typeof methodStatements.$inferSelect;


const ref = (id: string | null, byId: Map<string, string>): PersonRef | null => (id ? { id, name: byId.get(id) ?? "Former member" } : null);

function summarise(row: Row, byId: Map<string, string>): MethodVersionSummary {
  return {
    id: row.id,
    version: row.version,
    status: row.status as MethodStatus,
    awaitingCoApproval: row.status === "draft" && row.approvedBy !== null,
    reason: row.reason,
    createdBy: ref(row.createdBy, byId)!,
    approvedBy: ref(row.approvedBy, byId),
    coApprovedBy: ref(row.coApprovedBy, byId),
    approvedAt: row.approvedAt,
    createdAt: row.createdAt,
    hasEvidence: row.evidence !== null,
  };
}

async function present(row: Row): Promise<MethodVersion> {
  const byId = await userNames([row.createdBy, row.approvedBy, row.coApprovedBy]);
  const content = readMethodContent(row.content);
  const { engine, analyst } = splitLimitations(content, row.limitations);
  let previousVersion: number | null = null;
  if (row.previousId) {
    const [prev] = await getDb()
      .select({ version: methodStatements.version })
      .from(methodStatements)
      .where(and(eq(methodStatements.id, row.previousId), eq(methodStatements.firmId, row.firmId)));
    previousVersion = prev?.version ?? null;
  }
  const summary = summarise(row, byId);
  return {
    ...summary,
    content,
    rationale: row.rationale,
    limitations: row.limitations,
    engineLimitations: engine,
    analystLimitations: analyst,
    evidence: row.evidence ?? null,
    previousId: row.previousId,
    previousVersion,
  };
}

async function findRow(actor: Actor, methodId: string): Promise<Row> {
  return firmRow(methodStatements, actor.firmId, methodId, "not_found:method", "No such method statement version.");
}

/** The firm's approved version (the newest, should there be more than one), read through `db` (a transaction or the database). */
async function approvedRow(actor: Actor, db: Database | Tx = getDb()): Promise<Row | null> {
  return approvedMethodRow(actor.firmId, db);
}

/** The firm's approved version (the one runs use), or null when none is approved yet. */
export async function currentMethod(actor: Actor): Promise<MethodVersion | null> {
  const row = await approvedRow(actor);
  return row ? present(row) : null;
}

/** Every version of the firm, newest first. */
export async function listMethodVersions(actor: Actor): Promise<MethodVersionSummary[]> {
  const rows = await getDb().select().from(methodStatements).where(eq(methodStatements.firmId, actor.firmId)).orderBy(desc(methodStatements.version));
  const byId = await userNames(rows.flatMap((r) => [r.createdBy, r.approvedBy, r.coApprovedBy]));
  return rows.map((r) => summarise(r, byId));
}

/** One version of the firm; another firm's version is not found. */
export async function getMethodVersion(actor: Actor, methodId: string): Promise<MethodVersion> {
  return present(await findRow(actor, methodId));
}

/**
 * Whether the firm requires a compliance head to co-approve method statements: yes by default; no only where the
 * firm turned it off and stated why (firms.methodSingleApprovalReason).
 */
export async function coApprovalRequired(actor: Actor): Promise<boolean> {
  const [firm] = await getDb().select({ required: firms.methodCoApproval, reason: firms.methodSingleApprovalReason }).from(firms).where(eq(firms.id, actor.firmId));
  return !firm || firm.required || firm.reason.trim() === "";
}

/**
 * Open a new draft: a copy of the approved version (a reason is then required), or the defaults when the firm has
 * none. Only one draft is open at a time.
 */
export async function createMethodDraft(actor: Actor, input: { reason?: string }): Promise<MethodVersion> {
  const reason = (input.reason ?? "").trim();
  const id = await getDb().transaction(async (tx) => {
    const [open] = await tx
      .select({ id: methodStatements.id, version: methodStatements.version })
      .from(methodStatements)
      .where(and(eq(methodStatements.firmId, actor.firmId), eq(methodStatements.status, "draft")));
    if (open) throw new AppError("conflict:method_draft", `Version ${open.version} is already a draft: finish or discard it first.`);
    const approved = await approvedRow(actor, tx);
    if (approved && reason.length < 5) {
      throw new AppError("unprocessable:method_reason", `Say why version ${approved.version} needs to change.`, { reason: "Give the reason for the change (at least 5 characters)." });
    }
    const [{ top }] = await tx.select({ top: max(methodStatements.version) }).from(methodStatements).where(eq(methodStatements.firmId, actor.firmId));
    const version = (top ?? 0) + 1;
    const content: MethodContent = approved ? readMethodContent(approved.content) : DEFAULT_METHOD_CONTENT;
    const analyst = approved ? splitLimitations(content, approved.limitations).analyst : [];
    const [row] = await tx
      .insert(methodStatements)
      .values({
        firmId: actor.firmId,
        version,
        status: "draft",
        content,
        rationale: approved?.rationale ?? "",
        limitations: combineLimitations(content, analyst),
        evidence: null,
        reason,
        previousId: approved?.id ?? null,
        createdBy: actor.userId,
      })
      .returning({ id: methodStatements.id });
    await recordAudit(tx, actor, {
      action: "method.draft",
      entityType: "method_statement",
      entityId: row.id,
      summary: approved ? `Started method statement version ${version} from version ${approved.version}: ${reason}` : `Started method statement version ${version} from the defaults`,
      detail: { version, previousId: approved?.id ?? null, reason },
    });
    return row.id;
  });
  return getMethodVersion(actor, id);
}

function refuseUnlessDraft(row: Row, doing: string): void {
  if (row.status !== "draft") throw new AppError("conflict:method_status", `Version ${row.version} is ${row.status}; only a draft can be ${doing}.`);
}

/** Field errors from a zod error: "path.to.field" → first message (as the route wrapper reports them). */
function fieldErrors(error: { issues: { path: PropertyKey[]; message: string }[] }): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) fields[issue.path.map(String).join(".") || "_"] ??= issue.message;
  return fields;
}

/** Check a draft again on the server; refusals are field by field and nothing is stored. */
function checkDraft(input: unknown, previousId: string | null): MethodDraft {
  const parsed = methodDraftSchema.safeParse(input);
  if (!parsed.success) {
    const fields = fieldErrors(parsed.error);
    const first = Object.entries(fields)[0];
    throw new AppError("unprocessable:method", `Some values are not valid: ${first ? `${first[0]}: ${first[1]}` : "check the form"}.`, fields);
  }
  if (previousId && parsed.data.reason.length < 5) {
    throw new AppError("unprocessable:method", "Give the reason for the change.", { reason: "Give the reason for the change (at least 5 characters)." });
  }
  return parsed.data;
}

/** Save a draft's content, rationale, the analyst's limitations and the reason. An analyst's pending approval is withdrawn. */
export async function updateMethodDraft(actor: Actor, methodId: string, input: unknown): Promise<MethodVersion> {
  const row = await findRow(actor, methodId);
  refuseUnlessDraft(row, "edited");
  const draft = checkDraft(input, row.previousId);
  const limitations = combineLimitations(draft.content, draft.analystLimitations);
  await getDb().transaction(async (tx) => {
    await updateDraft(tx, actor, row.id, { content: draft.content, rationale: draft.rationale, limitations, reason: draft.reason, approvedBy: null });
    await recordAudit(tx, actor, {
      action: "method.update",
      entityType: "method_statement",
      entityId: row.id,
      summary: `Saved draft method statement version ${row.version}${row.approvedBy ? " (the pending approval was withdrawn)" : ""}`,
      detail: { version: row.version, changes: diffContent(readMethodContent(row.content), draft.content), withdrewApproval: row.approvedBy !== null },
    });
  });
  return getMethodVersion(actor, row.id);
}

/** The period whose positions name the asset classes: the given one, else the latest with confirmed positions, else the latest. */
async function evidencePeriod(actor: Actor, periodId?: string) {
  const db = getDb();
  if (periodId) {
    const [p] = await db.select().from(reportingPeriods).where(and(eq(reportingPeriods.id, periodId), eq(reportingPeriods.firmId, actor.firmId)));
    if (!p) throw new AppError("not_found:period", "No such reporting period.");
    return p;
  }
  const [withPositions] = await db
    .select({ period: reportingPeriods })
    .from(reportingPeriods)
    .innerJoin(uploads, and(eq(uploads.periodId, reportingPeriods.id), eq(uploads.firmId, actor.firmId), eq(uploads.kind, "positions"), eq(uploads.status, "confirmed")))
    .where(eq(reportingPeriods.firmId, actor.firmId))
    .orderBy(desc(reportingPeriods.periodEnd))
    .limit(1);
  if (withPositions) return withPositions.period;
  const [latest] = await db.select().from(reportingPeriods).where(eq(reportingPeriods.firmId, actor.firmId)).orderBy(desc(reportingPeriods.periodEnd)).limit(1);
  return latest ?? null;
}

/**
 * Compute the evidence: for each asset class of the period's confirmed positions (or of the firm's instruments when
 * none are confirmed), the equal-weight daily log returns of that class's instruments with enough stored history,
 * compared across estimators by the engine.
 */
export async function computeEvidence(
  actor: Actor,
  options: { periodId?: string; minHistory?: number; book?: { content: MethodContent; version: number; approved: { version: number; content: MethodContent } | null } } = {},
): Promise<MethodEvidence> {
  const db = getDb();
  const period = await evidencePeriod(actor, options.periodId);
  const asOf = period && period.periodEnd < today() ? period.periodEnd : today();
  const classes = new Map<string, string[]>();
  let source: MethodEvidence["source"] = "instruments";
  if (period) {
    const [upload] = await db
      .select({ id: uploads.id })
      .from(uploads)
      .where(and(eq(uploads.firmId, actor.firmId), eq(uploads.periodId, period.id), eq(uploads.kind, "positions"), eq(uploads.status, "confirmed")));
    if (upload) {
      source = "positions";
      const rows = await db
        .select({ code: positions.instrument, assetClass: positions.assetClass })
        .from(positions)
        .where(and(eq(positions.firmId, actor.firmId), eq(positions.uploadId, upload.id)));
      for (const r of rows) classes.set(r.assetClass, [...(classes.get(r.assetClass) ?? []), r.code]);
    }
  }
  if (source === "instruments") {
    const rows = await db.select({ code: instruments.code, assetClass: instruments.assetClass }).from(instruments).where(and(eq(instruments.firmId, actor.firmId), isNull(instruments.pendingUpload)));
    for (const r of rows) if (r.assetClass !== "unknown") classes.set(r.assetClass, [...(classes.get(r.assetClass) ?? []), r.code]);
  }
  const series = await priceSeries(actor.firmId, asOf);
  // the version and its candidates backtested on the firm's latest book (the period above when it has positions)
  const book = options.book
    ? bookEvidenceOf(await latestBookInputs(actor, options.book.content, source === "positions" ? period?.id : undefined), options.book.content, options.book.version, options.book.approved)
    : undefined;
  const evidence = buildEvidence({
    series,
    classes,
    minReturns: options.minHistory ?? DEFAULT_METHOD_CONTENT.minHistory,
    computedAt: now().toISOString(),
    asOf,
    periodId: period?.id ?? null,
    periodEnd: period?.periodEnd ?? null,
    source,
  });
  return book === undefined ? evidence : { ...evidence, book };
}

/** Recompute the evidence and attach it to a draft. An analyst's pending approval is withdrawn. */
export async function attachEvidence(actor: Actor, methodId: string, options: { periodId?: string } = {}): Promise<MethodVersion> {
  const row = await findRow(actor, methodId);
  refuseUnlessDraft(row, "given new evidence");
  const content = readMethodContent(row.content);
  const approved = await approvedRow(actor);
  const evidence = await computeEvidence(actor, {
    periodId: options.periodId,
    minHistory: content.minHistory,
    book: { content, version: row.version, approved: approved ? { version: approved.version, content: readMethodContent(approved.content) } : null },
  });
  await getDb().transaction(async (tx) => {
    await updateDraft(tx, actor, row.id, { evidence, approvedBy: null });
    await recordAudit(tx, actor, {
      action: "method.evidence",
      entityType: "method_statement",
      entityId: row.id,
      summary: `Attached estimator evidence to method statement version ${row.version} (prices to ${evidence.asOf}, ${evidence.classes.length} asset classes)`,
      detail: {
        version: row.version,
        asOf: evidence.asOf,
        classes: evidence.classes.map((c) => ({ assetClass: c.assetClass, instruments: c.instruments.length, from: c.from, to: c.to, best: c.comparison?.ranking[0]?.id ?? null })),
        book: evidence.book
          ? { periodEnd: evidence.book.periodEnd, error: evidence.book.error, rows: (evidence.book.candidates?.rows ?? []).map((r) => ({ id: r.id, exceptions: r.exceptions, zone: r.zone })) }
          : null,
      },
    });
  });
  return getMethodVersion(actor, row.id);
}

/** What approval needs before it may proceed: valid content, the reason, the evidence. */
function checkApprovable(row: Row): void {
  const draft = checkDraft(
    { content: row.content, rationale: row.rationale, analystLimitations: splitLimitations(readMethodContent(row.content), row.limitations).analyst, reason: row.reason },
    row.previousId,
  );
  void draft;
  if (!row.evidence) throw new AppError("unprocessable:method_evidence", "Attach the evidence before approving.", { evidence: "Attach the evidence before approving." });
}

/**
 * Approve a draft. The risk analyst approves; where the firm requires co-approval the version waits for a compliance
 * head — a different person — and becomes approved when they co-approve. The previously approved version becomes
 * superseded in the same transaction, with the audit record.
 */
export async function approveMethod(actor: Actor, methodId: string, input: { note?: string } = {}): Promise<MethodVersion> {
  const row = await findRow(actor, methodId);
  refuseUnlessDraft(row, "approved");
  const required = await coApprovalRequired(actor);
  const note = (input.note ?? "").trim();
  const isAnalyst = actor.roles.includes("risk_analyst");
  const isHead = actor.roles.includes("compliance_head");

  let step: "approve" | "approve-final" | "co-approve";
  if (row.approvedBy === null) {
    if (!isAnalyst) throw new AppError("conflict:method_approval", "The risk analyst approves first; a compliance head then co-approves.");
    step = required ? "approve" : "approve-final";
  } else if (!required) {
    if (!isAnalyst) throw new AppError("conflict:method_approval", "The firm does not require co-approval; the risk analyst approves.");
    step = "approve-final";
  } else {
    if (!isHead) throw new AppError("conflict:method_approval", `Version ${row.version} is approved by the risk analyst and waits for a compliance head to co-approve.`);
    if (actor.userId === row.approvedBy || actor.userId === row.createdBy) {
      throw new AppError("forbidden:method_coapproval", "A different person co-approves: you drafted or approved this version yourself.");
    }
    step = "co-approve";
  }
  checkApprovable(row);
  // choices that cannot be computed for a factor of the firm's latest book are refused, naming the class, the factor and why
  const feasibility = await methodCheckOnLatestBook(actor, readMethodContent(row.content));
  if (feasibility.items.length) {
    throw new AppError("unprocessable:method_infeasible", infeasibilityMessage(feasibility.items, `Version ${row.version} cannot be approved on the book of ${feasibility.periodEnd}`), {
      content: feasibility.items.map((i) => `${i.factor}: ${i.reason}`).join("; "),
    });
  }

  const at = now().toISOString();
  await getDb().transaction(async (tx) => {
    if (step === "approve") {
      await updateDraft(tx, actor, row.id, { approvedBy: actor.userId });
      await recordAudit(tx, actor, {
        action: "method.approve",
        entityType: "method_statement",
        entityId: row.id,
        summary: `Approved method statement version ${row.version}; waiting for a compliance head to co-approve`,
        detail: { version: row.version, note, awaitingCoApproval: true },
      });
      return;
    }
    const previous = await tx
      .update(methodStatements)
      .set({ status: "superseded" })
      .where(and(eq(methodStatements.firmId, actor.firmId), eq(methodStatements.status, "approved")))
      .returning({ id: methodStatements.id, version: methodStatements.version });
    await updateDraft(
      tx,
      actor,
      row.id,
      step === "co-approve" ? { status: "approved", coApprovedBy: actor.userId, approvedAt: at } : { status: "approved", approvedBy: actor.userId, approvedAt: at },
    );
    const superseded = previous.map((p) => p.version);
    await recordAudit(tx, actor, {
      action: step === "co-approve" ? "method.co_approve" : "method.approve",
      entityType: "method_statement",
      entityId: row.id,
      summary:
        `${step === "co-approve" ? "Co-approved" : "Approved"} method statement version ${row.version}` +
        (superseded.length ? `; version ${superseded.join(", ")} is superseded` : ""),
      detail: { version: row.version, note, superseded: previous.map((p) => p.id), approvedAt: at, ...(step === "approve-final" ? { onePersonApproval: true } : {}) },
      at,
    });
  });
  return getMethodVersion(actor, row.id);
}

/** Discard a draft. The row is kept, marked discarded, so that the version number and the audit trail stay meaningful. */
export async function discardMethodDraft(actor: Actor, methodId: string, input: { reason?: string } = {}): Promise<MethodVersion> {
  const row = await findRow(actor, methodId);
  refuseUnlessDraft(row, "discarded");
  const reason = (input.reason ?? "").trim();
  await getDb().transaction(async (tx) => {
    await updateDraft(tx, actor, row.id, { status: "discarded" });
    await recordAudit(tx, actor, {
      action: "method.discard",
      entityType: "method_statement",
      entityId: row.id,
      summary: `Discarded draft method statement version ${row.version}${reason ? `: ${reason}` : ""}`,
      detail: { version: row.version, reason },
    });
  });
  return getMethodVersion(actor, row.id);
}

/** The differences between two versions. */
export interface MethodDiff {
  from: { id: string; version: number; status: MethodStatus } | null;
  to: { id: string; version: number; status: MethodStatus; reason: string };
  content: FieldChange[];
  rationale: { changed: boolean; from: string | null; to: string };
  limitations: { added: string[]; removed: string[]; kept: number };
  evidence: { from: string | null; to: string | null };
}

/**
 * Field-by-field differences between two versions of the firm. Without `to`, the newest version; without `from`,
 * the version `to` was drawn from (none for a first version).
 */
export async function diffMethodVersions(actor: Actor, fromId?: string, toId?: string): Promise<MethodDiff | null> {
  let to: Row | null = toId ? await findRow(actor, toId) : null;
  if (!to) {
    const [latest] = await getDb().select().from(methodStatements).where(eq(methodStatements.firmId, actor.firmId)).orderBy(desc(methodStatements.version)).limit(1);
    if (!latest) return null;
    to = latest;
  }
  const from: Row | null = fromId ? await findRow(actor, fromId) : to.previousId ? await findRow(actor, to.previousId) : null;
  const toContent = readMethodContent(to.content);
  const fromContent = from ? readMethodContent(from.content) : null;
  const evidenceDate = (r: Row | null) => (r?.evidence ? String(r.evidence.computedAt) : null);
  return {
    from: from ? { id: from.id, version: from.version, status: from.status as MethodStatus } : null,
    to: { id: to.id, version: to.version, status: to.status as MethodStatus, reason: to.reason },
    content: fromContent ? diffContent(fromContent, toContent) : [],
    rationale: { changed: !!from && from.rationale !== to.rationale, from: from?.rationale ?? null, to: to.rationale },
    limitations: from
      ? { added: to.limitations.filter((t) => !from.limitations.includes(t)), removed: from.limitations.filter((t) => !to.limitations.includes(t)), kept: to.limitations.filter((t) => from.limitations.includes(t)).length }
      : { added: [], removed: [], kept: to.limitations.length },
    evidence: { from: evidenceDate(from), to: evidenceDate(to) },
  };
}
