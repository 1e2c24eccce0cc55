import { route } from "@/lib/auth/route";
import { getPeriod, withdrawPeriod } from "@/lib/data/periods";
import { idParam } from "@/lib/validation/firm";
import { withdrawPeriodSchema } from "@/lib/validation/periods";

/** One reporting period of the firm with its steps. */
export const GET = route({ permission: "periods.read", params: idParam("periodId") }, async ({ actor, params }) => ({
  period: await getPeriod(actor, params.periodId),
}));

/** Withdraw an empty period opened by mistake (compliance officers, administrators), with a reason; audited. */
export const DELETE = route(
  { permission: "periods.open", params: idParam("periodId"), body: withdrawPeriodSchema },
  async ({ actor, params, body }) => ({ withdrawn: await withdrawPeriod(actor, params.periodId, body.reason) }),
);
