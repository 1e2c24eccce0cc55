import { route } from "@/lib/auth/route";
import { markFiled } from "@/lib/data/filings";
import { idParam } from "@/lib/validation/firm";
import { markFiledSchema } from "@/lib/validation/filings";

/** Record that the signed version was filed: the date and the regulator's reference (compliance officer). */
export const POST = route({ permission: "filing.file", params: idParam("filingId"), body: markFiledSchema }, async ({ actor, params, body }) => ({
  filing: await markFiled(actor, params.filingId, body),
}));
