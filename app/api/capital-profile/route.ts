import { route } from "@/lib/auth/route";
import { capitalProfileScreen, saveCapitalProfile } from "@/lib/data/capital-profile";
import { capitalProfileSchema } from "@/lib/validation/capital-profile";

/** The capital rule profile in force and every earlier version (any member may read them). */
export const GET = route({ permission: "member" }, ({ actor }) => capitalProfileScreen(actor));

/** Save a new version of the capital rule profile (compliance officers and heads); the earlier version stays. */
export const POST = route({ permission: "capital.edit", body: capitalProfileSchema }, ({ actor, body }) => saveCapitalProfile(actor, body));
