import { beforeAll, describe, expect, it } from "vitest";
import { actorFor, snapshot } from "../helpers/db";
import { SEEDED, worldAs } from "../helpers/people";
import { listMembers, updateMember } from "@/lib/data/members";
import type { Database } from "@/db/client";
import type { Actor } from "@/lib/auth/actor";

let db: Database;
let admin: Actor;

beforeAll(async () => {
  ({ db, admin } = await worldAs({ admin: SEEDED.northmoorAdmin }));
});

const withoutAudit = (s: Record<string, unknown[]>) => ({ ...s, audit_events: undefined });

describe("an administrator cannot give themselves the signing role", () => {
  it("refuses self-granting compliance head, audits the refusal, and changes nothing else", async () => {
    const self = (await listMembers(admin)).find((m) => m.userId === admin.userId)!;
    const before = await snapshot(db);
    await expect(updateMember(admin, self.id, { roles: ["admin", "compliance_head"] })).rejects.toMatchObject({
      kind: "forbidden",
      fields: { roles: expect.any(String) },
    });
    const after = await snapshot(db);
    expect(withoutAudit(after)).toEqual(withoutAudit(before));
    expect(after.audit_events.length).toBe(before.audit_events.length + 1);
    expect(after.audit_events.at(-1)).toMatchObject({ action: "member.role_change_refused" });
  });

  it("names the lack of a second administrator, and another administrator may grant the role", async () => {
    const self = (await listMembers(admin)).find((m) => m.userId === admin.userId)!;
    await expect(updateMember(admin, self.id, { roles: ["admin", "compliance_head"] })).rejects.toMatchObject({ message: expect.stringContaining("no other administrator") });
    // Giving oneself a role that signs nothing stays possible.
    expect((await updateMember(admin, self.id, { roles: ["admin", "auditor"] })).roles).toEqual(["admin", "auditor"]);
    // At Pellam the administrator grants the role to a colleague: another person, so it is allowed.
    const pellamAdmin = await actorFor("rafe.pellam@pellam.example");
    const june = (await listMembers(pellamAdmin)).find((m) => m.email === "june.okafor@pellam.example")!;
    const updated = await updateMember(pellamAdmin, june.id, { roles: [...june.roles, "compliance_head"] });
    expect(updated.roles).toContain("compliance_head");
  });
});
