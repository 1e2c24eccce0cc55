import { route } from "@/lib/auth/route";
import { getDataQuality } from "@/lib/data/data-quality";
import { idParam } from "@/lib/validation/firm";

/** The period's data-quality report (any member). */
export const GET = route({ permission: "member", params: idParam("periodId") }, ({ actor, params }) => getDataQuality(actor, params.periodId));
