/**
 * The demo firm's capital rule profile after its October filing: Northmoor's compliance officer saved version 2,
 * computing both figures and filing the standardised building blocks (its regulator takes that figure; value-at-risk
 * stays the firm's own measure and is shown beside it), with the risk-weighted-asset equivalent. Saved through the
 * app's own data function, so it is versioned and audited like any change. Pellam keeps version 1 (internal models).
 */
import type { Database } from "./client";
import { actorFor } from "./seed-uploads";
import { currentCapitalProfile, saveCapitalProfile } from "../lib/data/capital-profile";
import { capitalProfileSchema } from "../lib/validation/capital-profile";
import { setStampClock } from "../lib/clock";

/** Why the demo's version 2 was made, as its reason. */
export const DEMO_PROFILE_REASON =
  "Our licence has no internal-model approval: the regulator takes the standardised building blocks. Value-at-risk stays our own measure and is shown beside it.";

/** Northmoor's version 2 of the capital rule profile: both figures computed, the standardised one filed. */
export async function seedDemoCapitalProfile(db: Database): Promise<void> {
  const officer = await actorFor(db, "tomas.reyne@northmoor.example");
  const current = await currentCapitalProfile(officer);
  if (!current) throw new Error("the demo firm has no capital rule profile to build on");
  setStampClock("2026-11-20T15:30:00.000Z");
  try {
    await saveCapitalProfile(officer, capitalProfileSchema.parse({ ...current.form, regimes: "both", filedRegime: "standardised", showRwa: true, reason: DEMO_PROFILE_REASON }));
  } finally {
    setStampClock(null);
  }
}
