/** The actor's firm: its settings and calendar rule. */
import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { firms, calendarSettings } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import type { FirmSettingsInput } from "@/lib/validation/firm";
import { enqueueQualityRefresh, periodsTakingPrices } from "./quality-jobs";

/** The firm's settings as the settings form shows them. */
export async function getFirmSettings(actor: Actor) {
  const db = getDb();
  const [firm] = await db.select().from(firms).where(eq(firms.id, actor.firmId));
  if (!firm) throw new AppError("not_found:firm");
  const [calendar] = await db.select().from(calendarSettings).where(eq(calendarSettings.firmId, actor.firmId));
  return {
    id: firm.id,
    name: firm.name,
    reportingCurrency: firm.reportingCurrency,
    regulatorName: firm.regulatorName,
    licenceLabel: firm.licenceLabel,
    methodCoApproval: firm.methodCoApproval,
    methodSingleApprovalReason: firm.methodSingleApprovalReason,
    deadlineRule: (calendar?.deadlineRule ?? "business-days-after") as FirmSettingsInput["deadlineRule"],
    deadlineValue: calendar?.deadlineValue ?? 15,
  };
}
export type FirmSettings = Awaited<ReturnType<typeof getFirmSettings>>;

/** Change the firm's settings; the change and its audit record share one transaction. */
export async function updateFirmSettings(actor: Actor, input: FirmSettingsInput): Promise<FirmSettings> {
  const before = await getFirmSettings(actor);
  await getDb().transaction(async (tx) => {
    await tx
      .update(firms)
      .set({
        name: input.name,
        reportingCurrency: input.reportingCurrency,
        regulatorName: input.regulatorName,
        licenceLabel: input.licenceLabel,
        methodCoApproval: input.methodCoApproval,
        // the stated reason stands only while one-person approval is allowed
        methodSingleApprovalReason: input.methodCoApproval ? "" : (input.methodSingleApprovalReason ?? ""),
      })
      .where(eq(firms.id, actor.firmId));
    const [existing] = await tx.select().from(calendarSettings).where(eq(calendarSettings.firmId, actor.firmId));
    const now = new Date().toISOString();
    if (existing) {
      await tx
        .update(calendarSettings)
        .set({ deadlineRule: input.deadlineRule, deadlineValue: input.deadlineValue, updatedAt: now })
        .where(eq(calendarSettings.firmId, actor.firmId));
    } else {
      await tx.insert(calendarSettings).values({ firmId: actor.firmId, deadlineRule: input.deadlineRule, deadlineValue: input.deadlineValue, updatedAt: now });
    }
    const changed = Object.fromEntries(
      Object.entries(input).filter(([key, value]) => before[key as keyof FirmSettings] !== value),
    );
    await recordAudit(tx, actor, {
      action: "firm.settings.update",
      entityType: "firm",
      entityId: actor.firmId,
      summary: Object.keys(changed).length ? `Changed firm settings: ${Object.keys(changed).join(", ")}` : "Saved firm settings (no change)",
      detail: { before, after: input },
    });
    // the open periods' data-quality reports convert to the reporting currency: the worker computes them again
    if (input.reportingCurrency !== before.reportingCurrency) await enqueueQualityRefresh(tx, actor.firmId, await periodsTakingPrices(tx, actor.firmId));
  });
  return getFirmSettings(actor);
}
