/**
 * Every write that changes what a period's data-quality report reads asks the worker to compute it again: besides
 * confirmed uploads and findings (data-quality-store.test.ts), the firm's holidays, its capital rule profile and its
 * reporting currency. Checked by the queued "data-quality" jobs, not by time.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq, inArray } from "drizzle-orm";
import { demoWorldAs, PEOPLE } from "../runs/setup";
import type { Database } from "@/db/client";
import { jobs } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { listHolidays, replaceHolidays } from "@/lib/data/calendar-settings";
import { currentCapitalProfile, saveCapitalProfile } from "@/lib/data/capital-profile";
import { getFirmSettings, updateFirmSettings } from "@/lib/data/firm";
import { capitalProfileSchema } from "@/lib/validation/capital-profile";
import { firmSettingsSchema } from "@/lib/validation/firm";

let db: Database;
let officer: Actor;
let periodId: string;

/** The queued or running report jobs for the demo's open period (what the worker will pick up). */
async function pendingReportJobs(): Promise<number> {
  const rows = await db
    .select({ id: jobs.id, payload: jobs.payload })
    .from(jobs)
    .where(and(eq(jobs.firmId, officer.firmId), eq(jobs.kind, "data-quality"), inArray(jobs.state, ["queued", "running"])));
  return rows.filter((r) => (r.payload as { periodId?: string }).periodId === periodId).length;
}

async function clearReportJobs() {
  await db.delete(jobs).where(and(eq(jobs.firmId, officer.firmId), eq(jobs.kind, "data-quality")));
}

beforeAll(async () => {
  ({ db, periodId, officer } = await demoWorldAs({ withMethod: false }, { officer: PEOPLE.officer }));
});

describe("data-quality refresh after a change of what the report reads", () => {
  it("is queued when the holiday list is edited", async () => {
    await clearReportJobs();
    const holidays = await listHolidays(officer);
    await replaceHolidays(officer, { holidays: [...holidays, { date: "2026-11-20", name: "Founders' day" }] });
    expect(await pendingReportJobs()).toBe(1);
  });

  it("is queued when a new capital rule profile version is saved", async () => {
    await clearReportJobs();
    const current = (await currentCapitalProfile(officer))!;
    await saveCapitalProfile(officer, capitalProfileSchema.parse({ ...current.form, reason: "Local rules: risk-weighted assets shown or not", showRwa: !current.form.showRwa }));
    expect(await pendingReportJobs()).toBe(1);
  });

  it("is queued when the reporting currency changes, and not for another firm setting", async () => {
    await clearReportJobs();
    const settings = await getFirmSettings(officer);
    await updateFirmSettings(officer, firmSettingsSchema.parse({ ...settings, licenceLabel: `${settings.licenceLabel} (renewed)` }));
    expect(await pendingReportJobs(), "a licence label is not read by the report").toBe(0);
    await updateFirmSettings(officer, firmSettingsSchema.parse({ ...settings, reportingCurrency: settings.reportingCurrency === "EUR" ? "GBP" : "EUR" }));
    expect(await pendingReportJobs()).toBe(1);
  });
});
