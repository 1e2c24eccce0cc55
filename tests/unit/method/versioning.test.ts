import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { actorFor, snapshot } from "../helpers/db";
import { methodDatabase, NORTHMOOR, PELLAM } from "./setup";
import {
  approveMethod,
  attachEvidence,
  createMethodDraft,
  currentMethod,
  discardMethodDraft,
  getMethodVersion,
  listMethodVersions,
  updateMethodDraft,
  diffMethodVersions,
} from "@/lib/data/method";
import { auditEvents, firms, memberships, methodStatements } from "@/db/schema";
import { NORTHMOOR_METHOD } from "@/db/seed-method";
import { LIMITATIONS } from "@/lib/risk/limitations";
import type { Database } from "@/db/client";
import type { Actor } from "@/lib/auth/actor";
import { AppError } from "@/lib/errors";

let db: Database;
let analyst: Actor;
let head: Actor;
let analystOfficer: Actor;

async function refusal(promise: Promise<unknown>): Promise<AppError> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error("expected a refusal");
}

beforeAll(async () => {
  db = await methodDatabase({ withMethod: true });
  analyst = await actorFor(NORTHMOOR.analyst);
  head = await actorFor(NORTHMOOR.head);
  analystOfficer = await actorFor(NORTHMOOR.analystOfficer);
});

describe("the seeded first version", () => {
  it("is approved by the risk analyst and co-approved by the compliance head, with evidence, the engine's limitations and the audit trail", async () => {
    const current = await currentMethod(analyst);
    expect(current).toMatchObject({ version: 1, status: "approved", awaitingCoApproval: false, previousId: null });
    expect(current!.approvedBy?.name).toBe("Priya Castell");
    expect(current!.coApprovedBy?.name).toBe("Helen Marsh");
    // the demo's history: approved in mid-September, stamped at the co-approval
    expect(current!.approvedAt).toBe("2026-09-15T14:00:00.000Z");
    expect(current!.content.byAssetClass.equity).toMatchObject({ kind: "garch", distribution: "t", fallback: "ewma" });
    // EWMA (default and fallback) and GARCH chosen: both catalogues are on the version, first, and marked as the engine's.
    for (const text of [...LIMITATIONS.ewma, ...LIMITATIONS.garch]) expect(current!.engineLimitations).toContain(text);
    expect(current!.engineLimitations).not.toContain(LIMITATIONS.ma[0]);
    expect(current!.analystLimitations).toEqual(NORTHMOOR_METHOD.analystLimitations);
    expect(current!.limitations.slice(0, current!.engineLimitations.length)).toEqual(current!.engineLimitations);
    expect(current!.evidence?.classes.length).toBeGreaterThan(0);
    const actions = (await db.select().from(auditEvents).where(eq(auditEvents.entityId, current!.id))).map((e) => e.action);
    expect(actions).toEqual(["method.draft", "method.update", "method.evidence", "method.approve", "method.co_approve"]);
  });
});

describe("a new version", () => {
  it("needs a reason once a version is approved, and nothing is stored without one", async () => {
    const before = await snapshot(db);
    const error = await refusal(createMethodDraft(analyst, { reason: "" }));
    expect(error.code).toBe("unprocessable:method_reason");
    expect(error.fields?.reason).toMatch(/reason/);
    expect(await snapshot(db)).toEqual(before);
  });

  it("starts as a draft copy of the approved version, pointing at it", async () => {
    const v1 = (await currentMethod(analyst))!;
    const v2 = await createMethodDraft(analyst, { reason: "Use a fitted λ for the bonds." });
    expect(v2).toMatchObject({ version: 2, status: "draft", previousId: v1.id, previousVersion: 1, reason: "Use a fitted λ for the bonds.", evidence: null });
    expect(v2.content).toEqual(v1.content);
    expect(v2.rationale).toBe(v1.rationale);
    expect(v2.analystLimitations).toEqual(v1.analystLimitations);
  });

  it("is the only draft: a second one is refused", async () => {
    expect((await refusal(createMethodDraft(analyst, { reason: "Another change." }))).code).toBe("conflict:method_draft");
  });

  it("keeps the engine's limitations whatever the analyst sends, and adds the catalogue of a newly chosen estimator", async () => {
    const [draft] = (await listMethodVersions(analyst)).filter((v) => v.status === "draft");
    const saved = await updateMethodDraft(analyst, draft.id, {
      ...NORTHMOOR_METHOD,
      content: { ...NORTHMOOR_METHOD.content, byAssetClass: { ...NORTHMOOR_METHOD.content.byAssetClass, government_bond: { kind: "arch", order: 2 } } },
      analystLimitations: ["Bond prices are clean prices; accrued interest is left out."],
      reason: "Use ARCH(2) for the bonds.",
    });
    for (const text of [...LIMITATIONS.ewma, ...LIMITATIONS.garch, ...LIMITATIONS.arch]) expect(saved.engineLimitations).toContain(text);
    expect(saved.analystLimitations).toEqual(["Bond prices are clean prices; accrued interest is left out."]);
  });

  it("cannot be approved without evidence", async () => {
    const [draft] = (await listMethodVersions(analyst)).filter((v) => v.status === "draft");
    const error = await refusal(approveMethod(analyst, draft.id));
    expect(error.code).toBe("unprocessable:method_evidence");
    expect((await getMethodVersion(analyst, draft.id)).status).toBe("draft");
  });

  it("a compliance head cannot approve before the analyst", async () => {
    const [draft] = (await listMethodVersions(analyst)).filter((v) => v.status === "draft");
    expect((await refusal(approveMethod(head, draft.id))).code).toBe("conflict:method_approval");
  });

  it("needs a second person by default: with co-approval turned off but no reason stated, the analyst's approval still waits", async () => {
    const [draft] = (await listMethodVersions(analyst)).filter((v) => v.status === "draft");
    await attachEvidence(analyst, draft.id);
    await db.update(firms).set({ methodCoApproval: false, methodSingleApprovalReason: "" }).where(eq(firms.id, analyst.firmId));
    expect((await approveMethod(analyst, draft.id)).awaitingCoApproval).toBe(true);
    // saving withdraws the pending approval, so the next test starts from a plain draft
    await updateMethodDraft(analyst, draft.id, { ...NORTHMOOR_METHOD, reason: "Use ARCH(2) for the bonds." });
  });

  it("is approved by the analyst alone where the firm allows it with a stated reason; the earlier version becomes superseded, in one transaction with the audit record", async () => {
    const [draft] = (await listMethodVersions(analyst)).filter((v) => v.status === "draft");
    await attachEvidence(analyst, draft.id);
    await db.update(firms).set({ methodCoApproval: false, methodSingleApprovalReason: "A two-person firm: the compliance head drafts the statement with the analyst." }).where(eq(firms.id, analyst.firmId));
    const v1 = (await currentMethod(analyst))!;
    const approved = await approveMethod(analyst, draft.id, { note: "Reviewed." });
    expect(approved).toMatchObject({ version: 2, status: "approved", approvedBy: { name: "Priya Castell" }, coApprovedBy: null });
    expect((await getMethodVersion(analyst, v1.id)).status).toBe("superseded");
    expect((await currentMethod(analyst))!.id).toBe(draft.id);
    // the last approval record (the earlier one was the withdrawn approval of the test before)
    const event = (await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, draft.id), eq(auditEvents.action, "method.approve")))).at(-1)!;
    expect(event.summary).toBe("Approved method statement version 2; version 1 is superseded");
    expect(event.detail).toMatchObject({ onePersonApproval: true });
  });

  it("an approved version can no longer be edited, given evidence, approved again or discarded", async () => {
    const v2 = (await currentMethod(analyst))!;
    const before = await snapshot(db);
    expect((await refusal(updateMethodDraft(analyst, v2.id, { ...NORTHMOOR_METHOD, reason: "x".repeat(10) }))).code).toBe("conflict:method_status");
    expect((await refusal(attachEvidence(analyst, v2.id))).code).toBe("conflict:method_status");
    expect((await refusal(approveMethod(analyst, v2.id))).code).toBe("conflict:method_status");
    expect((await refusal(discardMethodDraft(analyst, v2.id))).code).toBe("conflict:method_status");
    expect(await snapshot(db)).toEqual(before);
  });

  it("a draft can be discarded; it stays in the history as discarded and the approved version is untouched", async () => {
    const draft = await createMethodDraft(analyst, { reason: "Try a longer window." });
    const discarded = await discardMethodDraft(analyst, draft.id, { reason: "Not needed." });
    expect(discarded).toMatchObject({ version: 3, status: "discarded" });
    expect((await currentMethod(analyst))!.version).toBe(2);
    const next = await createMethodDraft(analyst, { reason: "Another try." });
    expect(next.version).toBe(4);
    await discardMethodDraft(analyst, next.id);
  });
});

describe("co-approval, where the firm requires it", () => {
  let draftId: string;

  beforeAll(async () => {
    await db.update(firms).set({ methodCoApproval: true }).where(eq(firms.id, analyst.firmId));
    const draft = await createMethodDraft(analyst, { reason: "Quarterly review." });
    await updateMethodDraft(analyst, draft.id, { ...NORTHMOOR_METHOD, reason: "Quarterly review." });
    await attachEvidence(analyst, draft.id);
    draftId = draft.id;
  });

  it("the analyst's approval leaves the version waiting for a compliance head", async () => {
    const waiting = await approveMethod(analyst, draftId);
    expect(waiting).toMatchObject({ status: "draft", awaitingCoApproval: true, approvedBy: { name: "Priya Castell" }, coApprovedBy: null, approvedAt: null });
    expect((await currentMethod(analyst))!.version).toBe(2);
  });

  it("the analyst cannot co-approve their own version, even holding the compliance head role", async () => {
    await db.update(memberships).set({ roles: ["risk_analyst", "compliance_head"] }).where(and(eq(memberships.userId, analyst.userId), eq(memberships.firmId, analyst.firmId)));
    const both = await actorFor(NORTHMOOR.analyst);
    const error = await refusal(approveMethod(both, draftId));
    expect(error.code).toBe("forbidden:method_coapproval");
    await db.update(memberships).set({ roles: ["risk_analyst"] }).where(and(eq(memberships.userId, analyst.userId), eq(memberships.firmId, analyst.firmId)));
    expect((await getMethodVersion(analyst, draftId)).status).toBe("draft");
  });

  it("another analyst who is not a compliance head cannot co-approve", async () => {
    expect((await refusal(approveMethod(analystOfficer, draftId))).code).toBe("conflict:method_approval");
  });

  it("a compliance head, a different person, co-approves: the version is approved and the previous one superseded", async () => {
    const startedAt = Date.now();
    const approved = await approveMethod(head, draftId, { note: "Agreed." });
    expect(approved).toMatchObject({ status: "approved", approvedBy: { name: "Priya Castell" }, coApprovedBy: { name: "Helen Marsh" }, awaitingCoApproval: false });
    // the real time of the act, not the pinned business day, and the audit record carries the same instant
    expect(Date.parse(approved.approvedAt!)).toBeGreaterThanOrEqual(startedAt);
    expect(Date.parse(approved.approvedAt!)).toBeLessThanOrEqual(Date.now());
    const [coEvent] = await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, draftId), eq(auditEvents.action, "method.co_approve")));
    expect(coEvent.at).toBe(approved.approvedAt);
    const statuses = (await listMethodVersions(analyst)).map((v) => [v.version, v.status]);
    expect(statuses).toEqual([[5, "approved"], [4, "discarded"], [3, "discarded"], [2, "superseded"], [1, "superseded"]]);
    const actions = (await db.select().from(auditEvents).where(eq(auditEvents.entityId, draftId))).map((e) => e.action);
    expect(actions).toEqual(["method.draft", "method.update", "method.evidence", "method.approve", "method.co_approve"]);
  });

  it("saving a draft after the analyst's approval withdraws that approval", async () => {
    const draft = await createMethodDraft(analyst, { reason: "One more change." });
    await attachEvidence(analyst, draft.id);
    await updateMethodDraft(analyst, draft.id, { ...NORTHMOOR_METHOD, reason: "One more change." });
    await attachEvidence(analyst, draft.id);
    expect((await approveMethod(analyst, draft.id)).awaitingCoApproval).toBe(true);
    const saved = await updateMethodDraft(analyst, draft.id, { ...NORTHMOOR_METHOD, rationale: `${NORTHMOOR_METHOD.rationale} Amended.`, reason: "One more change." });
    expect(saved).toMatchObject({ awaitingCoApproval: false, approvedBy: null });
    expect((await refusal(approveMethod(head, draft.id))).code).toBe("conflict:method_approval");
    await discardMethodDraft(analyst, draft.id);
  });
});

describe("tenant scope", () => {
  it("another firm's version is not found, for reading and for every change", async () => {
    const pellamAnalyst = await actorFor(PELLAM.analyst);
    const pellamHead = await actorFor(PELLAM.head);
    const northmoorId = (await currentMethod(analyst))!.id;
    const before = await snapshot(db);
    for (const attempt of [
      getMethodVersion(pellamAnalyst, northmoorId),
      updateMethodDraft(pellamAnalyst, northmoorId, NORTHMOOR_METHOD),
      attachEvidence(pellamAnalyst, northmoorId),
      approveMethod(pellamHead, northmoorId),
      discardMethodDraft(pellamAnalyst, northmoorId),
      diffMethodVersions(pellamAnalyst, northmoorId, undefined),
      diffMethodVersions(pellamAnalyst, undefined, northmoorId),
    ]) {
      expect((await refusal(attempt)).code).toBe("not_found:method");
    }
    expect(await snapshot(db)).toEqual(before);
    expect((await listMethodVersions(pellamAnalyst)).map((v) => v.version)).toEqual([1]);
    expect((await currentMethod(pellamAnalyst))!.id).not.toBe(northmoorId);
    const rows = await db.select({ firmId: methodStatements.firmId }).from(methodStatements).where(eq(methodStatements.id, (await currentMethod(pellamAnalyst))!.id));
    expect(rows[0].firmId).toBe(pellamAnalyst.firmId);
  });
});
