/** What the month end needs from this person now: a short list of plain sentences, each with a link. */
import "server-only";
import { and, desc, eq, inArray } from "drizzle-orm";
import { format, formatDistanceStrict, parseISO } from "date-fns";
import { getDb } from "@/db/client";
import { filings, methodStatements, pricePoints, runs, uploads } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import type { Role } from "@/lib/auth/roles";
import { now } from "@/lib/clock";
import type { PeriodSummary } from "./periods";

export interface HomeItem {
  role: Role;
  tone: "action" | "info";
  text: string;
  href: string;
}

/** The items for the actor's roles, across the open periods (newest first). */
export async function homeItems(actor: Actor, openPeriods: readonly PeriodSummary[]): Promise<{ items: HomeItem[]; newFirm: boolean }> {
  const db = getDb();
  const roles = new Set(actor.roles);
  const items: HomeItem[] = [];
  const pending = await db.select({ kind: uploads.kind, periodId: uploads.periodId }).from(uploads).where(and(eq(uploads.firmId, actor.firmId), eq(uploads.status, "pending")));
  const [anyPrice] = await db.select({ id: pricePoints.id }).from(pricePoints).where(and(eq(pricePoints.firmId, actor.firmId), eq(pricePoints.staged, false))).limit(1);
  const methods = await db
    .select({ id: methodStatements.id, status: methodStatements.status, version: methodStatements.version, approvedAt: methodStatements.approvedAt })
    .from(methodStatements)
    .where(eq(methodStatements.firmId, actor.firmId))
    .orderBy(desc(methodStatements.version));
  const approved = methods.find((m) => m.status === "approved");
  const draft = methods.find((m) => m.status === "draft");
  const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? "" : "s"}`;

  if (roles.has("compliance_officer")) {
    const files = pending.filter((p) => p.kind === "positions").length;
    if (files) items.push({ role: "compliance_officer", tone: "action", text: `${plural(files, "positions file")} to confirm`, href: "/data" });
  }
  if (roles.has("risk_analyst")) {
    const files = pending.filter((p) => p.kind === "prices").length;
    if (files) items.push({ role: "risk_analyst", tone: "action", text: `${plural(files, "price history file")} to confirm`, href: "/data" });
    if (!anyPrice) items.push({ role: "risk_analyst", tone: "action", text: "Upload the firm's price history", href: "/data" });
    if (!approved) items.push({ role: "risk_analyst", tone: "action", text: draft ? `Method statement version ${draft.version} is a draft: approve it` : "Write and approve the method statement", href: "/method" });
    else if (approved.approvedAt) {
      items.push({
        role: "risk_analyst",
        tone: "info",
        text: `Method statement version ${approved.version} approved ${formatDistanceStrict(parseISO(approved.approvedAt), now(), { addSuffix: true })}${draft ? `; version ${draft.version} is in draft` : ""}`,
        href: "/method",
      });
    }
  }
  // The runs and filings of every open period in one query each (the list must not cost a query per period).
  const openIds = openPeriods.map((p) => p.id);
  const allRuns = openIds.length
    ? await db.select({ periodId: runs.periodId, status: runs.status, isFilingRun: runs.isFilingRun }).from(runs).where(and(eq(runs.firmId, actor.firmId), inArray(runs.periodId, openIds)))
    : [];
  const allFilings = openIds.length
    ? await db
        .select({ periodId: filings.periodId, status: filings.status, version: filings.version })
        .from(filings)
        .where(and(eq(filings.firmId, actor.firmId), inArray(filings.periodId, openIds)))
        .orderBy(desc(filings.version))
    : [];
  for (const period of openPeriods) {
    const label = format(parseISO(period.periodEnd), "MMMM yyyy");
    const periodRuns = allRuns.filter((r) => r.periodId === period.id);
    const latest = allFilings.find((f) => f.periodId === period.id);
    const positionsDone = period.steps.find((s) => s.key === "positions")?.done;
    if (roles.has("compliance_officer") && !positionsDone) items.push({ role: "compliance_officer", tone: "action", text: `Upload and confirm the positions for ${label}`, href: "/data" });
    if (roles.has("risk_analyst") && positionsDone && approved) {
      if (periodRuns.some((r) => r.status === "running" || r.status === "queued")) items.push({ role: "risk_analyst", tone: "info", text: `A run for ${label} is computing`, href: `/periods/${period.id}/runs` });
      else if (!periodRuns.some((r) => r.status === "completed")) items.push({ role: "risk_analyst", tone: "action", text: `Start the run for ${label}`, href: `/periods/${period.id}/runs` });
      else if (!periodRuns.some((r) => r.isFilingRun)) items.push({ role: "risk_analyst", tone: "action", text: `Choose the run the ${label} filing uses`, href: `/periods/${period.id}/runs` });
    }
    if (roles.has("compliance_officer") && periodRuns.some((r) => r.isFilingRun)) {
      if (!latest) items.push({ role: "compliance_officer", tone: "action", text: `Prepare the draft filing for ${label}`, href: `/periods/${period.id}/filing` });
      else if (latest.status === "draft") items.push({ role: "compliance_officer", tone: "action", text: `Submit the ${label} draft for review`, href: `/periods/${period.id}/filing` });
      else if (latest.status === "changes_requested") items.push({ role: "compliance_officer", tone: "action", text: `Changes requested on the ${label} draft`, href: `/periods/${period.id}/filing` });
      else if (latest.status === "signed") items.push({ role: "compliance_officer", tone: "action", text: `File the signed ${label} filing and record the reference`, href: `/periods/${period.id}/filing` });
    }
    if (roles.has("compliance_head") && latest?.status === "in_review") {
      items.push({ role: "compliance_head", tone: "action", text: `The ${label} draft is waiting for your review`, href: `/periods/${period.id}/filing` });
    }
  }
  const newFirm = !anyPrice && pending.length === 0 && !approved;
  return { items, newFirm };
}
