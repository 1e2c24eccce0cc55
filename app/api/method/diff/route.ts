import { route } from "@/lib/auth/route";
import { diffMethodVersions } from "@/lib/data/method";
import { methodDiffQuerySchema } from "@/lib/validation/method";

/** Field-by-field differences between two versions (default: the newest against the one it was drawn from). */
export const GET = route({ permission: "member", query: methodDiffQuerySchema }, async ({ actor, query }) => ({
  diff: await diffMethodVersions(actor, query.from, query.to),
}));
