/**
 * The firm's capital rule profile, versioned: the version in force (active), its history, and saving a change as a
 * new version that points at the one it replaces (the earlier version leaves force in the same transaction, with
 * the audit record). Stored versions never change (db/migrations/0010_capital_profiles_immutable.sql).
 */
import "server-only";
import { firmRow } from "@/lib/data/firm-row";
import { and, desc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { capitalRuleProfiles } from "@/db/schema";
import { userNames } from "./people";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import { now } from "@/lib/clock";
import { canonicalJson } from "@/lib/domain/canonical";
import type { Actor } from "@/lib/auth/actor";
import { enqueueQualityRefresh, periodsTakingPrices } from "./quality-jobs";
import { STANDARDISED_1996_PROFILE, type StandardisedProfile } from "@/lib/risk/standardised";
import {
  CAPITAL_REGIMES,
  REGIME_CHOICES,
  DEFAULT_PLUS_FACTORS,
  engineStandardisedProfile,
  fromPercent,
  standardisedFormOf,
  toPercent,
  type CapitalProfileValues,
  type CapitalRegime,
  type RegimeChoice,
} from "@/lib/validation/capital-profile";

type Row = typeof capitalRuleProfiles.$inferSelect;

/** One version of the profile as the Settings screen and the runs read it. */
export interface CapitalProfileVersion {
  id: string;
  version: number;
  active: boolean;
  name: string;
  regimes: RegimeChoice;
  filedRegime: CapitalRegime;
  showRwa: boolean;
  reason: string;
  previousId: string | null;
  createdBy: { id: string; name: string } | null;
  createdAt: string;
  internal: CapitalProfileValues["internal"];
  /** the engine profile the standardised blocks use (the 1996 defaults where the version stored none) */
  standardised: StandardisedProfile;
  /** the same, as the form shows it (percent) */
  form: CapitalProfileValues;
}

/** The regime choice a stored row names (older rows hold only the internal-models columns). */
function regimesOf(row: Row): RegimeChoice {
  return (REGIME_CHOICES as readonly string[]).includes(row.regimes) ? (row.regimes as RegimeChoice) : "internal_models";
}

function filedOf(row: Row): CapitalRegime {
  return (CAPITAL_REGIMES as readonly string[]).includes(row.filedRegime) ? (row.filedRegime as CapitalRegime) : "internal_models";
}

/** The engine's standardised profile a stored row carries, with its RWA choice. */
export function standardisedProfileOfRow(row: Pick<Row, "standardised" | "showRwa">): StandardisedProfile {
  const stored = row.standardised;
  return { ...(stored ?? STANDARDISED_1996_PROFILE), showRwa: row.showRwa };
}

function view(row: Row, names: Map<string, string>): CapitalProfileVersion {
  const internal = {
    confidencePercent: toPercent(row.confidence),
    horizonDays: row.horizonDays,
    averagingDays: row.averagingDays,
    baseMultiplier: row.baseMultiplier,
    stressedMultiplier: row.stressedMultiplier,
    backtestDays: row.backtestDays,
    plusFactors: Object.entries(row.plusFactors ?? {})
      .map(([k, v]) => ({ exceptions: Number(k), addOn: v }))
      .sort((a, b) => a.exceptions - b.exceptions),
  };
  const standardised = standardisedProfileOfRow(row);
  const regimes = regimesOf(row);
  const filedRegime = filedOf(row);
  const { id, version, active, name, showRwa, reason, previousId, createdAt } = row;
  const createdBy = row.createdBy ? { id: row.createdBy, name: names.get(row.createdBy) ?? "(former member)" } : null;
  const form = { name, reason: "", regimes, filedRegime, showRwa, internal, standardised: standardisedFormOf(standardised) };
  return { id, version, active, name, regimes, filedRegime, showRwa, reason, previousId, createdBy, createdAt, internal, standardised, form };
}


/** The version in force, or null when the firm has none stored (runs then use the engine defaults). */
export async function currentCapitalProfile(actor: Actor): Promise<CapitalProfileVersion | null> {
  const [row] = await getDb()
    .select()
    .from(capitalRuleProfiles)
    .where(and(eq(capitalRuleProfiles.firmId, actor.firmId), eq(capitalRuleProfiles.active, true)))
    .limit(1);
  if (!row) return null;
  return view(row, await userNames([row.createdBy]));
}

/** Every version, newest first. */
export async function listCapitalProfileVersions(actor: Actor): Promise<CapitalProfileVersion[]> {
  const rows = await getDb().select().from(capitalRuleProfiles).where(eq(capitalRuleProfiles.firmId, actor.firmId)).orderBy(desc(capitalRuleProfiles.version));
  const names = await userNames(rows.map((r) => r.createdBy));
  return rows.map((r) => view(r, names));
}

/** The profile screen: the version in force (or the defaults), the history, and the defaults a firm may copy. */
export async function capitalProfileScreen(actor: Actor) {
  const versions = await listCapitalProfileVersions(actor);
  return { current: versions.find((v) => v.active) ?? null, versions };
}

/** The columns a version stores for the form's values. */
function columnsOf(input: CapitalProfileValues) {
  return {
    name: input.name,
    confidence: fromPercent(input.internal.confidencePercent),
    horizonDays: input.internal.horizonDays,
    averagingDays: input.internal.averagingDays,
    baseMultiplier: input.internal.baseMultiplier,
    stressedMultiplier: input.internal.stressedMultiplier,
    backtestDays: input.internal.backtestDays,
    plusFactors: Object.fromEntries([...input.internal.plusFactors].sort((a, b) => a.exceptions - b.exceptions).map((r) => [String(r.exceptions), r.addOn])),
    regimes: input.regimes,
    filedRegime: input.filedRegime,
    showRwa: input.showRwa,
    standardised: engineStandardisedProfile(input.standardised, input.showRwa),
  };
}

/** The fields that differ between two sets of stored columns, by name. */
function changedFields(before: Record<string, unknown> | null, after: Record<string, unknown>): string[] {
  if (!before) return Object.keys(after);
  return Object.keys(after).filter((k) => canonicalJson(before[k] ?? null) !== canonicalJson(after[k] ?? null));
}

/**
 * Save the form as a new version: the one in force leaves force, the new one points at it and carries the reason.
 * Refused (nothing stored) when nothing changed. One transaction with the audit record.
 */
export async function saveCapitalProfile(actor: Actor, input: CapitalProfileValues): Promise<CapitalProfileVersion> {
  const db = getDb();
  const next = columnsOf(input);
  const id = await db.transaction(async (tx) => {
    const [current] = await tx
      .select()
      .from(capitalRuleProfiles)
      .where(and(eq(capitalRuleProfiles.firmId, actor.firmId), eq(capitalRuleProfiles.active, true)))
      .limit(1);
    const [latest] = await tx
      .select({ version: capitalRuleProfiles.version })
      .from(capitalRuleProfiles)
      .where(eq(capitalRuleProfiles.firmId, actor.firmId))
      .orderBy(desc(capitalRuleProfiles.version))
      .limit(1);
    const before = current
      ? {
          name: current.name,
          confidence: current.confidence,
          horizonDays: current.horizonDays,
          averagingDays: current.averagingDays,
          baseMultiplier: current.baseMultiplier,
          stressedMultiplier: current.stressedMultiplier,
          backtestDays: current.backtestDays,
          plusFactors: current.plusFactors,
          regimes: regimesOf(current),
          filedRegime: filedOf(current),
          showRwa: current.showRwa,
          standardised: standardisedProfileOfRow(current),
        }
      : null;
    const changed = changedFields(before as Record<string, unknown> | null, next as Record<string, unknown>);
    if (before && changed.length === 0) {
      throw new AppError("unprocessable:capital_profile", "Nothing changed: the form matches the version in force, so no new version was saved.", { reason: "Change a setting first; nothing was saved." });
    }
    if (current) await tx.update(capitalRuleProfiles).set({ active: false }).where(and(eq(capitalRuleProfiles.id, current.id), eq(capitalRuleProfiles.firmId, actor.firmId)));
    const version = (latest?.version ?? 0) + 1;
    const createdAt = now().toISOString();
    const [inserted] = await tx
      .insert(capitalRuleProfiles)
      .values({ firmId: actor.firmId, ...next, active: true, version, reason: input.reason, previousId: current?.id ?? null, createdBy: actor.userId, createdAt })
      .returning({ id: capitalRuleProfiles.id });
    await recordAudit(tx, actor, {
      action: "capital_profile.version",
      entityType: "capital_rule_profile",
      entityId: inserted.id,
      summary: `Saved capital rule profile version ${version} (${input.regimes === "both" ? "both regimes" : input.regimes.replace("_", " ")}, ${input.filedRegime.replace("_", " ")} filed): ${changed.join(", ")}`,
      detail: { version, previousId: current?.id ?? null, reason: input.reason, changed, before, after: next },
      at: createdAt,
    });
    // a profile filing the standardised figure adds attribute findings to the open periods' data-quality reports
    await enqueueQualityRefresh(tx, actor.firmId, await periodsTakingPrices(tx, actor.firmId));
    return inserted.id;
  });
  const versions = await listCapitalProfileVersions(actor);
  return versions.find((v) => v.id === id)!;
}

/** One version by id (another firm's is not found). */
export async function getCapitalProfileVersion(actor: Actor, profileId: string): Promise<CapitalProfileVersion> {
  const row = await firmRow(capitalRuleProfiles, actor.firmId, profileId, "not_found:capital_profile");
  return view(row, await userNames([row.createdBy]));
}

export { DEFAULT_PLUS_FACTORS };
