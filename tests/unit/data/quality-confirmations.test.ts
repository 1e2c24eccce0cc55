import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { snapshot } from "../helpers/db";
import { actorFor, demoWorldAs, PEOPLE } from "../runs/setup";
import type { Database } from "@/db/client";
import { auditEvents } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { getDataQuality } from "@/lib/data/data-quality";
import { confirmQualityItem } from "@/lib/data/quality-confirmations";
import { buildFilingViewModel } from "@/reports/view-model";
import { packFixture } from "../reports/fixture";

let db: Database;
let analyst: Actor;
let periodId: string;

beforeAll(async () => {
  ({ db, periodId, analyst } = await demoWorldAs({ withMethod: false }, { analyst: PEOPLE.analyst }));
});

describe("confirming a data-quality finding", () => {
  it("records who, when and why, audited, and the report shows it", async () => {
    const { report } = await getDataQuality(analyst, periodId);
    const item = report.items.find((i) => i.check === "extreme-return");
    expect(item, "the demo history has a move flagged for confirmation").toBeTruthy();
    const before = Date.now();
    const confirmed = await confirmQualityItem(analyst, periodId, { check: "extreme-return", instrument: item!.instrument, dates: item!.dates ?? [], reason: "Index rebalancing day; the close matches the exchange's record." }, report.items);
    expect(Date.parse(confirmed.at)).toBeGreaterThanOrEqual(before);
    const after = (await getDataQuality(analyst, periodId)).report.items.find((i) => i.check === "extreme-return" && i.instrument === item!.instrument)!;
    expect(after.confirmation).toEqual({ by: "Priya Castell", at: confirmed.at, reason: "Index rebalancing day; the close matches the exchange's record." });
    const [event] = await db.select().from(auditEvents).where(eq(auditEvents.action, "quality.confirm"));
    expect(event).toMatchObject({ actorName: "Priya Castell", at: confirmed.at });
    expect(event.summary).toContain(item!.instrument);
  });

  it("refuses a second confirmation, a finding that is not in the report and a check that is fixed in the data, changing nothing", async () => {
    const { report } = await getDataQuality(analyst, periodId);
    const item = report.items.find((i) => i.check === "extreme-return")!;
    const unchanged = await snapshot(db);
    await expect(confirmQualityItem(analyst, periodId, { check: "extreme-return", instrument: item.instrument, dates: item.dates ?? [], reason: "Confirming the same thing twice." }, report.items)).rejects.toMatchObject({ code: "conflict:quality_item" });
    await expect(confirmQualityItem(analyst, periodId, { check: "extreme-return", instrument: item.instrument, dates: ["2026-01-02"], reason: "A day that was never flagged." }, report.items)).rejects.toMatchObject({ code: "conflict:quality_item" });
    await expect(confirmQualityItem(analyst, periodId, { check: "gap", instrument: item.instrument, dates: [], reason: "Gaps are fixed in the data." }, report.items)).rejects.toMatchObject({ code: "unprocessable:quality_check" });
    expect(await snapshot(db)).toEqual(unchanged);
  });

  it("another firm's period is not found", async () => {
    const pellam = await actorFor(PEOPLE.pellamAnalyst);
    await expect(getDataQuality(pellam, periodId)).rejects.toMatchObject({ kind: "not_found" });
  });

  it("the pack's data-quality section says who confirmed a finding, when and why", async () => {
    const { input } = await packFixture();
    const report = input.dataQuality!;
    const items = [{ check: "extreme-return" as const, severity: "warning" as const, instrument: "NMB-EQ-01", message: "NMB-EQ-01 has 1 daily move beyond 6 robust standard deviations.", dates: ["2026-11-02"], confirmation: { by: "Priya Castell", at: "2026-12-02T10:14:00.000Z", reason: "Profit warning that morning." } }];
    const vm = buildFilingViewModel({ ...input, dataQuality: { ...report, items } });
    expect(vm.dataQuality.items[0].message).toBe("NMB-EQ-01 has 1 daily move beyond 6 robust standard deviations. Confirmed by Priya Castell on 2026-12-02 10:14 UTC: Profit warning that morning.");
  });
});
