/** The English narrative of what changed since the last filed version. */
import "server-only";
import { and, desc, eq, inArray, lt } from "drizzle-orm";
import { getDb } from "@/db/client";
import { filings, reportingPeriods } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import type { FilingViewModel } from "@/reports/view-model";
import { formatAmount, formatConfidence, formatMonth } from "@/reports/format";
import { runChange } from "../runs";
import { AssembleArgs } from "./types";

function headline(vm: FilingViewModel) {
  const primary = vm.figures.totals.find((t) => t.primary) ?? vm.figures.totals[0];
  const at = primary?.byConfidence.find((c) => c.confidence === vm.figures.capitalConfidence) ?? primary?.byConfidence[0];
  return { capital: vm.figures.capital.capital, var1d: at?.oneDay.var ?? 0, esHorizon: at?.horizon.es ?? 0, exceptions: vm.figures.backtest.exceptions, methodVersion: vm.method.version, confidence: at?.confidence ?? vm.figures.capitalConfidence };
}

function signed(n: number): string {
  return n > 0 ? `+${formatAmount(n)}` : formatAmount(n);
}

/** What changed against the previous version of this filing and against the last signed filing of an earlier period. */
export async function changesSinceLast(actor: Actor, args: AssembleArgs, draft: FilingViewModel): Promise<string[]> {
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
