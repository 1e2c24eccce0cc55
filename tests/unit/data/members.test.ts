import { beforeAll, describe, expect, it } from "vitest";
import { snapshot } from "../helpers/db";
import { SEEDED, worldAs } from "../helpers/people";
import { listMembers, updateMember } from "@/lib/data/members";
import { inviteMember } from "@/lib/data/accounts";
import { updateFirmSettings, getFirmSettings } from "@/lib/data/firm";
import { getPeriod, listPeriods, openPeriod } from "@/lib/data/periods";
import { listAuditEvents } from "@/lib/data/audit";
import { AppError } from "@/lib/errors";
import type { Database } from "@/db/client";
import type { Actor } from "@/lib/auth/actor";

let db: Database;
let admin: Actor;
let otherAdmin: Actor;
let officer: Actor;

beforeAll(async () => {
  ({ db, admin, otherAdmin, officer } = await worldAs({ admin: SEEDED.northmoorAdmin, otherAdmin: SEEDED.pellamAdmin, officer: SEEDED.northmoorOfficer }));
});

describe("members", () => {
  it("invites a person (no password set by the administrator) and records it in the audit trail", async () => {
    const invitation = await inviteMember(admin, { name: "Ivo Brandt", email: "ivo.brandt@northmoor.example", roles: ["risk_analyst"] });
    const member = (await listMembers(admin)).find((m) => m.id === invitation.memberId)!;
    expect(member.roles).toEqual(["risk_analyst"]);
    expect(member.invitationExpiresAt).toBe(invitation.expiresAt);
    const audit = await listAuditEvents(admin, { page: 1, pageSize: 10 });
    expect(audit.events.map((e) => e.action)).toContain("member.invite");
    expect(audit.events.find((e) => e.action === "member.invite")).toMatchObject({ entityId: member.id });
  });

  it("refuses a duplicate member, writing nothing", async () => {
    const before = await snapshot(db);
    await expect(inviteMember(admin, { name: "Ivo Brandt", email: "ivo.brandt@northmoor.example", roles: ["auditor"] })).rejects.toMatchObject({ kind: "conflict" });
    expect(await snapshot(db)).toEqual(before);
  });

  it("keeps one active administrator", async () => {
    const self = (await listMembers(admin)).find((m) => m.userId === admin.userId)!;
    await expect(updateMember(admin, self.id, { active: false })).rejects.toMatchObject({ kind: "conflict" });
  });

  it("answers not-found for another firm's member", async () => {
    const northmoorMember = (await listMembers(admin))[0];
    const error = await updateMember(otherAdmin, northmoorMember.id, { active: false }).catch((e) => e);
    expect(error).toBeInstanceOf(AppError);
    expect(error.kind).toBe("not_found");
  });
});

describe("firm settings", () => {
  it("saves and audits in one transaction", async () => {
    const before = await getFirmSettings(admin);
    const after = await updateFirmSettings(admin, { ...before, reportingCurrency: "GBP", deadlineRule: "fixed-day-next-month", deadlineValue: 20 });
    expect(after).toMatchObject({ reportingCurrency: "GBP", deadlineRule: "fixed-day-next-month", deadlineValue: 20 });
    const audit = await listAuditEvents(admin, { page: 1, pageSize: 1 });
    expect(audit.events[0].summary).toContain("reportingCurrency");
  });
});

describe("periods", () => {
  it("opens a period with its deadline and refuses a second one for the same month", async () => {
    const period = await openPeriod(officer, "2026-10");
    expect(period.periodEnd).toBe("2026-10-31");
    // The firm's rule was set above to the 20th of the next month; 20 Nov 2026 is a Friday.
    expect(period.deadline).toBe("2026-11-20");
    expect(period.overdue).toBe(true);
    await expect(openPeriod(officer, "2026-10")).rejects.toMatchObject({ kind: "conflict" });
  });

  it("refuses a month that has not started", async () => {
    await expect(openPeriod(officer, "2027-01")).rejects.toMatchObject({ kind: "unprocessable" });
  });

  it("keeps each firm's periods to itself", async () => {
    const northmoor = await listPeriods(admin);
    const pellam = await listPeriods(otherAdmin);
    expect(pellam.map((p) => p.id)).not.toEqual(expect.arrayContaining([northmoor[0].id]));
    await expect(getPeriod(otherAdmin, northmoor[0].id)).rejects.toMatchObject({ kind: "not_found" });
  });
});
