import { route } from "@/lib/auth/route";
import { runChange } from "@/lib/data/runs";
import { idParam } from "@/lib/validation/firm";

/** The change in VaR since the previous period's filing run, explained by positions, volatilities and correlations. */
export const GET = route({ permission: "periods.read", params: idParam("runId") }, ({ actor, params }) => runChange(actor, params.runId));
