import { route } from "@/lib/auth/route";
import { listPeriods, openPeriod } from "@/lib/data/periods";
import { openPeriodSchema } from "@/lib/validation/periods";

/** The firm's reporting periods with deadlines and progress. */
export const GET = route({ permission: "periods.read" }, async ({ actor }) => ({ periods: await listPeriods(actor) }));

/** Open the reporting period of a month (compliance officers, administrators). */
export const POST = route({ permission: "periods.open", body: openPeriodSchema }, async ({ actor, body }) =>
  Response.json({ period: await openPeriod(actor, body.month) }, { status: 201 }),
);
