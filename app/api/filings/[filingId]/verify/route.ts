import { route } from "@/lib/auth/route";
import { verifyFiling } from "@/lib/data/filings";
import { idParam } from "@/lib/validation/firm";

/** Recompute the SHA-256 of the stored content and compare it with the hash stored at signing (any member). */
export const GET = route({ permission: "member", params: idParam("filingId") }, async ({ actor, params }) => ({
  verification: await verifyFiling(actor, params.filingId),
}));
