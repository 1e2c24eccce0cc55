/**
 * The capital rule profile: each saved change is a new version pointing at the one it replaces (audited, in one
 * transaction), stored versions never change, the filed figure must be one the run computes, and the percent form
 * converts to the engine's decimals and back exactly.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { snapshot } from "../helpers/db";
import { SEEDED, worldAs } from "../helpers/people";
import type { Database } from "@/db/client";
import { auditEvents, capitalRuleProfiles } from "@/db/schema";
import { capitalProfileScreen, currentCapitalProfile, getCapitalProfileVersion, saveCapitalProfile } from "@/lib/data/capital-profile";
import { STANDARDISED_1996_PROFILE } from "@/lib/risk/standardised";
import {
  capitalProfileSchema,
  defaultCapitalProfileForm,
  engineStandardisedProfile,
  fromPercent,
  standardisedFormOf,
  toPercent,
  type CapitalProfileValues,
} from "@/lib/validation/capital-profile";
import type { Actor } from "@/lib/auth/actor";

let db: Database;
let officer: Actor;
let pellam: Actor;

beforeAll(async () => {
  ({ db, officer, pellam } = await worldAs({ officer: SEEDED.northmoorOfficer, pellam: SEEDED.pellamOfficer }));
});

function fileStandardised(base: CapitalProfileValues): CapitalProfileValues {
  return { ...base, reason: "Our regulator takes the standardised figure; VaR stays our own measure.", regimes: "both", filedRegime: "standardised", showRwa: true };
}

describe("the percent form and the engine profile", () => {
  it("round-trips the 1996 defaults exactly (form → engine → form)", () => {
    const form = standardisedFormOf(STANDARDISED_1996_PROFILE);
    // the 1996 amendment's rates as printed: qualifying 0.25 % / 1.00 % / 1.60 %, other 8 %, 1–2 y band 1.25 %
    expect(form.qualifying.map((t) => t.ratePercent)).toEqual([0.25, 1, 1.6]);
    expect(form.qualifying.map((t) => t.upToMonths)).toEqual([6, 24, null]);
    expect(form.otherPercent).toBe(8);
    expect(form.bands[4].weightPercent).toBe(1.25);
    expect(engineStandardisedProfile(form, STANDARDISED_1996_PROFILE.showRwa)).toEqual(STANDARDISED_1996_PROFILE);
  });

  it("writes percent without binary noise", () => {
    expect(toPercent(0.0175)).toBe(1.75);
    expect(fromPercent(1.75)).toBe(0.0175);
    expect(toPercent(0.0025)).toBe(0.25);
  });
});

describe("validation", () => {
  it("refuses a filed figure the run does not compute, naming the field", () => {
    const values = { ...defaultCapitalProfileForm(), reason: "Try it", regimes: "internal_models" as const, filedRegime: "standardised" as const };
    const parsed = capitalProfileSchema.safeParse(values);
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues.map((i) => i.path.join("."))).toContain("filedRegime");
  });

  it("needs a reason, and names a duplicate plus-factor row", () => {
    const base = defaultCapitalProfileForm();
    const values = { ...base, reason: "", internal: { ...base.internal, plusFactors: [...base.internal.plusFactors, { exceptions: 5, addOn: 0.3 }] } };
    const parsed = capitalProfileSchema.safeParse(values);
    expect(parsed.success).toBe(false);
    const paths = parsed.error!.issues.map((i) => i.path.join("."));
    expect(paths).toContain("reason");
    expect(paths).toContain(`internal.plusFactors.${base.internal.plusFactors.length}.exceptions`);
  });

  it("refuses a rate below zero and a de minimis test without eligible capital", () => {
    const base = defaultCapitalProfileForm();
    const values = { ...base, reason: "Try it", standardised: { ...base.standardised, equityGeneralPercent: -1, fxApplyDeMinimis: true, fxEligibleCapital: null } };
    const parsed = capitalProfileSchema.safeParse(values);
    expect(parsed.success).toBe(false);
    const paths = parsed.error!.issues.map((i) => i.path.join("."));
    expect(paths).toContain("standardised.equityGeneralPercent");
    expect(paths).toContain("standardised.fxEligibleCapital");
  });
});

describe("versions", () => {
  it("starts from the seeded version 1: internal models filed", async () => {
    const current = await currentCapitalProfile(officer);
    expect(current).not.toBeNull();
    expect(current!.version).toBe(1);
    expect(current!.filedRegime).toBe("internal_models");
    expect(current!.standardised).toEqual({ ...STANDARDISED_1996_PROFILE, showRwa: false });
  });

  it("saves a change as version 2 pointing at version 1, version 1 leaves force, one audit record", async () => {
    const v1 = (await currentCapitalProfile(officer))!;
    const saved = await saveCapitalProfile(officer, capitalProfileSchema.parse(fileStandardised(v1.form)));
    expect(saved.version).toBe(2);
    expect(saved.active).toBe(true);
    expect(saved.previousId).toBe(v1.id);
    expect(saved.filedRegime).toBe("standardised");
    expect(saved.regimes).toBe("both");
    expect(saved.createdBy?.name).toBe("Tomas Reyne");
    const screen = await capitalProfileScreen(officer);
    expect(screen.versions.map((v) => [v.version, v.active])).toEqual([[2, true], [1, false]]);
    const audits = await db.select().from(auditEvents).where(eq(auditEvents.entityId, saved.id));
    expect(audits).toHaveLength(1);
    expect(audits[0].action).toBe("capital_profile.version");
    expect((audits[0].detail as { changed: string[] }).changed).toEqual(expect.arrayContaining(["regimes", "filedRegime", "showRwa"]));
  });

  it("refuses a save that changes nothing, and stores nothing", async () => {
    const current = (await currentCapitalProfile(officer))!;
    const before = await snapshot(db);
    await expect(saveCapitalProfile(officer, capitalProfileSchema.parse({ ...current.form, reason: "Same again" }))).rejects.toThrow(/Nothing changed/);
    expect(await snapshot(db)).toEqual(before);
  });

  it("keeps an adapted rate: a firm copies the defaults and sets its local zone 1–3 rate", async () => {
    const current = (await currentCapitalProfile(officer))!;
    const adapted = { ...current.form, reason: "Local rules: 150 % between zones 1 and 3", standardised: { ...current.form.standardised, betweenZones13Percent: 150 } };
    const saved = await saveCapitalProfile(officer, capitalProfileSchema.parse(adapted));
    expect(saved.version).toBe(3);
    expect(saved.standardised.interestRate.betweenZones.zone13).toBe(1.5);
    expect(saved.standardised.interestRate.betweenZones.zone12).toBe(0.4);
  });

  it("never lets a stored version change or go away at the database", async () => {
    const [v1] = await db.select().from(capitalRuleProfiles).where(eq(capitalRuleProfiles.version, 1));
    await expect(db.$client.execute({ sql: "UPDATE capital_rule_profiles SET base_multiplier = 4 WHERE id = ?", args: [v1.id] })).rejects.toThrow(/cannot be changed/);
    await expect(db.$client.execute({ sql: "UPDATE capital_rule_profiles SET active = 1 WHERE id = ?", args: [v1.id] })).rejects.toThrow(/cannot be changed/);
    await expect(db.$client.execute({ sql: "DELETE FROM capital_rule_profiles WHERE id = ?", args: [v1.id] })).rejects.toThrow(/cannot be deleted/);
  });

  it("keeps each firm's versions to itself", async () => {
    const mine = (await currentCapitalProfile(officer))!;
    await expect(getCapitalProfileVersion(pellam, mine.id)).rejects.toThrow(/not found/i);
    expect((await currentCapitalProfile(pellam))!.version).toBe(1);
  });
});
