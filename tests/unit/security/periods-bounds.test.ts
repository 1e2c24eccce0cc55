import { beforeAll, describe, expect, it } from "vitest";
import { actorFor, snapshot } from "../helpers/db";
import { SEEDED, worldAs } from "../helpers/people";
import { listPeriods, openPeriod, withdrawPeriod } from "@/lib/data/periods";
import { listAuditEvents } from "@/lib/data/audit";
import { openPeriodSchema, withdrawPeriodSchema } from "@/lib/validation/periods";
import type { Database } from "@/db/client";
import type { Actor } from "@/lib/auth/actor";

let db: Database;
let officer: Actor;
let otherAdmin: Actor;

beforeAll(async () => {
  ({ db, officer, otherAdmin } = await worldAs({ officer: SEEDED.northmoorOfficer, otherAdmin: SEEDED.pellamAdmin }));
});

describe("period months are bounded", () => {
  it("refuses months outside 2000–2099 at the edge, naming the field", () => {
    for (const month of ["0000-01", "1900-01", "1999-12", "2100-01", "9999-12"]) {
      const parsed = openPeriodSchema.safeParse({ month });
      expect(parsed.success, month).toBe(false);
      expect(parsed.error?.issues[0].path, month).toEqual(["month"]);
    }
    expect(openPeriodSchema.safeParse({ month: "2026-11" }).success).toBe(true);
  });

  it("refuses a month more than ten years back or in the future, writing nothing", async () => {
    const before = await snapshot(db);
    await expect(openPeriod(officer, "2016-11")).rejects.toMatchObject({ kind: "unprocessable", fields: { month: "Choose 2016-12 or later." } });
    await expect(openPeriod(officer, "2027-01")).rejects.toMatchObject({ kind: "unprocessable" });
    expect(await snapshot(db)).toEqual(before);
  });
});

describe("withdrawing an empty period opened by mistake", () => {
  it("withdraws the empty period with an audit record, and the month can be opened again", async () => {
    const opened = await openPeriod(officer, "2016-12");
    const { periodEnd } = await withdrawPeriod(officer, opened.id, "Opened the wrong year");
    expect(periodEnd).toBe("2016-12-31");
    expect((await listPeriods(officer)).some((p) => p.id === opened.id)).toBe(false);
    const audit = await listAuditEvents(officer.roles.includes("admin") ? officer : await actorFor("ada.quayle@northmoor.example"), { page: 1, pageSize: 5 });
    expect(audit.events[0]).toMatchObject({ action: "period.withdraw", entityId: opened.id });
    const again = await openPeriod(officer, "2016-12");
    await withdrawPeriod(officer, again.id, "Still the wrong year");
  });

  it("refuses a period that holds work, and another firm's period, changing nothing", async () => {
    const november = (await listPeriods(officer)).find((p) => p.periodEnd === "2026-11-30")!;
    // Under review stands in for any work (the unit seed holds no files): the state alone refuses withdrawal.
    await db.$client.execute({ sql: "UPDATE reporting_periods SET state = 'in_review' WHERE id = ?", args: [november.id] });
    const before = await snapshot(db);
    await expect(withdrawPeriod(officer, november.id, "Trying")).rejects.toMatchObject({ kind: "conflict" });
    await expect(withdrawPeriod(otherAdmin, november.id, "Trying")).rejects.toMatchObject({ kind: "not_found" });
    expect(await snapshot(db)).toEqual(before);
    await db.$client.execute({ sql: "UPDATE reporting_periods SET state = 'open' WHERE id = ?", args: [november.id] });
  });

  it("needs a reason without control or direction characters", () => {
    expect(withdrawPeriodSchema.safeParse({ reason: "" }).success).toBe(false);
    expect(withdrawPeriodSchema.safeParse({ reason: "wrong\u202Eyear" }).success).toBe(false);
    expect(withdrawPeriodSchema.safeParse({ reason: "wrong\u0000year" }).success).toBe(false);
    expect(withdrawPeriodSchema.safeParse({ reason: "Opened the wrong year" }).success).toBe(true);
  });
});
