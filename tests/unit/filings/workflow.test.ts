/**
 * The review loop as a state machine: draft → in_review → changes_requested → in_review … → signed → filed, and
 * signed → superseded by a new version. In every state each action that does not belong to it is refused with a
 * clear message and nothing changes; submitting a draft whose run is no longer the period's marked run is refused.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { completedRun, attestation, preparedFilingWorld, type FilingWorld } from "./setup";
import { AppError } from "@/lib/errors";
import type { Actor } from "@/lib/auth/actor";

let w: FilingWorld;
const data = () => import("@/lib/data/filings");

/** The rows the filing workflow writes: what must stay exactly as it was after a refusal. */
async function fingerprint() {
  const out: Record<string, unknown[]> = {};
  for (const table of ["filings", "signatures", "review_comments", "reporting_periods", "audit_events", "runs"]) {
    const columns = table === "runs" ? "id, status, is_filing_run" : "*";
    out[table] = (await w.db.$client.execute(`SELECT ${columns} FROM ${table} ORDER BY rowid`)).rows.map((r) => ({ ...r }));
  }
  return out;
}

async function refused(call: () => Promise<unknown>, pattern: RegExp): Promise<AppError> {
  const before = await fingerprint();
  const error = await call().then(
    () => null,
    (e: unknown) => e,
  );
  expect(error, `should be refused: ${pattern}`).toBeInstanceOf(AppError);
  expect((error as AppError).message).toMatch(pattern);
  expect(await fingerprint()).toEqual(before);
  return error as AppError;
}

type Action = "prepare" | "update" | "submit" | "comment" | "reply" | "requestChanges" | "sign" | "newVersion" | "markFiled";

function act(action: Action, filingId: string): () => Promise<unknown> {
  return async () => {
    const d = await data();
    switch (action) {
      case "prepare":
        return d.prepareFiling(w.officer, w.periodId);
      case "update":
        return d.updateFiling(w.officer, filingId, { coverNote: "A change." });
      case "submit":
        return d.submitFiling(w.officer, filingId);
      case "comment":
        return d.commentOnFiling(w.head, filingId, { section: "capital", body: "A comment." });
      case "reply":
        return d.replyOnFiling(w.officer, filingId, { section: "capital", body: "An answer." });
      case "requestChanges":
        return d.requestChanges(w.head, filingId, { section: "general", reason: "Please change it." });
      case "sign":
        return d.signFiling(w.head, filingId, attestation(w.head));
      case "newVersion":
        return d.newFilingVersion(w.officer, filingId, { reason: "A later change." });
      case "markFiled":
        return d.markFiled(w.officer, filingId, { filedOn: "2026-12-01", reference: "REG-1" });
    }
  };
}

/** Every action not allowed in the state is refused with a message and changes nothing. */
async function refusesAllBut(filingId: string, allowed: Action[], messages: Partial<Record<Action, RegExp>>) {
  const all: Action[] = ["prepare", "update", "submit", "comment", "reply", "requestChanges", "sign", "newVersion", "markFiled"];
  for (const action of all.filter((a) => !allowed.includes(a))) {
    await refused(act(action, filingId), messages[action] ?? /./);
  }
}

let filingId: string;

beforeAll(async () => {
  ({ filingId, ...w } = await preparedFilingWorld());
});

describe("each state refuses what does not belong to it", () => {
  it("draft: only editing, answering, rebuilding and submitting", async () => {
    await refusesAllBut(filingId, ["prepare", "update", "submit", "reply"], {
      comment: /has not been submitted for review yet/,
      requestChanges: /has not been submitted for review/,
      sign: /has not been submitted for review yet/,
      newVersion: /is not signed; edit it directly/,
      markFiled: /is not signed yet; only a signed filing can be filed/,
    });
  });

  it("a draft whose run is no longer the period's marked run cannot be submitted until it is rebuilt", async () => {
    const { submitFiling, prepareFiling, getFiling } = await data();
    const second = await completedRun(w.analyst, w.periodId);
    await refused(() => submitFiling(w.officer, filingId), /no longer the one marked for the period's filing\. Rebuild the draft from the marked run/);
    expect((await getFiling(w.officer, filingId)).runIsMarked).toBe(false);
    const rebuilt = await prepareFiling(w.officer, w.periodId);
    expect(rebuilt.id).toBe(filingId);
    expect(rebuilt.runId).toBe(second);
    expect(rebuilt.runIsMarked).toBe(true);
    expect(rebuilt.version).toBe(1);
  });

  it("in review: only comments, answers, requesting changes and signing", async () => {
    const { submitFiling } = await data();
    const submitted = await submitFiling(w.officer, filingId, { note: "Ready for review." });
    expect(submitted.status).toBe("in_review");
    expect(submitted.submittedBy?.name).toBe("Tomas Reyne");
    expect(submitted.comments.map((c) => [c.kind, c.body])).toEqual([["submission_note", "Ready for review."]]);
    await refusesAllBut(filingId, ["comment", "reply", "requestChanges", "sign"], {
      prepare: /is in review with the compliance head/,
      update: /is in review; the compliance head requests changes before it can be edited again/,
      submit: /is already in review/,
      newVersion: /is not signed/,
      markFiled: /is not signed yet/,
    });
  });

  it("changes requested: editing, answering and resubmitting; not signing", async () => {
    const { commentOnFiling, requestChanges } = await data();
    await commentOnFiling(w.head, filingId, { section: "capital", body: "The plus factor needs a sentence." });
    const sent = await requestChanges(w.head, filingId, { section: "backtest", reason: "Explain the exceptions." });
    expect(sent.status).toBe("changes_requested");
    expect(sent.comments.map((c) => [c.section, c.kind])).toEqual([
      ["general", "submission_note"],
      ["capital", "comment"],
      ["backtest", "changes_requested"],
    ]);
    await refusesAllBut(filingId, ["prepare", "update", "submit", "reply", "comment"], {
      requestChanges: /are already requested/,
      sign: /Changes to version 1 were requested; it can be signed once it is resubmitted/,
      newVersion: /is not signed/,
      markFiled: /is not signed yet/,
    });
  });

  it("the officer answers and resubmits; then it can be signed", async () => {
    const { replyOnFiling, submitFiling, signFiling } = await data();
    await replyOnFiling(w.officer, filingId, { section: "backtest", body: "Explanations added." });
    const back = await submitFiling(w.officer, filingId, { note: "" });
    expect(back.status).toBe("in_review");
    const signed = await signFiling(w.head, filingId, attestation(w.head));
    expect(signed.status).toBe("signed");
  });

  it("signed: only recording it as filed or starting a new version", async () => {
    await refusesAllBut(filingId, ["newVersion", "markFiled"], {
      prepare: /is signed and locked\. A change makes a new version/,
      update: /is signed and locked\. A change makes a new version: start version 2/,
      submit: /is signed and locked/,
      comment: /is signed and locked/,
      reply: /is signed and locked/,
      requestChanges: /is signed and locked/,
      sign: /is already signed/,
    });
  });

  it("filed: nothing more", async () => {
    const { markFiled } = await data();
    const filed = await markFiled(w.officer, filingId, { filedOn: "2026-12-01", reference: "FMA/2026/11/0042" });
    expect(filed.status).toBe("filed");
    await refusesAllBut(filingId, [], {
      update: /signed and filed \(reference FMA\/2026\/11\/0042\); it cannot be changed/,
      newVersion: /has been filed with the regulator/,
      markFiled: /already recorded as filed/,
      sign: /signed and filed/,
    });
  });
});

describe("roles at the data layer too", () => {
  it("refuses signing by someone without the compliance head role, whatever the route", async () => {
    const { signFiling } = await data();
    const officer: Actor = w.officer;
    await refused(() => signFiling(officer, filingId, attestation(officer)), /Only a compliance head can sign a filing/);
  });
});
