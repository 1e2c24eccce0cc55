import { describe, expect, it } from "vitest";
import { can, grants } from "@/lib/auth/permissions";
import { ROLES, parseRoles } from "@/lib/auth/roles";

describe("permission table", () => {
  it("grants signing only to the compliance head", () => {
    expect(grants["filing.sign"]).toEqual(["compliance_head"]);
    expect(can({ roles: ["compliance_officer", "risk_analyst"] }, "filing.sign")).toBe(false);
    expect(can({ roles: ["compliance_head"] }, "filing.sign")).toBe(true);
  });

  it("lets the auditor read but change nothing", () => {
    const writes = Object.keys(grants).filter((p) => !p.endsWith(".read"));
    for (const permission of writes) expect(can({ roles: ["auditor"] }, permission as keyof typeof grants), permission).toBe(false);
    expect(can({ roles: ["auditor"] }, "audit.read")).toBe(true);
  });

  it("names only known roles", () => {
    for (const roles of Object.values(grants)) for (const role of roles) expect(ROLES).toContain(role);
  });

  it("drops unknown role names read from storage", () => {
    expect(parseRoles(["auditor", "owner", 3, "admin"])).toEqual(["admin", "auditor"]);
    expect(parseRoles("admin")).toEqual([]);
  });
});
