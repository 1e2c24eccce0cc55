import { route } from "@/lib/auth/route";
import { getPeriod } from "@/lib/data/periods";
import { idParam } from "@/lib/validation/firm";

/** One reporting period of the firm with its steps. */
export const GET = route({ permission: "periods.read", params: idParam("periodId") }, async ({ actor, params }) => ({
  period: await getPeriod(actor, params.periodId as string),
}));
