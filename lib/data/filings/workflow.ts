/** The filing's workflow before signing: preparing and editing the draft, submitting, comments and replies, requesting changes. */
import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { filings, reportingPeriods, reviewComments } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import { sectionLabel, type FilingCommentInput, type PrepareFilingInput, type RequestChangesInput, type SubmitFilingInput, type UpdateFilingInput } from "@/lib/validation/filings";
import { contentHash } from "@/reports/view-model";
import { filingRunOf } from "../runs";
import { enqueuePackRender } from "../packs";
import { assertRunFresh } from "../run-freshness";
import { FilingRowStatus, FilingDetail, LOCKED, EDITABLE } from "./types";
import { findRow, findPeriod, getFiling, currentRow } from "./read";
import { assemble, explanationsOf, markedCompletedRun, rebuild, lockedMessage, raced, updateFilingWhile } from "./assemble";

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
    await updateFilingWhile(tx, actor, existing.id, existing.status, { runId: run.id, content, coverNote });
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
    await updateFilingWhile(tx, actor, row.id, row.status, { coverNote, content });
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
    await updateFilingWhile(tx, actor, row.id, row.status, { status: "in_review", submittedBy: actor.userId, content });
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
    await updateFilingWhile(tx, actor, row.id, "in_review", { status: "changes_requested" });
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
