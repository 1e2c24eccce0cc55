/**
 * Confirmations of data-quality items that ask for one ("Extreme return to confirm"): who confirmed the finding,
 * when and why. A confirmation names the exact finding (check, instrument and its dates), so a changed finding —
 * a corrected price, a new flagged day — asks again. Confirmations are never changed or deleted.
 */
import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { qualityConfirmations } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import { now } from "@/lib/clock";
import { CHECK_LABELS, CONFIRMABLE_CHECKS, type QualityItem } from "@/lib/uploads/data-quality";
import type { QualityConfirmInput } from "@/lib/validation/quality";
import { enqueueQualityRefresh } from "./quality-jobs";

/** The key of a finding: its dates, sorted and joined ("" for none). */
export function itemKeyOf(item: Pick<QualityItem, "dates">): string {
  return [...(item.dates ?? [])].sort().join(",");
}

/** Every confirmation of the period, keyed by check|instrument|itemKey. */
export async function periodConfirmations(actor: Actor, periodId: string): Promise<Map<string, { by: string; at: string; reason: string }>> {
  const rows = await getDb()
    .select()
    .from(qualityConfirmations)
    .where(and(eq(qualityConfirmations.firmId, actor.firmId), eq(qualityConfirmations.periodId, periodId)));
  return new Map(rows.map((r) => [`${r.check}|${r.instrument}|${r.itemKey}`, { by: r.confirmedByName, at: r.confirmedAt, reason: r.reason }]));
}

/** The report's items with their confirmations attached (only items of a confirmable check carry one). */
export function withConfirmations(items: QualityItem[], confirmations: Map<string, { by: string; at: string; reason: string }>): QualityItem[] {
  return items.map((item) => {
    if (!CONFIRMABLE_CHECKS.includes(item.check)) return item;
    const found = confirmations.get(`${item.check}|${item.instrument}|${itemKeyOf(item)}`);
    return found ? { ...item, confirmation: found } : item;
  });
}

/**
 * Confirm one finding of the period's current report. Refused when the finding is not in the report (any more),
 * is not of a kind that asks for confirmation, or is confirmed already; the confirmation and its audit record
 * share one transaction.
 */
export async function confirmQualityItem(actor: Actor, periodId: string, input: QualityConfirmInput, currentItems: QualityItem[]) {
  if (!CONFIRMABLE_CHECKS.includes(input.check)) {
    throw new AppError("unprocessable:quality_check", `"${CHECK_LABELS[input.check]}" items are fixed in the data, not confirmed.`, { check: "This kind of item is not confirmed; correct the data instead." });
  }
  const itemKey = [...input.dates].sort().join(",");
  const item = currentItems.find((i) => i.check === input.check && i.instrument === input.instrument && itemKeyOf(i) === itemKey);
  if (!item) throw new AppError("conflict:quality_item", `The period's report has no such finding for ${input.instrument} any more; reload the page.`);
  if (item.confirmation) throw new AppError("conflict:quality_item", `${input.instrument}: this finding was confirmed by ${item.confirmation.by} on ${item.confirmation.at.slice(0, 10)}.`);
  const at = now().toISOString();
  const reason = input.reason.trim();
  await getDb().transaction(async (tx) => {
    const [row] = await tx
      .insert(qualityConfirmations)
      .values({ firmId: actor.firmId, periodId, check: input.check, instrument: input.instrument, itemKey, reason, confirmedBy: actor.userId, confirmedByName: actor.name, confirmedAt: at })
      .onConflictDoNothing()
      .returning({ id: qualityConfirmations.id });
    if (!row) throw new AppError("conflict:quality_item", `${input.instrument}: this finding was confirmed a moment ago by someone else; reload the page.`);
    await recordAudit(tx, actor, {
      action: "quality.confirm",
      entityType: "quality_confirmation",
      entityId: row.id,
      summary: `Confirmed "${CHECK_LABELS[input.check]}" for ${input.instrument} (${item.dates?.length ?? 0} day(s)): ${reason}`,
      detail: { periodId, check: input.check, instrument: input.instrument, dates: item.dates ?? [], reason },
      at,
    });
    // the report carries confirmations: the worker computes it again
    await enqueueQualityRefresh(tx, actor.firmId, [periodId]);
  });
  return { check: input.check, instrument: input.instrument, by: actor.name, at, reason };
}
